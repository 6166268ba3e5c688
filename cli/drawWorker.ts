/**
 * A thread of cli/drawPool.ts: receives batches of sites' bootstrap jobs and posts back their
 * draws, in the batch's order. The draws' typed arrays are handed over, not copied.
 */
import { parentPort } from 'node:worker_threads';
import { drawSite, type SiteDrawJob } from '../shared/analysis/analyzeSite';
import type { BootstrapDraws } from '../shared/economics/bootstrapDraws';

/** The buffers behind the draws' columns, each once (a transfer list refuses duplicates). */
function buffersOf(draws: readonly BootstrapDraws[]): ArrayBuffer[] {
  const buffers = new Set<ArrayBuffer>();
  for (const d of draws)
    for (const model of Object.values(d.models))
      for (const column of Object.values(model ?? {}))
        if (ArrayBuffer.isView(column) && column.buffer instanceof ArrayBuffer)
          buffers.add(column.buffer);
  return [...buffers];
}

const port = parentPort;
if (port === null) throw new Error('drawWorker runs as a worker thread of cli/drawPool.ts');
port.on('message', (jobs: SiteDrawJob[]) => {
  const draws = jobs.map(drawSite);
  port.postMessage(draws, buffersOf(draws));
});
