/**
 * Names of the IPC channels between preload and main. The page never sees
 * them: it calls the typed DesktopApi, and the preload turns each call into
 * one invoke on one of these channels.
 */
export const IPC = {
  openTrialFiles: 'plotrate:open-trial-files',
  openProject: 'plotrate:open-project',
  openRecent: 'plotrate:open-recent',
  saveProject: 'plotrate:save-project',
  exportFile: 'plotrate:export-file',
  printGrowerPage: 'plotrate:print-grower-page',
  saveGrowerPdf: 'plotrate:save-grower-pdf',
  recentFiles: 'plotrate:recent-files',
  noteUnsavedChanges: 'plotrate:note-unsaved-changes',
  pendingRecovery: 'plotrate:pending-recovery',
  discardRecovery: 'plotrate:discard-recovery',
  reportError: 'plotrate:report-error',
  /** From the preload's own drop listener: paths of files dropped on the window. */
  filesDropped: 'plotrate:files-dropped',
} as const;

/** Main → page events. */
export const IPC_EVENTS = {
  filesOpened: 'plotrate:files-opened',
  menuCommand: 'plotrate:menu-command',
} as const;

/** The switch that carries the app's version to the sandboxed preload (webPreferences.additionalArguments). */
export const VERSION_SWITCH = '--plotrate-version=';

export type IpcChannel = (typeof IPC)[keyof typeof IPC];
