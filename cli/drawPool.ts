/**
 * The sites' bootstrap drawn on worker threads (cli/drawWorker.ts), each taking a batch of sites
 * as it finishes the last. With the default 200 resamples the draws are most of an analysis'
 * time (about 7 ms a site on one core) and each site's are independent of the others', seeded by
 * the site's index (siteDrawJob): the threads give the draws one thread gives.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { drawSite, type SiteDrawJob } from '../shared/analysis/analyzeSite';
import type { DrawSites, SiteResamples } from '../shared/analysis/analyzeTrial';
import type { BootstrapDraws } from '../shared/economics/bootstrapDraws';

/**
 * Sites per batch at most: small enough that the threads finish together and progress moves,
 * large enough that messages cost nothing beside 200 resamples a site.
 */
const MOST_SITES_PER_BATCH = 16;

/** Batches per thread aimed at, so a thread that drew slow sites is not left alone at the end. */
const BATCHES_PER_THREAD = 8;

/** The bundled worker, beside this module in dist-cli/. */
const WORKER = new URL('./drawWorker.mjs', import.meta.url);

/**
 * Whether the resampling threads can start: the worker is built beside this module (run from
 * the TypeScript sources, as by tests that import the command, it is not, and the main thread
 * draws).
 * @returns true in the bundled command line
 * @example
 * drawWorkerBuilt() // true after `npm run build:cli`
 */
export function drawWorkerBuilt(): boolean {
  return existsSync(fileURLToPath(WORKER));
}

/**
 * Draws the jobs on `threads` worker threads.
 * @param threads - how many, at least 1
 * @returns a DrawSites for analyzeTrialDrawnBy
 * @throws when the worker is not built (drawWorkerBuilt)
 * @example
 * const analysis = await analyzeTrialDrawnBy(table, settings, drawOnThreads(2));
 */
export function drawOnThreads(threads: number): DrawSites {
  if (!drawWorkerBuilt()) throw new Error(`The resampling worker is not built (${WORKER.href}).`);
  return (jobs, onDrawn) => drawOnWorkers(WORKER, Math.max(1, Math.floor(threads)), jobs, onDrawn);
}

/**
 * The jobs drawn by `threads − 1` workers and this thread, each taking batches from one queue.
 * This thread draws too: its code is already compiled and warm from the fits, where a new
 * thread starts cold (measured: two workers made a 100-site run 0.3 s slower than none).
 */
async function drawOnWorkers(
  workerUrl: URL,
  threads: number,
  jobs: readonly (SiteDrawJob | null)[],
  onDrawn: (done: number) => void,
): Promise<SiteResamples> {
  const out: SiteResamples = jobs.map(() => null);
  const pending = jobs.flatMap((job, i) => (job ? [i] : []));
  // Sites without draws are done from the start.
  let done = jobs.length - pending.length;
  const batchSize = Math.max(
    1,
    Math.min(MOST_SITES_PER_BATCH, Math.ceil(pending.length / (threads * BATCHES_PER_THREAD))),
  );
  let next = 0;
  const take = (size: number): number[] => {
    const batch = pending.slice(next, next + size);
    next += batch.length;
    return batch;
  };
  const record = (batch: readonly number[], draws: readonly BootstrapDraws[]): void => {
    batch.forEach((siteIndex, k) => (out[siteIndex] = draws[k]));
    done += batch.length;
    onDrawn(done);
  };
  const workers = Array.from({ length: Math.min(threads - 1, pending.length) }, () => {
    return new Worker(workerUrl);
  });
  const finished = Promise.all(
    workers.map((w) => drawOnWorker(w, () => take(batchSize), jobs, record)),
  );
  try {
    // Small batches here, so the workers' replies (and their next batches) are not kept waiting.
    const mine = Math.max(1, Math.floor(batchSize / 4));
    for (let batch = take(mine); batch.length > 0; batch = take(mine)) {
      record(
        batch,
        batch.map((i) => drawSite(jobs[i]!)),
      );
      await new Promise((resolve) => setImmediate(resolve));
    }
    await finished;
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return out;
}

/**
 * One worker's share: batches from the queue until it is empty, two in flight so the worker
 * never waits for its next.
 */
function drawOnWorker(
  w: Worker,
  take: () => number[],
  jobs: readonly (SiteDrawJob | null)[],
  record: (batch: readonly number[], draws: readonly BootstrapDraws[]) => void,
): Promise<void> {
  return new Promise((resolve, reject) => {
    // The batches sent and not answered, in order: the worker answers in that order.
    const inFlight: number[][] = [];
    const give = (): void => {
      const batch = take();
      if (batch.length === 0) return;
      inFlight.push(batch);
      w.postMessage(batch.map((i) => jobs[i]));
    };
    w.on('message', (draws: BootstrapDraws[]) => {
      record(inFlight.shift()!, draws);
      give();
      if (inFlight.length === 0) resolve();
    });
    w.on('error', reject);
    w.on('exit', (code) => {
      if (inFlight.length > 0)
        reject(new Error(`A resampling thread stopped with code ${code} before its sites.`));
    });
    give();
    give();
    if (inFlight.length === 0) resolve();
  });
}
