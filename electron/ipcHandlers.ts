/**
 * The main-process side of window.plotrate: one plain function per IPC
 * channel, built from its dependencies (dialogs, printing, clock, stores) so
 * tests can run them with real files and no Electron. Every handler first
 * checks the sender frame (isAppSender) and then its arguments.
 */
import path from 'node:path';
import { PROJECT_FILE_EXTENSION, type PlotrateProject } from '../shared/project/projectFormat';
import type {
  ErrorReport,
  ExportKind,
  FilesOpened,
  OpenedProject,
  RecentFile,
  RecoveredProject,
  SavedProject,
  TrialFileBytes,
} from '../shared/desktop/desktopContract';
import { TRIAL_FILE_EXTENSIONS, fileKindOf, withExtension } from './fileKinds';
import {
  EXPORT_KINDS,
  checkBytes,
  checkDroppedPaths,
  checkErrorReport,
  checkExportKind,
  checkFileName,
  checkProject,
  checkRecentId,
  checkSaveOptions,
  expectCount,
} from './ipcArguments';
import { IPC } from './ipcChannels';
import { readProjectFile } from './projectFiles';
import type { RecentFiles } from './recentFiles';
import { isAppSender, type SenderFrameLike } from './senderCheck';
import { IpcSenderError, OpenFileError } from './shellErrors';
import type { SourceGuard } from './sourceGuard';
import { readTrialFile } from './trialFiles';

/** The part of an IPC event the handlers read. */
export interface IpcEventLike {
  senderFrame: SenderFrameLike | null;
}

/** A file filter of a native dialog. */
export interface DialogFilter {
  name: string;
  extensions: string[];
}

/** Native dialogs, bound to the window by the caller. */
export interface DialogPort {
  /** Resolves the chosen absolute paths; [] when cancelled. */
  openFiles(options: {
    title: string;
    filters: DialogFilter[];
    multiple: boolean;
  }): Promise<string[]>;
  /** Resolves the chosen absolute path; null when cancelled. */
  saveFile(options: {
    title: string;
    defaultPath: string;
    filters: DialogFilter[];
  }): Promise<string | null>;
}

/** Printing of the window's current page. */
export interface PrintPort {
  /** The system print dialog; resolves false when the user cancelled. */
  print(): Promise<boolean>;
  /** The page as PDF bytes. */
  printToPdf(): Promise<Uint8Array>;
}

/** Autosave as the handlers see it (see Autosaver and the recovery functions). */
export interface AutosavePort {
  note(project: PlotrateProject | null): void;
  pendingRecovery(): RecoveredProject | null;
  discardRecovery(): Promise<void>;
}

/** Everything the handlers need from the outside world. */
export interface ShellDeps {
  dialogs: DialogPort;
  printing: PrintPort;
  clock: () => Date;
  recent: RecentFiles;
  sources: SourceGuard;
  autosave: AutosavePort;
  /** Write a file atomically (writeFileAtomic). */
  writeFile(target: string, data: Uint8Array | string): Promise<void>;
  /** Write a project file atomically, returning the savedAt written. */
  writeProject(target: string, project: PlotrateProject, now: Date): Promise<string>;
  /** Log an error the page reported to the data folder's log (the page shows its own message). */
  log(report: ErrorReport): void;
  /** Default folder for the first save dialog (Documents). */
  documentsFolder: string;
  /** Told after each project open or save, e.g. to set the window title. */
  onProjectPathChanged(projectPath: string | null): void;
}

/** Mutable per-window state the handlers share: where the current project lives. */
export interface ShellState {
  projectPath: string | null;
}

/** A handler as registered with ipcMain.handle. */
export type IpcHandler = (event: IpcEventLike, ...args: unknown[]) => Promise<unknown>;

const TRIAL_FILTERS: DialogFilter[] = [
  { name: 'Trial spreadsheets', extensions: [...TRIAL_FILE_EXTENSIONS] },
  { name: 'All files', extensions: ['*'] },
];
const PROJECT_FILTERS: DialogFilter[] = [
  { name: 'Plotrate project', extensions: [PROJECT_FILE_EXTENSION] },
];

/**
 * Open files by path: trial sheets are read, the last project is read and
 * migrated; each success is added to the recent list, each failure reported
 * with its reason. Used for drops, the command line, the OS and the recent list.
 */
export async function openPaths(
  paths: readonly string[],
  deps: ShellDeps,
  state: ShellState,
): Promise<FilesOpened> {
  const result: FilesOpened = { trialFiles: [], project: null, failures: [] };
  const projects = paths.filter((p) => fileKindOf(p) === 'project');
  const last = projects[projects.length - 1];
  for (const p of paths) {
    const kind = fileKindOf(p);
    try {
      if (kind === 'trial') {
        result.trialFiles.push(await openTrial(p, deps));
      } else if (kind === 'project') {
        if (p !== last)
          throw new OpenFileError(p, 'was not opened: only one project opens at a time');
        result.project = await openProjectAt(p, deps, state);
      } else {
        throw new OpenFileError(
          p,
          `is not a file Plotrate opens (trial sheets: ${TRIAL_FILE_EXTENSIONS.join(', ')}; projects: ${PROJECT_FILE_EXTENSION})`,
        );
      }
    } catch (e) {
      result.failures.push({ name: path.basename(p), message: (e as Error).message });
    }
  }
  return result;
}

async function openTrial(p: string, deps: ShellDeps): Promise<TrialFileBytes> {
  const file = await readTrialFile(p);
  await deps.sources.remember(p);
  await deps.recent.add(p, 'trial', deps.clock());
  return file;
}

async function openProjectAt(
  p: string,
  deps: ShellDeps,
  state: ShellState,
): Promise<OpenedProject> {
  const { project, migratedFrom } = await readProjectFile(p);
  // A migrated project is saved under the same name only when the user saves;
  // until then the older file stays exactly as it was.
  state.projectPath = p;
  deps.onProjectPathChanged(p);
  await deps.recent.add(p, 'project', deps.clock());
  return { name: path.basename(p), project, migratedFrom };
}

/**
 * Build every IPC handler. The map's keys are the IPC channel names.
 * @param deps the outside world
 * @param state the window's shared state
 */
export function createIpcHandlers(deps: ShellDeps, state: ShellState): Record<string, IpcHandler> {
  const guarded =
    (channel: string, body: (...args: unknown[]) => Promise<unknown>): IpcHandler =>
    async (event, ...args) => {
      if (!isAppSender(event?.senderFrame))
        throw new IpcSenderError(channel, event?.senderFrame?.url ?? '');
      return body(...args);
    };

  const handlers: Record<string, IpcHandler> = {
    [IPC.openTrialFiles]: guarded(
      IPC.openTrialFiles,
      async (...args): Promise<TrialFileBytes[]> => {
        expectCount(IPC.openTrialFiles, args, 0);
        const paths = await deps.dialogs.openFiles({
          title: 'Open trial spreadsheets',
          filters: TRIAL_FILTERS,
          multiple: true,
        });
        const files: TrialFileBytes[] = [];
        for (const p of paths) files.push(await openTrial(p, deps));
        return files;
      },
    ),

    [IPC.openProject]: guarded(IPC.openProject, async (...args): Promise<OpenedProject | null> => {
      expectCount(IPC.openProject, args, 0);
      const [p] = await deps.dialogs.openFiles({
        title: 'Open project',
        filters: PROJECT_FILTERS,
        multiple: false,
      });
      return p === undefined ? null : openProjectAt(p, deps, state);
    }),

    [IPC.openRecent]: guarded(IPC.openRecent, async (...args): Promise<FilesOpened> => {
      expectCount(IPC.openRecent, args, 1);
      const id = checkRecentId(IPC.openRecent, args[0]);
      const p = deps.recent.pathOf(id);
      if (p === null)
        return {
          trialFiles: [],
          project: null,
          failures: [{ name: '', message: 'That entry is no longer in the recent list.' }],
        };
      return openPaths([p], deps, state);
    }),

    [IPC.saveProject]: guarded(IPC.saveProject, async (...args): Promise<SavedProject | null> => {
      expectCount(IPC.saveProject, args, 2);
      const project = checkProject(IPC.saveProject, args[0]);
      const { saveAs } = checkSaveOptions(IPC.saveProject, args[1]);
      let target = saveAs ? null : state.projectPath;
      if (target === null) {
        const chosen = await deps.dialogs.saveFile({
          title: saveAs ? 'Save project as' : 'Save project',
          defaultPath: state.projectPath ?? path.join(deps.documentsFolder, 'Untitled.plotrate'),
          filters: PROJECT_FILTERS,
        });
        if (chosen === null) return null;
        target = withExtension(chosen, PROJECT_FILE_EXTENSION);
      }
      await deps.sources.assertWritable(target);
      const savedAt = await deps.writeProject(target, project, deps.clock());
      state.projectPath = target;
      deps.onProjectPathChanged(target);
      deps.autosave.note(null);
      await deps.recent.add(target, 'project', deps.clock());
      return { name: path.basename(target), savedAt };
    }),

    [IPC.exportFile]: guarded(IPC.exportFile, async (...args): Promise<{ name: string } | null> => {
      expectCount(IPC.exportFile, args, 3);
      const suggested = checkFileName(IPC.exportFile, 'suggestedName', args[0]);
      const bytes = checkBytes(IPC.exportFile, 'bytes', args[1]);
      const kind = checkExportKind(IPC.exportFile, args[2]);
      return exportTo(suggested, bytes, kind);
    }),

    [IPC.printGrowerPage]: guarded(IPC.printGrowerPage, async (...args): Promise<boolean> => {
      expectCount(IPC.printGrowerPage, args, 0);
      return deps.printing.print();
    }),

    [IPC.saveGrowerPdf]: guarded(
      IPC.saveGrowerPdf,
      async (...args): Promise<{ name: string } | null> => {
        expectCount(IPC.saveGrowerPdf, args, 1);
        const suggested = checkFileName(IPC.saveGrowerPdf, 'suggestedName', args[0]);
        const bytes = await deps.printing.printToPdf();
        return exportTo(suggested, bytes, 'pdf');
      },
    ),

    [IPC.recentFiles]: guarded(IPC.recentFiles, async (...args): Promise<RecentFile[]> => {
      expectCount(IPC.recentFiles, args, 0);
      return deps.recent.list();
    }),

    [IPC.noteUnsavedChanges]: guarded(IPC.noteUnsavedChanges, async (...args): Promise<void> => {
      expectCount(IPC.noteUnsavedChanges, args, 1);
      deps.autosave.note(args[0] === null ? null : checkProject(IPC.noteUnsavedChanges, args[0]));
    }),

    [IPC.pendingRecovery]: guarded(
      IPC.pendingRecovery,
      async (...args): Promise<RecoveredProject | null> => {
        expectCount(IPC.pendingRecovery, args, 0);
        return deps.autosave.pendingRecovery();
      },
    ),

    [IPC.discardRecovery]: guarded(IPC.discardRecovery, async (...args): Promise<void> => {
      expectCount(IPC.discardRecovery, args, 0);
      await deps.autosave.discardRecovery();
    }),

    [IPC.reportError]: guarded(IPC.reportError, async (...args): Promise<void> => {
      expectCount(IPC.reportError, args, 1);
      deps.log(checkErrorReport(IPC.reportError, args[0]));
    }),

    [IPC.filesDropped]: guarded(IPC.filesDropped, async (...args): Promise<FilesOpened> => {
      expectCount(IPC.filesDropped, args, 1);
      return openPaths(checkDroppedPaths(IPC.filesDropped, args[0]), deps, state);
    }),
  };

  async function exportTo(
    suggested: string,
    bytes: Uint8Array,
    kind: ExportKind,
  ): Promise<{ name: string } | null> {
    const { label, extensions } = EXPORT_KINDS[kind];
    const folder = state.projectPath ? path.dirname(state.projectPath) : deps.documentsFolder;
    const chosen = await deps.dialogs.saveFile({
      title: `Export ${label}`,
      defaultPath: path.join(folder, withExtension(suggested, extensions[0])),
      filters: [{ name: label, extensions }],
    });
    if (chosen === null) return null;
    const target = withExtension(chosen, extensions[0]);
    await deps.sources.assertWritable(target);
    await deps.writeFile(target, bytes);
    return { name: path.basename(target) };
  }

  return handlers;
}
