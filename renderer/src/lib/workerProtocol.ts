/**
 * The message protocol between the window and the analysis worker. Heavy work
 * (fitting many sites, bootstrap resampling) runs off the main thread so the
 * window never freezes; each job reports progress and can be cancelled.
 *
 * The protocol is plain TS over anything with postMessage and a message event
 * (a Worker, its global scope, or a MessagePort in tests), so it is tested
 * without a browser.
 */

/** Window → worker. */
export type ToWorker =
  | { type: 'run'; id: number; kind: string; input: unknown }
  | { type: 'cancel'; id: number }
  /** The window has drawn the job's early output number `seq` (JobContext.partial). */
  | { type: 'shown'; id: number; seq: number };

/** Worker → window. */
export type FromWorker =
  | { type: 'progress'; id: number; done: number; total: number; note: string }
  | { type: 'partial'; id: number; seq: number; output: unknown }
  | { type: 'result'; id: number; output: unknown }
  | { type: 'error'; id: number; message: string }
  | { type: 'cancelled'; id: number };

/** What a job handler may do while it runs. */
export interface JobContext {
  /** Reports progress; also yields to the event loop so a cancel can arrive. */
  progress(done: number, total: number, note?: string): Promise<void>;
  /**
   * Sends an early, incomplete output the window can show while the job goes on (the analysis
   * sends its sites before the regional models); the job's result still follows.
   * @returns settles once the window has drawn it (the frame after it arrived), or after
   *   SHOWN_WAIT_MS, or on a cancel: a job that awaits it leaves the cores to the window's first
   *   drawing of what it sent
   */
  partial(output: unknown): Promise<void>;
  /** True once the window asked to cancel this job. */
  readonly cancelled: boolean;
}

/** A job: input in, output out (both structured-cloneable). */
export type JobHandler = (input: never, ctx: JobContext) => Promise<unknown> | unknown;

/** The end of a channel the protocol talks over. */
export interface Port {
  postMessage(message: unknown): void;
  addEventListener(type: 'message', listener: (event: MessageEvent) => void): void;
  removeEventListener?(type: 'message', listener: (event: MessageEvent) => void): void;
}

/** Thrown (as a rejection) when a job was cancelled before it finished. */
export class JobCancelledError extends Error {
  constructor(kind: string) {
    super(`The ${kind} job was cancelled.`);
    this.name = 'JobCancelledError';
  }
}

/** Thrown (as a rejection) when the worker reports a failure. */
export class JobFailedError extends Error {
  constructor(kind: string, message: string) {
    super(`${kind}: ${message}`);
    this.name = 'JobFailedError';
  }
}

/**
 * Longest a job waits for the window to say an early output is drawn. A window in a background
 * tab gets no animation frames, so it may never say; the job then goes on.
 */
export const SHOWN_WAIT_MS = 500;

/** Signals from inside a handler that it stopped because of a cancel. */
class StopJob extends Error {}

/**
 * Resolves on a later macrotask, so messages already queued for the worker (a cancel) are
 * delivered first. Not setTimeout(0): browsers hold a timer set from inside timer callbacks nested
 * five deep to at least 4 ms (HTML standard, timer initialization steps), and a job that yields
 * after every site nests them all the way down: 500 yields took 2.1 s in Debian's chromium against
 * 20 ms through a MessageChannel, whose messages are plain tasks with no such floor.
 */
function nextTask(): Promise<void> {
  return new Promise((resolve) => {
    const channel = new MessageChannel();
    channel.port1.onmessage = () => {
      channel.port1.close();
      resolve();
    };
    channel.port2.postMessage(null);
  });
}

/**
 * Serves jobs on the worker side of a port.
 * @param port - the worker's global scope (self) or a MessagePort
 * @param handlers - job kind → handler
 * @param shownWaitMs - longest wait for the window to draw an early output (tests shorten it)
 * @example
 * serveJobs(self, { fitSites: (input, ctx) => fitAll(input, ctx) });
 */
export function serveJobs(
  port: Port,
  handlers: Record<string, JobHandler>,
  shownWaitMs: number = SHOWN_WAIT_MS,
): void {
  const cancelled = new Set<number>();
  /** Per job, its latest early output's number and what settles the wait for it to be drawn. */
  const shown = new Map<number, { seq: number; settle: () => void }>();
  port.addEventListener('message', (event: MessageEvent) => {
    const message = event.data as ToWorker;
    if (message.type === 'cancel') {
      cancelled.add(message.id);
      shown.get(message.id)?.settle();
      return;
    }
    if (message.type === 'shown') {
      const waiting = shown.get(message.id);
      if (waiting?.seq === message.seq) waiting.settle();
      return;
    }
    if (message.type !== 'run') return;
    const { id, kind } = message;
    const handler = handlers[kind];
    if (!handler) {
      port.postMessage({ type: 'error', id, message: `no job called "${kind}"` });
      return;
    }
    let partials = 0;
    const ctx: JobContext = {
      get cancelled() {
        return cancelled.has(id);
      },
      async progress(done, total, note = '') {
        port.postMessage({ type: 'progress', id, done, total, note } satisfies FromWorker);
        // A macrotask turn lets a queued cancel message be delivered.
        await nextTask();
        if (cancelled.has(id)) throw new StopJob();
      },
      partial(output) {
        if (cancelled.has(id)) return Promise.resolve();
        const seq = ++partials;
        shown.get(id)?.settle();
        port.postMessage({ type: 'partial', id, seq, output } satisfies FromWorker);
        return new Promise<void>((resolve) => {
          const timer = setTimeout(settle, shownWaitMs);
          function settle(): void {
            clearTimeout(timer);
            if (shown.get(id)?.seq === seq) shown.delete(id);
            resolve();
          }
          shown.set(id, { seq, settle });
        });
      },
    };
    Promise.resolve()
      .then(() => (handler as (input: unknown, ctx: JobContext) => unknown)(message.input, ctx))
      .then(
        (output) => {
          if (cancelled.has(id)) port.postMessage({ type: 'cancelled', id });
          else port.postMessage({ type: 'result', id, output } satisfies FromWorker);
        },
        (error: unknown) => {
          if (error instanceof StopJob || cancelled.has(id)) {
            port.postMessage({ type: 'cancelled', id } satisfies FromWorker);
          } else {
            const text = error instanceof Error ? error.message : String(error);
            port.postMessage({ type: 'error', id, message: text } satisfies FromWorker);
          }
        },
      )
      .finally(() => {
        cancelled.delete(id);
        shown.get(id)?.settle();
      });
  });
}

/** A job in flight, as the window sees it. */
export interface RunningJob<T> {
  readonly id: number;
  /** Settles with the output, or rejects with JobCancelledError / JobFailedError. */
  readonly result: Promise<T>;
  /** Asks the worker to stop; the result rejects with JobCancelledError at once. */
  cancel(): void;
}

interface Pending {
  kind: string;
  resolve(value: unknown): void;
  reject(error: Error): void;
  onProgress?: (done: number, total: number, note: string) => void;
  onPartial?: (output: unknown) => void;
}

/** What the window hears from a running job before its result. */
export interface JobListeners<P = unknown> {
  /** Called with (done, total, note) as the worker reports. */
  onProgress?: (done: number, total: number, note: string) => void;
  /** Called with each early, incomplete output (JobContext.partial). */
  onPartial?: (output: P) => void;
}

/**
 * Runs a callback once the next frame is drawn: a task queued from an animation-frame callback
 * runs after that frame's style, layout and paint. Where there are no frames (node, tests) it
 * runs on the next task.
 */
function afterNextFrame(callback: () => void): void {
  const later = () => setTimeout(callback, 0);
  if (typeof requestAnimationFrame === 'function') requestAnimationFrame(later);
  else later();
}

/** The window's side: starts jobs, routes progress, cancels. */
export class JobClient {
  #nextId = 1;
  readonly #pending = new Map<number, Pending>();
  readonly #port: Port;

  /** @param port - the Worker (or a MessagePort in tests) */
  constructor(port: Port) {
    this.#port = port;
    port.addEventListener('message', (event: MessageEvent) => this.#receive(event.data));
  }

  /**
   * Starts a job.
   * @param kind - the handler's name on the worker side
   * @param input - structured-cloneable input
   * @param listeners - progress and early outputs, as the worker reports them
   * @returns the running job
   */
  run<T, P = unknown>(
    kind: string,
    input: unknown,
    listeners: JobListeners<P> = {},
  ): RunningJob<T> {
    const id = this.#nextId++;
    const result = new Promise<T>((resolve, reject) => {
      this.#pending.set(id, {
        kind,
        resolve: resolve as (v: unknown) => void,
        reject,
        onProgress: listeners.onProgress,
        onPartial: listeners.onPartial as Pending['onPartial'],
      });
    });
    this.#port.postMessage({ type: 'run', id, kind, input } satisfies ToWorker);
    return {
      id,
      result,
      cancel: () => {
        const pending = this.#pending.get(id);
        if (!pending) return;
        this.#pending.delete(id);
        this.#port.postMessage({ type: 'cancel', id } satisfies ToWorker);
        pending.reject(new JobCancelledError(kind));
      },
    };
  }

  /** Number of jobs still running (for tests and the busy indicator). */
  get running(): number {
    return this.#pending.size;
  }

  #receive(message: FromWorker): void {
    const pending = this.#pending.get(message.id);
    if (!pending) return; // cancelled already, or not ours
    switch (message.type) {
      case 'progress':
        pending.onProgress?.(message.done, message.total, message.note);
        return;
      case 'partial':
        pending.onPartial?.(message.output);
        afterNextFrame(() =>
          this.#port.postMessage({
            type: 'shown',
            id: message.id,
            seq: message.seq,
          } satisfies ToWorker),
        );
        return;
      case 'result':
        this.#pending.delete(message.id);
        pending.resolve(message.output);
        return;
      case 'error':
        this.#pending.delete(message.id);
        pending.reject(new JobFailedError(pending.kind, message.message));
        return;
      case 'cancelled':
        this.#pending.delete(message.id);
        pending.reject(new JobCancelledError(pending.kind));
        return;
    }
  }
}
