import path from 'node:path';
import type { TrialFileBytes } from '../shared/desktop/desktopContract';
import { formatBytes, importLimits } from '../shared/import/importLimits';
import { readCappedFile } from './readCappedFile';

/**
 * Read a trial spreadsheet's bytes for the page to import. Read only: the
 * shell never opens a source spreadsheet for writing.
 *
 * @param filePath absolute path of the spreadsheet
 * @throws OpenFileError when it is missing, not a regular file or larger than import's file
 *   limit (the same cap the command line reads with)
 */
export async function readTrialFile(filePath: string): Promise<TrialFileBytes> {
  const buffer = await readCappedFile(
    filePath,
    importLimits.maxFileBytes,
    (size) =>
      `is ${formatBytes(size)}; trial files above ${formatBytes(importLimits.maxFileBytes)} are not read`,
  );
  return {
    name: path.basename(filePath),
    bytes: new Uint8Array(buffer.buffer, buffer.byteOffset, buffer.byteLength),
  };
}
