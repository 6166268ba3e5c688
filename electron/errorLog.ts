import { appendFile, rename, stat } from 'node:fs/promises';
import path from 'node:path';

/** The log's size at which it is moved aside to errors.old.log, bytes. */
export const MAX_LOG_BYTES = 1024 * 1024;

/** One logged error. */
export interface LogEntry {
  /** Which process or part: "main", "renderer", "window.onerror", "worker"… */
  where: string;
  message: string;
  stack?: string;
}

/**
 * Append an error to `errors.log` in the app's data folder, one JSON object
 * per line, moving a full log aside first so it never grows without bound.
 * Logging must never become a second failure: its own errors are swallowed.
 *
 * @param dataDir the app's data folder
 * @param entry what happened
 * @param now the caller's clock
 * @returns the log file's path
 */
export async function appendErrorLog(dataDir: string, entry: LogEntry, now: Date): Promise<string> {
  const file = path.join(dataDir, 'errors.log');
  try {
    const info = await stat(file).catch(() => null);
    if (info && info.size > MAX_LOG_BYTES) await rename(file, path.join(dataDir, 'errors.old.log'));
    const line = JSON.stringify({
      at: now.toISOString(),
      where: entry.where.slice(0, 200),
      message: entry.message.slice(0, 4000),
      ...(entry.stack ? { stack: entry.stack.slice(0, 16000) } : {}),
    });
    await appendFile(file, `${line}\n`, 'utf8');
  } catch {
    // Nowhere better to report a failing log; the message box still shows.
  }
  return file;
}

/** An uncaught value as a log entry (throwables are not always Errors). */
export function entryFromUnknown(where: string, value: unknown): LogEntry {
  if (value instanceof Error)
    return { where, message: value.message || value.name, stack: value.stack };
  return {
    where,
    message: typeof value === 'string' ? value : (JSON.stringify(value) ?? String(value)),
  };
}

/**
 * An uncaught error of the page, recognized in a console message. Chromium
 * logs every uncaught exception and unhandled rejection of the page, its
 * workers and any world as an error-level message starting "Uncaught", so
 * this catches what window.onerror in the isolated preload cannot see.
 *
 * @param level the message's level as Electron reports it
 * @param message the console text, e.g. "Uncaught TypeError: x is undefined"
 * @param sourceId URL of the script
 * @param line line number in that script
 * @returns the log entry, or null for any other console message
 * @example uncaughtFromConsole('error', 'Uncaught (in promise) Error: fit', 'app://plotrate/a.js', 3)?.where // 'page app://plotrate/a.js:3'
 */
export function uncaughtFromConsole(
  level: string,
  message: string,
  sourceId: string,
  line: number,
): LogEntry | null {
  if (level !== 'error' || !/^Uncaught\b/.test(message)) return null;
  return {
    where: `page ${sourceId}:${line}`,
    message: message.replace(/^Uncaught (\(in promise\) )?/, ''),
  };
}
