import path from 'node:path';
import type { TrialFileBytes } from '../shared/desktop/desktopContract';
import { MAX_TRIAL_FILE_BYTES } from './fileKinds';
import { readCappedFile } from './readCappedFile';

/**
 * Read a trial spreadsheet's bytes for the page to import. Read only: the
 * shell never opens a source spreadsheet for writing.
 *
 * @param filePath absolute path of the spreadsheet
 * @throws OpenFileError when it is missing, not a file or larger than MAX_TRIAL_FILE_BYTES
 */
export async function readTrialFile(filePath: string): Promise<TrialFileBytes> {
  const buffer = await readCappedFile(
    filePath,
    MAX_TRIAL_FILE_BYTES,
    (size) => `is ${size} bytes; trial sheets above ${MAX_TRIAL_FILE_BYTES} bytes are not read`,
  );
  return {
    name: path.basename(filePath),
    bytes: new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength),
  };
}
