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
import { unlinkSync } from 'node:fs';
import { open, readdir, rename, stat, unlink, type FileHandle } from 'node:fs/promises';
import path from 'node:path';
import { Writable } from 'node:stream';
import { finished } from 'node:stream/promises';

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
  const temporary = await writeTemporary(target, data);
  try {
    await rename(temporary, target);
  } catch (e) {
    await discardTemporary(temporary);
    throw e;
  }
  live.delete(temporary);
  await syncFolder(path.dirname(target));
  await removeStaleTemporaries(target);
}

/**
 * Temporary files of this process that are not yet renamed: a SIGINT or SIGTERM removes them
 * before the process ends (removeLiveTemporaries), so an interrupted run leaves nothing behind.
 */
const live = new Set<string>();

/**
 * Removes this process's temporary files that are not yet renamed (synchronously, so it can run
 * in a signal handler just before exit).
 * @returns how many were removed
 * @example process.once('SIGTERM', () => { removeLiveTemporaries(); process.exit(143); })
 */
export function removeLiveTemporaries(): number {
  let removed = 0;
  for (const name of live) {
    try {
      unlinkSync(name);
      removed++;
    } catch {
      // Already gone.
    }
  }
  live.clear();
  return removed;
}

async function discardTemporary(temporary: string): Promise<void> {
  live.delete(temporary);
  await unlink(temporary).catch(() => undefined);
}

/**
 * Creates a new temporary file beside target (O_EXCL), lets `fill` write into it, fsyncs it and
 * returns its name; on any failure the file is removed.
 */
async function writeTemporaryWith(
  target: string,
  fill: (handle: FileHandle) => Promise<void>,
): Promise<string> {
  const temporary = temporaryNameFor(target);
  // 'wx' is O_CREAT | O_EXCL: never follows a symbolic link planted at the temporary name.
  const handle = await open(temporary, 'wx', 0o644);
  live.add(temporary);
  try {
    await fill(handle);
    await handle.sync();
    await handle.close();
  } catch (e) {
    await handle.close().catch(() => undefined);
    await discardTemporary(temporary);
    throw e;
  }
  return temporary;
}

/** Writes data to a new temporary file beside target (O_EXCL) and fsyncs it; returns its name. */
async function writeTemporary(target: string, data: Uint8Array | string): Promise<string> {
  const bytes = typeof data === 'string' ? Buffer.from(data, 'utf8') : data;
  return writeTemporaryWith(target, async (handle) => {
    for (let at = 0; at < bytes.length; at += CHUNK_BYTES) {
      const end = Math.min(at + CHUNK_BYTES, bytes.length);
      let done = at;
      while (done < end) {
        const { bytesWritten } = await handle.write(bytes, done, end - done, done);
        done += bytesWritten;
      }
    }
  });
}

/**
 * Streams an output into a new temporary file beside target (O_EXCL) and fsyncs it; returns its
 * name. The writer ends the stream (a pipe does); its bytes are on disk when this resolves.
 */
async function streamTemporary(
  target: string,
  write: (out: Writable) => Promise<void>,
): Promise<string> {
  return writeTemporaryWith(target, async (handle) => {
    const out = fileSink(handle);
    try {
      await write(out);
      await finished(out);
    } catch (e) {
      out.destroy();
      throw e;
    }
  });
}

/**
 * A stream that writes into an open file and leaves it open (to be synced and closed by its
 * owner). Node's own `handle.createWriteStream({ autoClose: false })` keeps the handle in use,
 * so closing the handle afterwards never finishes.
 */
function fileSink(handle: FileHandle): Writable {
  let position = 0;
  const put = async (bytes: Buffer): Promise<void> => {
    for (let at = 0; at < bytes.length;) {
      const { bytesWritten } = await handle.write(bytes, at, bytes.length - at, position);
      at += bytesWritten;
      position += bytesWritten;
    }
  };
  return new Writable({
    highWaterMark: CHUNK_BYTES,
    write(chunk: Buffer, _encoding, done) {
      put(chunk).then(() => done(), done);
    },
    // The zip and PDF writers hand over many small pieces: whatever waited while the last write
    // was on disk goes down as one (one system call instead of hundreds).
    writev(chunks, done) {
      put(Buffer.concat(chunks.map((c) => c.chunk as Buffer))).then(() => done(), done);
    },
  });
}

/**
 * One output of a run: where it goes and either a function that makes its bytes when its turn
 * comes (`make`) or one that writes them into a stream (`stream`: the temporary file, so a big
 * output is never held whole; the function ends the stream, as a pipe does, and resolves when
 * it has written everything).
 */
export type PendingOutput =
  | { target: string; make: () => Promise<Uint8Array | string> }
  | { target: string; stream: (out: Writable) => Promise<void> };

/**
 * Writes every output of a run or none: each is made (or streamed) and written to its own
 * temporary file in turn (so at most one output's bytes are held at a time), and only when all are on disk are they
 * renamed over their targets; a failure on the way removes every temporary file and leaves
 * every target as it was. (The renames themselves are one system call each and are not one
 * transaction: a failure between two renames, which needs the disk to vanish mid-run, leaves
 * the earlier outputs written and is reported.)
 * @param outputs - the run's outputs, made and written in this order
 * @param onWrite - called with each target before its bytes are made (progress)
 * @throws the first error met; no target changed unless the error came from a rename
 * @example
 * await writeFilesAtomic([{ target: '/tmp/a.json', make: async () => '{}' }])
 */
export async function writeFilesAtomic(
  outputs: readonly PendingOutput[],
  onWrite: (target: string) => void = () => undefined,
): Promise<void> {
  const written: { temporary: string; target: string }[] = [];
  try {
    for (const o of outputs) {
      onWrite(o.target);
      const temporary =
        'stream' in o
          ? await streamTemporary(o.target, o.stream)
          : await writeTemporary(o.target, await o.make());
      written.push({ temporary, target: o.target });
    }
  } catch (e) {
    for (const w of written) await discardTemporary(w.temporary);
    throw e;
  }
  for (let i = 0; i < written.length; i++) {
    try {
      await rename(written[i].temporary, written[i].target);
      live.delete(written[i].temporary);
    } catch (e) {
      for (const w of written.slice(i)) await discardTemporary(w.temporary);
      throw e;
    }
  }
  for (const dir of new Set(written.map((w) => path.dirname(w.target)))) await syncFolder(dir);
  for (const w of written) await removeStaleTemporaries(w.target);
}

/** Age after which another write's temporary file is taken as abandoned, ms. */
export const STALE_TEMPORARY_MS = 10 * 60 * 1000;

/**
 * Age after which a temporary file whose process no longer runs here is taken as abandoned, ms
 * (not at once: on a folder shared between machines the id may be another machine's process).
 */
export const ORPHAN_TEMPORARY_MS = 60 * 1000;

/**
 * Whether a process of this id runs on this machine (signal 0 checks without signalling).
 * EPERM means it runs under another user.
 */
function processAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Remove temporary files an earlier, interrupted write of the same target
 * left behind (a killed process cannot clean up after itself). Only names of
 * this saver's own pattern for this target, and only when older than
 * STALE_TEMPORARY_MS, or than ORPHAN_TEMPORARY_MS when the process named in it
 * (its id is in the name) no longer runs, so a write still running elsewhere is
 * left alone.
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
      const pid = Number(name.slice(prefix.length).split('-')[0]);
      const age = now - info.mtimeMs;
      if (age < STALE_TEMPORARY_MS && (age < ORPHAN_TEMPORARY_MS || processAlive(pid))) continue;
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
