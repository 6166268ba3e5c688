/**
 * Reading a user's file whole, for the shell and the command line alike: a regular file only
 * (a FIFO, a device or a folder is refused at once, never waited on), no larger than a cap, and
 * never more than the cap read even if the file grows while it is read.
 */
import { constants } from 'node:fs';
import { open } from 'node:fs/promises';
import { OpenFileError } from './shellErrors';

/**
 * Plain words for the errors opening a path can give; the code itself is kept for the rest.
 * @param code - an errno code such as 'ENOENT'
 * @returns what a user reads after the path
 * @example
 * whyUnreadable('ELOOP') // 'is a loop of symbolic links'
 */
export function whyUnreadable(code: string | undefined): string {
  switch (code) {
    case 'ENOENT':
      return 'does not exist';
    case 'EACCES':
    case 'EPERM':
      return 'cannot be read (permission denied)';
    case 'EISDIR':
      return 'is a folder, not a file';
    case 'ELOOP':
      return 'is a loop of symbolic links';
    case 'ENAMETOOLONG':
      return 'has a name too long for the system';
    case 'ENOTDIR':
      return 'has a file where a folder belongs in its path';
    default:
      return `cannot be read (${code ?? 'unknown error'})`;
  }
}

/**
 * The bytes of a regular file no larger than `maxBytes`; read only.
 *
 * The file is opened without blocking, so a FIFO with no writer is refused instead of hanging,
 * and the kind and size are taken from the open handle, so the file checked is the file read.
 *
 * @param filePath - path of the file
 * @param maxBytes - the largest size read
 * @param tooLarge - the end of the message for a larger file, given its size in bytes
 * @returns the file's bytes
 * @throws OpenFileError when the file is missing, not a regular file or larger than maxBytes
 * @example
 * await readCappedFile('trial.csv', 64 * 2 ** 20, (n) => `is ${n} bytes`)
 */
export async function readCappedFile(
  filePath: string,
  maxBytes: number,
  tooLarge: (bytes: number) => string,
): Promise<Buffer> {
  let handle;
  try {
    handle = await open(filePath, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (e) {
    throw new OpenFileError(filePath, whyUnreadable((e as NodeJS.ErrnoException).code));
  }
  try {
    const info = await handle.stat();
    if (info.isDirectory()) throw new OpenFileError(filePath, 'is a folder, not a file');
    if (!info.isFile())
      throw new OpenFileError(
        filePath,
        'is not a regular file (a pipe, device or socket); save the data to a file first',
      );
    if (info.size > maxBytes) throw new OpenFileError(filePath, tooLarge(info.size));
    // Read at most one byte past the cap: a file that grew past it since the check is refused.
    const buffer = Buffer.allocUnsafe(Math.min(info.size, maxBytes) + 1);
    let filled = 0;
    for (;;) {
      const { bytesRead } = await handle.read(buffer, filled, buffer.length - filled, filled);
      if (bytesRead === 0) break;
      filled += bytesRead;
      if (filled === buffer.length) {
        if (filled > maxBytes) throw new OpenFileError(filePath, tooLarge(filled));
        throw new OpenFileError(filePath, 'grew while it was read; try again when it is saved');
      }
    }
    return buffer.subarray(0, filled);
  } finally {
    await handle.close();
  }
}
