/** Reading a user's file whole, after checking it is a file and not too large to read. */
import { readFile, stat } from 'node:fs/promises';
import { OpenFileError } from './shellErrors';

/**
 * The bytes of a regular file no larger than `maxBytes`; read only.
 *
 * @param filePath absolute path of the file
 * @param maxBytes the largest size read
 * @param tooLarge the end of the message for a larger file, given its size in bytes
 * @throws OpenFileError when the file is missing, not a file or larger than maxBytes
 */
export async function readCappedFile(
  filePath: string,
  maxBytes: number,
  tooLarge: (bytes: number) => string,
): Promise<Buffer> {
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
  if (info.size > maxBytes) throw new OpenFileError(filePath, tooLarge(info.size));
  return readFile(filePath);
}
