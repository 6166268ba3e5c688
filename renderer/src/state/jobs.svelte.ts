// The window's view of the analysis worker: what runs, how far it is, and cancel.
import { JobCancelledError, JobClient, type Port, type RunningJob } from '../lib/workerProtocol';

export interface JobProgress {
  label: string;
  done: number;
  total: number;
  note: string;
}

export class Jobs {
  /** The job shown in the status bar, or null when idle. */
  current = $state<JobProgress | null>(null);
  readonly #client: JobClient;
  #running: RunningJob<unknown> | null = null;

  /** @param port - the analysis Worker */
  constructor(port: Port) {
    this.#client = new JobClient(port);
  }

  /**
   * Runs a job, cancelling the one still running (a newer request makes the
   * older answer useless, and one job at a time keeps the second core free).
   * @returns the output, or null when the job was cancelled
   * @throws JobFailedError when the worker reports a failure
   */
  async run<T>(label: string, kind: string, input: unknown): Promise<T | null> {
    this.#running?.cancel();
    this.current = { label, done: 0, total: 1, note: '' };
    const job = this.#client.run<T>(kind, input, (done, total, note) => {
      if (this.#running === job) this.current = { label, done, total, note };
    });
    this.#running = job as RunningJob<unknown>;
    try {
      return await job.result;
    } catch (error) {
      if (error instanceof JobCancelledError) return null;
      throw error;
    } finally {
      if (this.#running === job) {
        this.#running = null;
        this.current = null;
      }
    }
  }

  /** Stops the running job (the status bar's Cancel). */
  cancel(): void {
    this.#running?.cancel();
  }
}
