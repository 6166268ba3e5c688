// Runs the real `plotrate` command line (the bundle tests/support/buildCliBundle.ts builds) as a
// child process in a folder, the way a user runs it, and returns its exit code and output.
import { spawnSync } from 'node:child_process';
import path from 'node:path';

/** The command's entry point, as npm installs it. */
export const cliPath = path.join(__dirname, '..', '..', 'cli', 'plotrate.mjs');

export interface CliRun {
  code: number | null;
  out: string;
  err: string;
}

/**
 * Runs `plotrate` with the arguments in a working folder.
 * @param cwd - the working folder
 * @param args - the command's arguments
 * @param timeoutMs - when to give up (a hang fails the test instead of the run)
 * @returns exit code (null when killed), stdout and stderr
 * @example
 * runCli(dir, ['analyze', 'trial.csv', '--json', 'r.json']).code // 0
 */
export function runCli(cwd: string, args: string[], timeoutMs = 120_000): CliRun {
  const r = spawnSync(process.execPath, [cliPath, ...args], {
    cwd,
    encoding: 'utf8',
    timeout: timeoutMs,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}
