// One child process timed from spawn to exit, with its peak memory: what the
// whole-process benchmarks (cli, peers) share. Peak memory comes from GNU time
// (-v, "Maximum resident set size") when /usr/bin/time exists; without it, a
// Node child reports its own process.resourceUsage() and any other child none.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const gnuTime = existsSync('/usr/bin/time');

/** Where the peak-memory figure comes from on this machine. */
export const peakMemorySource = gnuTime ? 'GNU time -v' : 'process.resourceUsage';

/** A finished child: exit 0 or not, wall and CPU time (s), peak resident memory (kB), output. */
export interface TimedRun {
  ok: boolean;
  wallS: number;
  /** user + system CPU seconds (GNU time only, else NaN): less inflated than wall time on a shared machine */
  cpuS: number;
  rssKb: number;
  stdout: string;
  stderr: string;
}

/**
 * Runs a command to completion and times it.
 * @param command - the program (process.execPath for Node)
 * @param args - its arguments
 * @returns exit status, wall and CPU time in seconds, peak memory in kB (NaN when unknown)
 * @example
 * spawnTimed(process.execPath, ['cli/plotrate.mjs', '--help']).wallS // 0.1
 */
export function spawnTimed(command: string, args: string[]): TimedRun {
  const isNode = command === process.execPath;
  const started = process.hrtime.bigint();
  const r = gnuTime
    ? spawnSync('/usr/bin/time', ['-v', command, ...args], {
        encoding: 'utf8',
        maxBuffer: 64 << 20,
      })
    : spawnSync(
        command,
        isNode
          ? [
              '--import',
              'data:text/javascript,process.on("exit",()=>process.stderr.write("maxRSS_kB "+process.resourceUsage().maxRSS+"\\n"))',
              ...args,
            ]
          : args,
        { encoding: 'utf8', maxBuffer: 64 << 20 },
      );
  const wallS = Number(process.hrtime.bigint() - started) / 1e9;
  const stderr = r.stderr ?? '';
  const rssKb = gnuTime
    ? Number(/Maximum resident set size \(kbytes\): (\d+)/.exec(stderr)?.[1] ?? NaN)
    : Number(/maxRSS_kB (\d+)/.exec(stderr)?.[1] ?? NaN);
  const seconds = (label: string): number =>
    Number(new RegExp(`${label} time \\(seconds\\): ([\\d.]+)`).exec(stderr)?.[1] ?? NaN);
  const cpuS = gnuTime ? seconds('User') + seconds('System') : NaN;
  return { ok: r.status === 0, wallS, cpuS, rssKb, stdout: r.stdout ?? '', stderr };
}

/** The last lines of a failed run's stderr, for one line of bench output. */
export function failure(what: string, r: TimedRun): string {
  return `${what} failed: ${r.stderr.split('\n').slice(-5).join(' ')}`;
}
