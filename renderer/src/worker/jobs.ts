// The jobs the analysis worker runs, by name. Plain functions over shared/,
// so they are tested in node without a worker.
import type { JobContext, JobHandler } from '../lib/workerProtocol';

/**
 * Measures that the worker answers and reports progress: used by the status
 * bar's first message after start-up, and a cheap end-to-end check of the
 * channel.
 */
async function ping(input: { steps: number }, ctx: JobContext): Promise<{ steps: number }> {
  for (let i = 0; i < input.steps; i++) await ctx.progress(i + 1, input.steps, 'ping');
  return { steps: input.steps };
}

export const jobHandlers: Record<string, JobHandler> = {
  ping: ping as JobHandler,
};
