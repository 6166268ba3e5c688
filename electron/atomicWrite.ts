/**
 * Write a file so that at every instant the target is either the old file or
 * the complete new one, never a half-written mix — even when the process is
 * killed or the power fails mid-save:
 *   1. write the bytes to a temporary file in the same folder (a rename is
 *      only atomic within one file system),
 *   2. fsync it, so the data is on disk before the name points at it,
 *   3. rename it over the target (atomic on POSIX and on NTFS),
 *   4. fsync the folder, so the rename itself survives a crash (POSIX; Windows
 *      cannot open a folder for fsync and does not need it).
 * A write that fails removes its temporary file and leaves the target alone.
 *
 * The one atomic writer of the project: the desktop shell saves projects and
 * exports with it, and the command line (cli/) writes every output with it.
 * It imports nothing but Node's own modules (never `electron`), so the
 * command line can use it outside Electron; tests/shell.atomicSave.test.ts
 * checks that.
 */
import { randomBytes } from 'node:crypto';
import { open, readdir, rename, stat, unlink } from 'node:fs/promises';
import path from 'node:path';

/** Bytes written per call, so a large project does not need one giant buffer copy. */
const CHUNK_BYTES = 1 << 20;

/** The temporary name used for target: hidden, in the same folder, unique per write. */
export function temporaryNameFor(target: string): string {
  const dir = path.dirname(target);
  const suffix = `${process.pid}-${randomBytes(4).toString('hex')}`;
  return path.join(dir, `.${path.basename(target)}.${suffix}.tmp`);
}

/**
 * Atomically replace (or create) target with data.
 *
 * @param target absolute path of the file to write
 * @param data the complete new contents (text is written as UTF-8)
 * @throws the file system's error (ENOENT for a missing folder, EACCES…); the
 *   target is then unchanged
 * @example await writeFileAtomic('/home/ana/trials/North.plotrate', text)
 */
export async function writeFileAtomic(target: string, data: Uint8Array | string): Promise<void> {
  const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
  const temporary = temporaryNameFor(target);
  const handle = await open(temporary, 'wx', 0o644);
  try {
    for (let at = 0; at < bytes.length; at += CHUNK_BYTES) {
      const end = Math.min(at + CHUNK_BYTES, bytes.length);
      let done = at;
      while (done < end) {
        const { bytesWritten } = await handle.write(bytes, done, end - done, done);
        done += bytesWritten;
      }
    }
    await handle.sync();
    await handle.close();
  } catch (e) {
    await handle.close().catch(() => undefined);
    await unlink(temporary).catch(() => undefined);
    throw e;
  }
  try {
    await rename(temporary, target);
  } catch (e) {
    await unlink(temporary).catch(() => undefined);
    throw e;
  }
  await syncFolder(path.dirname(target));
  await removeStaleTemporaries(target);
}

/** Age after which another write's temporary file is taken as abandoned, ms. */
export const STALE_TEMPORARY_MS = 10 * 60 * 1000;

/**
 * Remove temporary files an earlier, interrupted write of the same target
 * left behind (a killed process cannot clean up after itself). Only names of
 * this saver's own pattern for this target, and only when older than
 * STALE_TEMPORARY_MS, so a write still running elsewhere is left alone.
 *
 * @returns the names removed
 */
export async function removeStaleTemporaries(
  target: string,
  now: number = Date.now(),
): Promise<string[]> {
  const dir = path.dirname(target);
  const prefix = `.${path.basename(target)}.`;
  const removed: string[] = [];
  let names: string[];
  try {
    names = await readdir(dir);
  } catch {
    return removed;
  }
  for (const name of names) {
    if (!name.startsWith(prefix) || !/^\d+-[0-9a-f]{8}\.tmp$/.test(name.slice(prefix.length)))
      continue;
    try {
      const info = await stat(path.join(dir, name));
      if (now - info.mtimeMs < STALE_TEMPORARY_MS) continue;
      await unlink(path.join(dir, name));
      removed.push(name);
    } catch {
      // Gone already, or not ours to remove: leave it.
    }
  }
  return removed;
}

async function syncFolder(dir: string): Promise<void> {
  if (process.platform === 'win32') return;
  let handle;
  try {
    handle = await open(dir, 'r');
    await handle.sync();
  } catch {
    // Some file systems (network shares, some FUSE mounts) refuse fsync on a
    // folder; the file itself is already synced, so carry on.
  } finally {
    await handle?.close().catch(() => undefined);
  }
}
