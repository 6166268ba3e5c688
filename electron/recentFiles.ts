import { createHash } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { writeFileAtomic } from './atomicWrite';
import type { RecentFile } from '../shared/desktop/desktopContract';

/** How many entries the list keeps. */
export const MAX_RECENT_FILES = 12;

interface StoredEntry {
  path: string;
  kind: 'project' | 'trial';
  openedAt: string;
}

/**
 * The recent-files list, kept as `recent-files.json` in the app's data
 * folder. Full paths stay in the shell; the page sees names, folders and an
 * opaque id, and can only ask to reopen an entry of this list.
 */
export class RecentFiles {
  #entries: StoredEntry[] = [];

  /** @param file absolute path of recent-files.json */
  constructor(private readonly file: string) {}

  /** Load the list; a missing or unreadable list starts empty (it is only a convenience). */
  async load(): Promise<void> {
    try {
      const data = JSON.parse(await readFile(this.file, 'utf8')) as { entries?: unknown };
      const entries = Array.isArray(data.entries) ? data.entries : [];
      this.#entries = entries
        .filter(
          (e): e is StoredEntry =>
            typeof e === 'object' &&
            e !== null &&
            typeof e.path === 'string' &&
            path.isAbsolute(e.path) &&
            (e.kind === 'project' || e.kind === 'trial') &&
            typeof e.openedAt === 'string',
        )
        .slice(0, MAX_RECENT_FILES);
    } catch {
      this.#entries = [];
    }
  }

  /** Put a file at the top of the list and save the list. */
  async add(filePath: string, kind: 'project' | 'trial', now: Date): Promise<void> {
    this.#entries = [
      { path: filePath, kind, openedAt: now.toISOString() },
      ...this.#entries.filter((e) => e.path !== filePath),
    ].slice(0, MAX_RECENT_FILES);
    await writeFileAtomic(
      this.file,
      `${JSON.stringify({ version: 1, entries: this.#entries }, null, 2)}\n`,
    );
  }

  /** Empty the list and save it. */
  async clear(): Promise<void> {
    this.#entries = [];
    await writeFileAtomic(this.file, `${JSON.stringify({ version: 1, entries: [] }, null, 2)}\n`);
  }

  /** The list for the page, newest first. */
  list(): RecentFile[] {
    return this.#entries.map((e) => ({
      id: recentId(e.path),
      name: path.basename(e.path),
      folder: displayFolder(path.dirname(e.path)),
      kind: e.kind,
      openedAt: e.openedAt,
    }));
  }

  /** Full paths, newest first (for the menu and the OS's own recent list). */
  paths(): { path: string; kind: 'project' | 'trial' }[] {
    return this.#entries.map((e) => ({ path: e.path, kind: e.kind }));
  }

  /** The path behind an id from list(), or null when the id is not in the list. */
  pathOf(id: string): string | null {
    return this.#entries.find((e) => recentId(e.path) === id)?.path ?? null;
  }
}

function recentId(filePath: string): string {
  return createHash('sha256').update(filePath).digest('hex').slice(0, 20);
}

function displayFolder(folder: string): string {
  const home = os.homedir();
  return folder === home || folder.startsWith(home + path.sep)
    ? `~${folder.slice(home.length)}`
    : folder;
}
