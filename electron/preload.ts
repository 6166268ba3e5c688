/**
 * The preload: runs sandboxed in the window before the page and puts the
 * typed DesktopApi on window.plotrate through contextBridge — nothing else,
 * no ipcRenderer, no Node. It also takes files dropped on the window, which
 * the page may leave to the shell. (The page's uncaught errors reach the shell
 * through its console, see uncaughtFromConsole: listeners here, in the
 * isolated world, would not see them.)
 */
import { contextBridge, ipcRenderer, webUtils } from 'electron';
import type { PlotrateProject } from '../shared/project/projectFormat';
import {
  MENU_COMMANDS,
  type DesktopApi,
  type ErrorReport,
  type ExportKind,
  type FilesOpened,
  type MenuCommand,
} from '../shared/desktop/desktopContract';
import { IPC, IPC_EVENTS, VERSION_SWITCH } from './ipcChannels';

const version =
  process.argv.find((a) => a.startsWith(VERSION_SWITCH))?.slice(VERSION_SWITCH.length) ?? '0.0.0';

// Files can arrive before the page subscribes (given on the command line at
// launch): keep them until the first subscriber.
const fileListeners = new Set<(files: FilesOpened) => void>();
const waitingFiles: FilesOpened[] = [];
function deliverFiles(files: FilesOpened): void {
  if (fileListeners.size === 0) waitingFiles.push(files);
  else for (const listener of fileListeners) listener(files);
}
ipcRenderer.on(IPC_EVENTS.filesOpened, (_event, files: FilesOpened) => deliverFiles(files));

const commandListeners = new Set<(command: MenuCommand) => void>();
ipcRenderer.on(IPC_EVENTS.menuCommand, (_event, command: MenuCommand) => {
  if (!MENU_COMMANDS.includes(command)) return;
  if (commandListeners.size === 0) {
    // No page handler yet: undo and redo still work in text fields.
    if (command === 'undo' || command === 'redo') document.execCommand(command);
    return;
  }
  for (const listener of commandListeners) listener(command);
});

const api: DesktopApi = {
  isDesktop: true,
  appVersion: version,
  openTrialFiles: () => ipcRenderer.invoke(IPC.openTrialFiles),
  openProject: () => ipcRenderer.invoke(IPC.openProject),
  openRecent: (id: string) => ipcRenderer.invoke(IPC.openRecent, id),
  saveProject: (project: PlotrateProject, options: { saveAs: boolean }) =>
    ipcRenderer.invoke(IPC.saveProject, project, options),
  exportFile: (suggestedName: string, bytes: Uint8Array, kind: ExportKind) =>
    ipcRenderer.invoke(IPC.exportFile, suggestedName, bytes, kind),
  printGrowerPage: () => ipcRenderer.invoke(IPC.printGrowerPage),
  saveGrowerPdf: (suggestedName: string) => ipcRenderer.invoke(IPC.saveGrowerPdf, suggestedName),
  recentFiles: () => ipcRenderer.invoke(IPC.recentFiles),
  noteUnsavedChanges: (project: PlotrateProject | null) => {
    void ipcRenderer.invoke(IPC.noteUnsavedChanges, project);
  },
  pendingRecovery: () => ipcRenderer.invoke(IPC.pendingRecovery),
  discardRecovery: () => ipcRenderer.invoke(IPC.discardRecovery),
  onFilesOpened(callback) {
    fileListeners.add(callback);
    for (const files of waitingFiles.splice(0)) callback(files);
    return () => void fileListeners.delete(callback);
  },
  onMenuCommand(callback) {
    commandListeners.add(callback);
    return () => void commandListeners.delete(callback);
  },
  reportError: (report: ErrorReport) => {
    void ipcRenderer.invoke(IPC.reportError, report);
  },
};

contextBridge.exposeInMainWorld('plotrate', api);

// Files dropped on the window: a drop the page handled itself (preventDefault)
// is left alone; any other is read by the shell and delivered to onFilesOpened.
// Paths come only from real dropped File objects (webUtils), never from the page.
window.addEventListener('dragover', (event) => event.preventDefault());
window.addEventListener('drop', (event) => {
  if (event.defaultPrevented) return;
  event.preventDefault();
  const paths = [...(event.dataTransfer?.files ?? [])]
    .map((file) => webUtils.getPathForFile(file))
    .filter((p) => p !== '');
  if (paths.length === 0) return;
  void ipcRenderer
    .invoke(IPC.filesDropped, paths)
    .then((files: FilesOpened) => deliverFiles(files));
});
