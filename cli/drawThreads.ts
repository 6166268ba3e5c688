/**
 * How many threads draw a run's resamples (cli/drawPool.ts). Apart from the pool so that
 * `--help`, which names the default, loads no analysis code.
 */
import { availableParallelism } from 'node:os';

/**
 * Sites from which a run draws on threads by default. A thread starts cold (its module loaded,
 * its code compiled again) and the draws are under half of a run's time (the pricing of each
 * site's draws stays on the main thread): measured on 2 cores, two threads gained nothing at 400
 * sites and 1 s of 9.7 at 1,000 (README, Benchmarks), so smaller runs draw on the main thread.
 */
export const THREADS_FROM_SITES = 500;

/**
 * How many threads draw a run's resamples.
 * @param asked - --threads, or null for the default
 * @param sites - the run's sites (site-years)
 * @returns `asked`; by default one per core from THREADS_FROM_SITES sites, else 1 (the main
 *   thread)
 * @example
 * drawThreads(null, 1000) // 2 on a 2-core machine
 * drawThreads(null, 100) // 1
 */
export function drawThreads(asked: number | null, sites: number): number {
  if (asked !== null) return asked;
  return sites >= THREADS_FROM_SITES ? availableParallelism() : 1;
}
