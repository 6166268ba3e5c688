/**
 * The contract between the desktop shell and the page: the small API the shell's preload script
 * puts on `window.plotrate`. Both sides import it from here (types and one constant list, no I/O),
 * so the renderer never imports electron/. The IPC channel names stay in electron/ipcChannels.ts:
 * only the shell's two processes use them.
 * The renderer codes against these types only; in a plain browser
 * (`npm run web`) `window.plotrate` is undefined and the renderer falls back
 * to file inputs and downloads.
 *
 * Everything crossing this bridge is plain data (structured clone): file
 * bytes travel as Uint8Array, never as paths, so the page never learns or
 * chooses where on disk anything lives. The shell remembers the paths.
 */
import type { PlotrateProject } from '../project/projectFormat';

/** A trial spreadsheet read by the shell (xlsx, xls, csv, tsv, txt). */
export interface TrialFileBytes {
  /** File name without folders, e.g. "Hollow Creek 2025.xlsx". */
  name: string;
  bytes: Uint8Array;
}

/** A project the shell read, validated and (when older) migrated. */
export interface OpenedProject {
  /** File name without folders, e.g. "North block N trial.plotrate". */
  name: string;
  project: PlotrateProject;
  /** The file's version when it was older than this build's, else null. Saving writes the current version. */
  migratedFrom: number | null;
}

/**
 * Files handed to the app from outside a dialog: dropped on the window, given
 * on the command line, opened from the file manager (a second launch forwards
 * them to the running window) or picked from the recent list.
 */
export interface FilesOpened {
  trialFiles: TrialFileBytes[];
  /** At most one project per event: the last one given. */
  project: OpenedProject | null;
  /** Files that could not be read or opened, with the reason (shown to the user). */
  failures: { name: string; message: string }[];
}

/** Result of a successful save; null from saveProject means the user cancelled. */
export interface SavedProject {
  name: string;
  /** The savedAt written into the file, ISO 8601 UTC. */
  savedAt: string;
}

/** What an exported file is, for the save dialog's filter and default extension. */
export type ExportKind = 'xlsx' | 'csv' | 'pdf' | 'json' | 'png' | 'svg';

/** An entry of the recent-files list (newest first). */
export interface RecentFile {
  /** Opaque key to pass to openRecent. */
  id: string;
  name: string;
  /** The folder, for display only ("~/Trials/2025"). */
  folder: string;
  kind: 'project' | 'trial';
  /** When it was last opened, ISO 8601 UTC. */
  openedAt: string;
}

/** Unsaved work found after a crash (no clean-shutdown marker). */
export interface RecoveredProject {
  project: PlotrateProject;
  /** When the autosave copy was written, ISO 8601 UTC. */
  autosavedAt: string;
  /** Name of the project file it belongs to, or null when it was never saved. */
  name: string | null;
}

/** Commands from the application menu (and its keyboard shortcuts) to the page. */
export type MenuCommand =
  | 'new-project'
  | 'open-trial-files'
  | 'open-project'
  | 'save'
  | 'save-as'
  | 'export-workbook'
  | 'print-grower-page'
  | 'save-grower-pdf'
  | 'undo'
  | 'redo';

/** Every menu command, for validation and tests. */
export const MENU_COMMANDS: readonly MenuCommand[] = [
  'new-project',
  'open-trial-files',
  'open-project',
  'save',
  'save-as',
  'export-workbook',
  'print-grower-page',
  'save-grower-pdf',
  'undo',
  'redo',
];

/** An error the page caught, for the shell's log file. */
export interface ErrorReport {
  message: string;
  stack?: string;
  /** Where it happened, e.g. "worker", "window.onerror", "fit screen". */
  where: string;
}

/** The object the preload exposes as `window.plotrate`. */
export interface DesktopApi {
  /** Always true: lets the renderer tell the desktop from a browser. */
  readonly isDesktop: true;
  /** Plotrate's version, for the project file's appVersion and the about text. */
  readonly appVersion: string;
  /** Native open dialog for trial spreadsheets (several at once). Resolves [] when cancelled. */
  openTrialFiles(): Promise<TrialFileBytes[]>;
  /** Native open dialog for a project. Resolves null when cancelled; rejects with the file's problem. */
  openProject(): Promise<OpenedProject | null>;
  /** Reopen an entry of recentFiles(); an entry whose file vanished is reported in failures. */
  openRecent(id: string): Promise<FilesOpened>;
  /**
   * Save the project atomically. Without saveAs it goes to the file it was
   * opened from or last saved to; the first save, or saveAs, asks where.
   * Resolves null when the user cancels the dialog.
   */
  saveProject(project: PlotrateProject, options: { saveAs: boolean }): Promise<SavedProject | null>;
  /** Ask where and write an export (workbook, CSV, PDF…). Resolves the chosen name, or null when cancelled. */
  exportFile(
    suggestedName: string,
    bytes: Uint8Array,
    kind: ExportKind,
  ): Promise<{ name: string } | null>;
  /**
   * Print the page as it is now (the renderer shows the grower page, with its
   * cautions, before calling). Resolves false when the user cancelled.
   */
  printGrowerPage(): Promise<boolean>;
  /** Save the page as it is now to a PDF (A4/Letter by locale), asking where. Resolves the name or null. */
  saveGrowerPdf(suggestedName: string): Promise<{ name: string } | null>;
  recentFiles(): Promise<RecentFile[]>;
  /**
   * Tell the shell the project has unsaved changes (give the current state) or
   * that it is clean (null, after a save or when the work is discarded). While
   * unsaved, the shell writes an autosave copy every minute and asks before closing.
   * The shell checks the whole project on each call, so call it once changes
   * settle (debounced by a second or so), not on every keystroke.
   */
  noteUnsavedChanges(project: PlotrateProject | null): void;
  /** Unsaved work from a session that ended without a clean shutdown, or null. */
  pendingRecovery(): Promise<RecoveredProject | null>;
  /** Drop the recovered copy (the user declined or has taken it over). */
  discardRecovery(): Promise<void>;
  /** Subscribe to files opened from outside a dialog; returns the unsubscribe function. */
  onFilesOpened(callback: (files: FilesOpened) => void): () => void;
  /**
   * Subscribe to menu commands; returns the unsubscribe function. For 'undo'
   * and 'redo' the page decides: in a text field it should let the field undo
   * (document.execCommand), elsewhere undo its own last step. With no
   * subscriber the preload lets the focused field undo.
   */
  onMenuCommand(callback: (command: MenuCommand) => void): () => void;
  /** Log an error the page caught to the shell's log file (the page shows its own message). */
  reportError(report: ErrorReport): void;
}

declare global {
  interface Window {
    /** Present in the desktop app only. */
    plotrate?: DesktopApi;
  }
}
