import { afterEach, describe, expect, it } from 'vitest';
import {
  JobCancelledError,
  JobClient,
  JobFailedError,
  serveJobs,
  type JobContext,
} from '../renderer/src/lib/workerProtocol';

// A MessageChannel stands in for the worker: same structured clone, same event loop hops.
const channels: MessageChannel[] = [];
function connect(handlers: Parameters<typeof serveJobs>[1], shownWaitMs?: number): JobClient {
  const channel = new MessageChannel();
  channels.push(channel);
  serveJobs(channel.port2 as unknown as Parameters<typeof serveJobs>[0], handlers, shownWaitMs);
  const client = new JobClient(channel.port1 as unknown as Parameters<typeof serveJobs>[0]);
  channel.port1.start();
  channel.port2.start();
  return client;
}
afterEach(() => {
  for (const c of channels.splice(0)) {
    c.port1.close();
    c.port2.close();
  }
});

async function countTo(input: { n: number }, ctx: JobContext): Promise<number> {
  let sum = 0;
  for (let i = 1; i <= input.n; i++) {
    sum += i;
    await ctx.progress(i, input.n, `step ${i}`);
  }
  return sum;
}

describe('worker protocol', () => {
  it('runs a job, reports every progress step in order, and resolves its output', async () => {
    const client = connect({ countTo: countTo as never });
    const seen: string[] = [];
    const job = client.run<number>(
      'countTo',
      { n: 4 },
      {
        onProgress: (done, total, note) => seen.push(`${done}/${total} ${note}`),
      },
    );
    await expect(job.result).resolves.toBe(10);
    expect(seen).toEqual(['1/4 step 1', '2/4 step 2', '3/4 step 3', '4/4 step 4']);
    expect(client.running).toBe(0);
  });

  it('cancel rejects at once and stops the handler at its next progress call', async () => {
    let reached = 0;
    const slow = async (_input: unknown, ctx: JobContext) => {
      for (let i = 1; i <= 1000; i++) {
        reached = i;
        await ctx.progress(i, 1000);
      }
      return 'finished';
    };
    const client = connect({ slow: slow as never });
    let firstProgress!: () => void;
    const started = new Promise<void>((resolve) => (firstProgress = resolve));
    const job = client.run<string>('slow', null, { onProgress: () => firstProgress() });
    await started;
    job.cancel();
    await expect(job.result).rejects.toBeInstanceOf(JobCancelledError);
    // Give the worker side a few turns to notice.
    await new Promise((resolve) => setTimeout(resolve, 50));
    const stoppedAt = reached;
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(reached).toBe(stoppedAt);
    expect(stoppedAt).toBeLessThan(1000);
  });

  it('a handler that throws rejects with its message and the job kind', async () => {
    const client = connect({
      broken: (() => {
        throw new Error('site "Hollow Creek" has no rates');
      }) as never,
    });
    const job = client.run('broken', null);
    await expect(job.result).rejects.toBeInstanceOf(JobFailedError);
    await expect(client.run('broken', null).result).rejects.toThrow(
      'broken: site "Hollow Creek" has no rates',
    );
  });

  it('an unknown job kind is an error, not a hang', async () => {
    const client = connect({});
    await expect(client.run('nothing', null).result).rejects.toThrow('no job called "nothing"');
  });

  it('an early output reaches the window before the result, and none after a cancel', async () => {
    const twoStage = async (input: { n: number }, ctx: JobContext) => {
      ctx.partial({ sum: input.n, complete: false });
      await ctx.progress(1, 2);
      return { sum: input.n * 2, complete: true };
    };
    const client = connect({ twoStage: twoStage as never });
    const seen: unknown[] = [];
    const job = client.run<{ sum: number }, { sum: number }>(
      'twoStage',
      { n: 3 },
      {
        onPartial: (output) => seen.push(output),
      },
    );
    await expect(job.result).resolves.toEqual({ sum: 6, complete: true });
    expect(seen).toEqual([{ sum: 3, complete: false }]);

    const late: unknown[] = [];
    const cancelled = client.run('twoStage', { n: 5 }, { onPartial: (o) => late.push(o) });
    cancelled.cancel();
    await expect(cancelled.result).rejects.toBeInstanceOf(JobCancelledError);
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(late).toEqual([]);
  });

  it('a job awaiting its early output goes on once the window has taken it', async () => {
    const order: string[] = [];
    const waits = async (_input: unknown, ctx: JobContext) => {
      await ctx.partial('preview');
      order.push('job goes on');
      return 'done';
    };
    // A wait far beyond the test's own timeout: only the window's answer lets the job finish.
    const client = connect({ waits: waits as never }, 3_600_000);
    const job = client.run<string>('waits', null, { onPartial: () => order.push('window drew') });
    await expect(job.result).resolves.toBe('done');
    expect(order).toEqual(['window drew', 'job goes on']);
  });

  it('a window that never says it drew an early output holds the job for the cap only', async () => {
    // A window that answers nothing (a tab in the background gets no frames).
    const channel = new MessageChannel();
    channels.push(channel);
    const waits = async (_input: unknown, ctx: JobContext) => {
      await ctx.partial('preview');
      return 'done';
    };
    serveJobs(
      channel.port2 as unknown as Parameters<typeof serveJobs>[0],
      { waits: waits as never },
      20,
    );
    const result = new Promise<unknown>((resolve) =>
      channel.port1.addEventListener('message', (event: MessageEvent) => {
        if (event.data.type === 'result') resolve(event.data.output);
      }),
    );
    channel.port1.start();
    channel.port2.start();
    channel.port1.postMessage({ type: 'run', id: 1, kind: 'waits', input: null });
    await expect(result).resolves.toBe('done');
  });

  it('two jobs in flight each get their own answer', async () => {
    const client = connect({ countTo: countTo as never });
    const a = client.run<number>('countTo', { n: 3 });
    const b = client.run<number>('countTo', { n: 5 });
    await expect(Promise.all([a.result, b.result])).resolves.toEqual([6, 15]);
  });
});
