// The window's view of the analysis worker: what runs, how far it is, and cancel.
import { JobCancelledError, JobClient, type Port, type RunningJob } from '../lib/workerProtocol';

export interface JobProgress {
  label: string;
  done: number;
  total: number;
  note: string;
}

export class Jobs {
  /** The most recent job still running, shown in the status bar; null when idle. */
  current = $state<JobProgress | null>(null);
  readonly #client: JobClient;
  /** One running job per lane: a newer request in a lane makes the older answer useless. */
  readonly #lanes: Record<string, { job: RunningJob<unknown>; progress: JobProgress }> = {};

  /** @param port - the analysis Worker */
  constructor(port: Port) {
    this.#client = new JobClient(port);
  }

  /**
   * Runs a job, cancelling the one still running in the same lane.
   * @param label - what the status bar says, e.g. "Analyzing sites"
   * @param kind - the worker's job name
   * @param input - structured-cloneable input
   * @param options - lane: jobs in one lane replace each other (the kind unless told);
   *   onPartial: called with the job's early outputs while it is still the lane's job
   * @returns the output, or null when the job was cancelled
   * @throws JobFailedError when the worker reports a failure
   */
  async run<T, P = never>(
    label: string,
    kind: string,
    input: unknown,
    options: { lane?: string; onPartial?: (output: P) => void } = {},
  ): Promise<T | null> {
    const lane = options.lane ?? kind;
    this.#lanes[lane]?.job.cancel();
    const progress: JobProgress = { label, done: 0, total: 1, note: '' };
    const job = this.#client.run<T, P>(kind, input, {
      onProgress: (done, total, note) => {
        const entry = this.#lanes[lane];
        if (entry?.job !== job) return;
        entry.progress = { label, done, total, note };
        this.#show();
      },
      onPartial: (output) => {
        if (this.#lanes[lane]?.job === job) options.onPartial?.(output);
      },
    });
    this.#lanes[lane] = { job: job as RunningJob<unknown>, progress };
    this.#show();
    try {
      return await job.result;
    } catch (error) {
      if (error instanceof JobCancelledError) return null;
      throw error;
    } finally {
      if (this.#lanes[lane]?.job === job) delete this.#lanes[lane];
      this.#show();
    }
  }

  /** Stops every running job (the status bar's Cancel). */
  cancel(): void {
    for (const lane of Object.keys(this.#lanes)) {
      this.#lanes[lane].job.cancel();
      delete this.#lanes[lane];
    }
    this.#show();
  }

  #show(): void {
    const running = Object.values(this.#lanes);
    this.current = running.length > 0 ? running[running.length - 1].progress : null;
  }
}
