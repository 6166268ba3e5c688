import { readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import type { TrialFileBytes } from './desktopApi';
import { MAX_TRIAL_FILE_BYTES } from './fileKinds';
import { OpenFileError } from './shellErrors';

/**
 * Read a trial spreadsheet's bytes for the page to import. Read only: the
 * shell never opens a source spreadsheet for writing.
 *
 * @param filePath absolute path of the spreadsheet
 * @throws OpenFileError when it is missing, not a file or larger than MAX_TRIAL_FILE_BYTES
 */
export async function readTrialFile(filePath: string): Promise<TrialFileBytes> {
  let info;
  try {
    info = await stat(filePath);
  } catch (e) {
    throw new OpenFileError(
      filePath,
      `cannot be read (${(e as NodeJS.ErrnoException).code ?? (e as Error).message})`,
    );
  }
  if (!info.isFile()) throw new OpenFileError(filePath, 'is not a file');
  if (info.size > MAX_TRIAL_FILE_BYTES)
    throw new OpenFileError(
      filePath,
      `is ${info.size} bytes; trial sheets above ${MAX_TRIAL_FILE_BYTES} bytes are not read`,
    );
  const buffer = await readFile(filePath);
  return {
    name: path.basename(filePath),
    bytes: new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength),
  };
}
