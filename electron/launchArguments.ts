import path from 'node:path';
import { fileKindOf } from './fileKinds';

/**
 * The project and trial files named on a command line: by the user
 * (`plotrate North.plotrate`), by the file manager when the file type is
 * registered, or forwarded from a second launch. Switches ("--foo",
 * Chromium's own "--flag=value") and the executable and app path are
 * skipped; relative paths are taken from the launching folder.
 *
 * @param argv the process's arguments (process.argv, or the second instance's)
 * @param cwd the folder the command was started in
 * @param skip how many leading arguments are the program itself: 1 packaged, 2 in development ("electron .")
 * @returns absolute paths of .plotrate and trial files, in the order given
 * @example filesFromArgv(['/opt/Plotrate/plotrate', 'a.plotrate'], '/home/ana', 1) // ['/home/ana/a.plotrate']
 */
export function filesFromArgv(argv: readonly string[], cwd: string, skip: number): string[] {
  const out: string[] = [];
  for (const arg of argv.slice(skip)) {
    if (arg.startsWith('-') || arg === '' || arg === '.') continue;
    const absolute = path.resolve(cwd, arg);
    if (fileKindOf(absolute) !== 'other' && !out.includes(absolute)) out.push(absolute);
  }
  return out;
}
