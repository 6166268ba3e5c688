/**
 * One full garbage collection, on request. V8 collects the old generation only when it reaches a
 * limit set from the live size at the last collection, up to a few times that size. A big run
 * leaves its analysis as garbage when the outputs start, and each site's sheet leaves about a
 * megabyte more, so the heap would grow by gigabytes of garbage while the live data stays near
 * 400 MB (measured at 5,000 sites: 1.87 GB peak with no collection asked for, 1.65 GB with one
 * after the analysis, under 1.5 GB with one every 200 sheets and before each output; README,
 * "Benchmarks"). Node offers `gc()` only under --expose-gc; the flag may be set at run time
 * and the function then taken from a new context (the same isolate, the same heap).
 */
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

let gc: (() => void) | null | undefined;

/**
 * Runs a full collection now, when the runtime allows it (otherwise nothing happens).
 * @example
 * collectGarbage(); // after the last reference to a big structure is dropped
 */
export function collectGarbage(): void {
  if (gc === undefined) {
    try {
      setFlagsFromString('--expose-gc');
      gc = runInNewContext('gc') as () => void;
    } catch {
      gc = null;
    }
  }
  gc?.();
}
