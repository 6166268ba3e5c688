/**
 * Autosave and crash recovery. While the project has unsaved changes the
 * shell writes a copy to `autosave.json` in the app's data folder once a
 * minute (atomically, like every save). A marker file `session-running`
 * exists from start-up until a clean shutdown; finding it at the next start
 * means the app ended without shutting down, and the autosaved copy — if any
 * — is moved to `recovered.json` and offered back. It stays there, offered
 * at every start, until the user takes it or declines it (discardRecovery),
 * so quitting without answering loses nothing. Autosave never touches the
 * user's own project file.
 */
import { readFile, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { parseProject } from '../shared/project/parseProject';
import type { PlotrateProject } from '../shared/project/projectFormat';
import { serializeProject } from '../shared/project/serializeProject';
import { writeFileAtomic } from './atomicWrite';
import type { RecoveredProject } from '../shared/desktop/desktopContract';

/** Interval between autosaves while there are unsaved changes, ms. */
export const AUTOSAVE_INTERVAL_MS = 60_000;

const AUTOSAVE_FILE = 'autosave.json';
const MARKER_FILE = 'session-running';
const RECOVERED_FILE = 'recovered.json';

/** The autosave envelope: when, for which project file, and the project's own text. */
interface AutosaveEnvelope {
  format: 'plotrate-autosave';
  autosavedAt: string;
  /** Absolute path of the project file the work belongs to, or null when never saved. */
  projectPath: string | null;
  projectText: string;
}

/** What the shell learns at start-up. */
export interface StartupRecovery {
  /** The previous session ended without a clean shutdown. */
  uncleanExit: boolean;
  /** Unsaved work of a session that crashed (this time or earlier, not yet answered); null when none. */
  recovered: (RecoveredProject & { projectPath: string | null }) | null;
  /** Why an autosave copy could not be read, when it could not. */
  unreadable: string | null;
}

/**
 * Start a session: look for a previous unclean exit and its autosave, then
 * set the running marker. Call once, after the single-instance lock is held.
 *
 * @param dataDir the app's data folder (app.getPath('userData'))
 * @param now the caller's clock, written into the marker
 */
export async function beginSession(dataDir: string, now: Date): Promise<StartupRecovery> {
  const marker = path.join(dataDir, MARKER_FILE);
  const uncleanExit = await readFile(marker).then(
    () => true,
    () => false,
  );
  if (uncleanExit) {
    // Keep the crashed session's copy apart, so this session's autosaves cannot replace it.
    await rename(path.join(dataDir, AUTOSAVE_FILE), path.join(dataDir, RECOVERED_FILE)).catch(
      () => undefined,
    );
  }
  let recovered: StartupRecovery['recovered'] = null;
  let unreadable: string | null = null;
  try {
    recovered = await readAutosave(dataDir, RECOVERED_FILE);
  } catch (e) {
    unreadable = (e as Error).message;
  }
  await writeFile(marker, `${process.pid} ${now.toISOString()}\n`);
  return { uncleanExit, recovered, unreadable };
}

/**
 * End a session cleanly: remove the autosave copy (the user saved or chose to
 * discard) and then the marker, in that order, so a crash between the two
 * still counts as unclean but finds nothing stale to offer.
 */
export async function endSessionCleanly(dataDir: string): Promise<void> {
  await discardAutosave(dataDir);
  await rm(path.join(dataDir, MARKER_FILE), { force: true });
}

/**
 * Read an autosave copy, or null when there is none.
 * @param file "autosave.json" (this session's) or "recovered.json" (a crashed session's)
 * @throws when it exists but is damaged
 */
export async function readAutosave(
  dataDir: string,
  file: string = AUTOSAVE_FILE,
): Promise<(RecoveredProject & { projectPath: string | null }) | null> {
  let text: string;
  try {
    text = await readFile(path.join(dataDir, file), 'utf8');
  } catch {
    return null;
  }
  let envelope: AutosaveEnvelope;
  try {
    envelope = JSON.parse(text) as AutosaveEnvelope;
  } catch (e) {
    throw new Error(
      `${file} is not readable JSON (${(e as Error).message}); it was probably cut short`,
      { cause: e },
    );
  }
  if (envelope.format !== 'plotrate-autosave' || typeof envelope.projectText !== 'string')
    throw new Error(`${file} is not an autosave copy`);
  const { project } = parseProject(envelope.projectText, file);
  const projectPath = typeof envelope.projectPath === 'string' ? envelope.projectPath : null;
  return {
    project,
    autosavedAt: envelope.autosavedAt,
    name: projectPath === null ? null : path.basename(projectPath),
    projectPath,
  };
}

/** Write the autosave copy now (atomically). */
export async function writeAutosave(
  dataDir: string,
  project: PlotrateProject,
  projectPath: string | null,
  now: Date,
): Promise<void> {
  const envelope: AutosaveEnvelope = {
    format: 'plotrate-autosave',
    autosavedAt: now.toISOString(),
    projectPath,
    // savedAt inside stays the project's own last save; the envelope says when this copy was made.
    projectText: serializeProject(project, new Date(project.savedAt)),
  };
  await writeFileAtomic(path.join(dataDir, AUTOSAVE_FILE), JSON.stringify(envelope));
}

/** Remove a crashed session's copy: the user took it over or declined it. */
export async function discardRecovered(dataDir: string): Promise<void> {
  await rm(path.join(dataDir, RECOVERED_FILE), { force: true });
}

/** Remove this session's autosave copy, if any. */
export async function discardAutosave(dataDir: string): Promise<void> {
  await rm(path.join(dataDir, AUTOSAVE_FILE), { force: true });
}

/** Timer functions, passed in so tests can drive time. */
export interface Timers {
  setInterval(callback: () => void, ms: number): unknown;
  clearInterval(handle: unknown): void;
}

/**
 * Keeps the latest unsaved state and writes it once per interval, only when
 * it changed since the last write. note(null) means clean: stop and drop the copy.
 */
export class Autosaver {
  #latest: PlotrateProject | null = null;
  #written = true;
  #handle: unknown = null;
  #pending: Promise<void> = Promise.resolve();

  /**
   * @param write writes one copy (writeAutosave bound to the data folder and current project path)
   * @param discard removes the copy
   * @param onError told when a write fails (logged; the next interval tries again)
   */
  constructor(
    private readonly write: (project: PlotrateProject) => Promise<void>,
    private readonly discard: () => Promise<void>,
    private readonly onError: (e: unknown) => void,
    private readonly timers: Timers = globalThis as unknown as Timers,
    private readonly intervalMs: number = AUTOSAVE_INTERVAL_MS,
  ) {}

  /** Whether there are unsaved changes. */
  get dirty(): boolean {
    return this.#latest !== null;
  }

  /** The latest unsaved state, or null when clean. */
  get latest(): PlotrateProject | null {
    return this.#latest;
  }

  /** Record the current unsaved state (or null for clean). */
  note(project: PlotrateProject | null): void {
    if (project === null) {
      this.#latest = null;
      this.#written = true;
      this.#stop();
      this.#pending = this.#pending.then(() => this.discard()).catch(this.onError);
      return;
    }
    this.#latest = project;
    this.#written = false;
    if (this.#handle === null)
      this.#handle = this.timers.setInterval(() => void this.flush(), this.intervalMs);
  }

  /** Write now if there is something unwritten; resolves when the write is done. */
  flush(): Promise<void> {
    if (this.#latest !== null && !this.#written) {
      const project = this.#latest;
      this.#written = true;
      this.#pending = this.#pending
        .then(() => this.write(project))
        .catch((e) => {
          this.#written = false;
          this.onError(e);
        });
    }
    return this.#pending;
  }

  /** Stop the timer (at shutdown). */
  dispose(): void {
    this.#stop();
  }

  #stop(): void {
    if (this.#handle !== null) this.timers.clearInterval(this.#handle);
    this.#handle = null;
  }
}
