// Runs the real `plotrate` command line the way tests/support/runCli.ts does, but as a child
// with V8's heap capped at 1 GiB (--max-old-space-size=1024) and its peak resident memory
// measured by GNU time (`/usr/bin/time -f %M`, kilobytes, the child and its own children), at
// most two at a time: the machine has two cores, shared.
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { cliPath } from './runCli';

export interface CappedRun {
  code: number | null;
  /** The signal that ended the command, if one did (V8's out-of-memory abort is signal 6). */
  signal: string | null;
  out: string;
  err: string;
  /** Peak resident memory of the run, KiB; null where GNU time is not installed. */
  peakKiB: number | null;
}

/** V8's heap cap for the child, MiB: what a 1 GB budget leaves to the heap. */
export const HEAP_CAP_MIB = 1024;

const TIME = '/usr/bin/time';
const MAX_RUNNING = 2;
let running = 0;
const waiting: (() => void)[] = [];

async function slot(): Promise<() => void> {
  if (running >= MAX_RUNNING) await new Promise<void>((go) => waiting.push(go));
  running++;
  return () => {
    running--;
    waiting.shift()?.();
  };
}

/**
 * Runs `plotrate` with the arguments in a working folder, capped and measured.
 * @param cwd - the working folder
 * @param args - the command's arguments
 * @param timeoutMs - when to kill it (a hang then fails the test, it does not stall the suite)
 * @returns exit code or signal, stdout, stderr and peak memory
 * @example
 * (await runCliCapped(dir, ['analyze', 'a.csv', '--json', 'r.json'])).code // 0
 */
export async function runCliCapped(
  cwd: string,
  args: string[],
  timeoutMs = 30_000,
): Promise<CappedRun> {
  const release = await slot();
  const scratch = mkdtempSync(path.join(tmpdir(), 'plotrate-rss-'));
  const rssFile = path.join(scratch, 'rss');
  const node = [process.execPath, `--max-old-space-size=${HEAP_CAP_MIB}`, cliPath, ...args];
  const timed = existsSync(TIME);
  try {
    const child = spawn(
      timed ? TIME : node[0],
      timed ? ['-f', '%M', '-o', rssFile, ...node] : node.slice(1),
      // A group of its own, so a timeout ends the command and not only GNU time.
      { cwd, stdio: ['ignore', 'pipe', 'pipe'], detached: true },
    );
    let out = '';
    let err = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (out += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (err += d));
    const timer = setTimeout(() => process.kill(-child.pid!, 'SIGKILL'), timeoutMs);
    const [code, signal] = await new Promise<[number | null, string | null]>((done) =>
      child.on('close', (c, s) => done([c, s])),
    );
    clearTimeout(timer);
    let peakKiB: number | null = null;
    if (timed && existsSync(rssFile)) {
      // GNU time writes "Command terminated by signal 6" before the figure when the child dies.
      const lines = readFileSync(rssFile, 'utf8').trim().split('\n');
      const signalled = /terminated by signal (\d+)/.exec(lines[0] ?? '');
      peakKiB = Number(lines.at(-1));
      if (signalled) return { code: null, signal: `signal ${signalled[1]}`, out, err, peakKiB };
    }
    return { code, signal, out, err, peakKiB };
  } finally {
    rmSync(scratch, { recursive: true, force: true });
    release();
  }
}
