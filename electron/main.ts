/**
 * The Electron main process: the thin layer that joins the plain modules of
 * electron/ to Electron itself. Decisions live in those modules (and their
 * tests); this file only wires events to them.
 */
import { paperSize } from '../shared/report/paperSize';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import {
  BrowserWindow,
  Menu,
  app,
  dialog,
  ipcMain,
  protocol,
  session,
  shell,
  type MessageBoxOptions,
} from 'electron';
import type { PlotrateProject } from '../shared/project/projectFormat';
import { buildMenuTemplate } from './appMenu';
import { APP_ENTRY_URL, APP_SCHEME, contentTypeFor, resolveAppRequest } from './appProtocol';
import { writeFileAtomic } from './atomicWrite';
import {
  Autosaver,
  beginSession,
  discardAutosave,
  discardRecovered,
  endSessionCleanly,
  writeAutosave,
  type StartupRecovery,
} from './autosave';
import { CONTENT_SECURITY_POLICY } from './contentSecurityPolicy';
import type {
  ErrorReport,
  FilesOpened,
  MenuCommand,
  RecoveredProject,
} from '../shared/desktop/desktopContract';
import { appendErrorLog, entryFromUnknown, uncaughtFromConsole, type LogEntry } from './errorLog';
import { withExtension } from './fileKinds';
import { IPC_EVENTS } from './ipcChannels';
import { createIpcHandlers, openPaths, type ShellDeps, type ShellState } from './ipcHandlers';
import { filesFromArgv } from './launchArguments';
import { writeProjectFile } from './projectFiles';
import { RecentFiles } from './recentFiles';
import { denyAllPermissions, guardWebContents, limitDownloads } from './sessionPolicy';
import { SourceGuard } from './sourceGuard';
import { buildWindowOptions } from './windowOptions';

// dist-electron/main.cjs sits next to preload.cjs and icon.png; the renderer is in dist/renderer.
const shellDir = __dirname;
const rendererDir = path.join(shellDir, '..', 'dist', 'renderer');
const dataDir = () => app.getPath('userData');

let window: BrowserWindow | null = null;
let startup: StartupRecovery = { uncleanExit: false, recovered: null, unreadable: null };
let recovery: RecoveredProject | null = null;
let quitting = false;
/** Files given before the window could take them (macOS open-file at launch, early second instances). */
const waitingPaths: string[] = [];
const state: ShellState = { projectPath: null };
const sources = new SourceGuard();
let recent: RecentFiles;
let autosaver: Autosaver;

// ---- Errors: logged to a file in the data folder, shown, never fatal ----

let messageOpen = false;

/** Log an error and show it, one box at a time, so a burst of errors cannot bury the window. */
function reportAndShow(entry: LogEntry): void {
  void appendErrorLog(dataDir(), entry, new Date()).then((logFile) => {
    if (messageOpen || !app.isReady()) return;
    messageOpen = true;
    const options: MessageBoxOptions = {
      type: 'error',
      title: 'Plotrate',
      message: 'Something went wrong, but your work is still open.',
      detail: `${entry.message}\n\nWhere: ${entry.where}\nDetails were written to ${logFile}. Saving your project now is a good idea.`,
      buttons: ['OK'],
    };
    const shown = window ? dialog.showMessageBox(window, options) : dialog.showMessageBox(options);
    void shown.finally(() => {
      messageOpen = false;
    });
  });
}

process.on('uncaughtException', (error) => reportAndShow(entryFromUnknown('main', error)));
process.on('unhandledRejection', (reason) =>
  reportAndShow(entryFromUnknown('main (promise)', reason)),
);

// ---- The app:// scheme must be declared before the app is ready ----

protocol.registerSchemesAsPrivileged([
  {
    scheme: APP_SCHEME,
    privileges: {
      standard: true,
      secure: true,
      supportFetchAPI: true,
      stream: true,
      codeCache: true,
    },
  },
]);

// ---- One instance: a second launch hands its files to the first and quits ----

if (!app.requestSingleInstanceLock()) {
  app.quit();
} else {
  app.on('second-instance', (_event, argv, workingDirectory) => {
    openFromOutside(filesFromArgv(argv, workingDirectory, app.isPackaged ? 1 : 2));
    if (window) {
      if (window.isMinimized()) window.restore();
      window.focus();
    }
  });
  // macOS hands files opened in the Finder (or dropped on the Dock icon) here.
  app.on('open-file', (event, filePath) => {
    event.preventDefault();
    openFromOutside([filePath]);
  });
  app.on('web-contents-created', (_event, contents) => guardWebContents(contents));
  app.on('window-all-closed', () => app.quit());
  app.on('will-quit', (event) => {
    if (quitting) return;
    // Finish the clean-shutdown bookkeeping before the process ends.
    event.preventDefault();
    quitting = true;
    autosaver?.dispose();
    void endSessionCleanly(dataDir()).finally(() => app.quit());
  });
  void app.whenReady().then(start);
}

async function start(): Promise<void> {
  startup = await beginSession(dataDir(), new Date());
  recovery = startup.recovered;
  if (startup.unreadable)
    void appendErrorLog(
      dataDir(),
      { where: 'autosave', message: `The autosave copy could not be read: ${startup.unreadable}` },
      new Date(),
    );
  recent = new RecentFiles(path.join(dataDir(), 'recent-files.json'));
  await recent.load();
  autosaver = new Autosaver(
    (project) => writeAutosave(dataDir(), project, state.projectPath, new Date()),
    () => discardAutosave(dataDir()),
    (e) => void appendErrorLog(dataDir(), entryFromUnknown('autosave', e), new Date()),
  );

  serveRenderer();
  const ses = session.defaultSession;
  denyAllPermissions(ses);
  limitDownloads(ses);
  // No remote content: any request that leaves the app is cancelled.
  ses.webRequest.onBeforeRequest(
    { urls: ['http://*/*', 'https://*/*', 'ws://*/*', 'wss://*/*', 'ftp://*/*', 'file://*/*'] },
    (_details, callback) => callback({ cancel: true }),
  );

  registerIpc();
  rebuildMenu();
  createWindow();
  waitingPaths.push(...filesFromArgv(process.argv, process.cwd(), app.isPackaged ? 1 : 2));
}

/** Serve dist/renderer on app://plotrate/ with the CSP header; nothing outside that folder. */
function serveRenderer(): void {
  protocol.handle(APP_SCHEME, async (request) => {
    const file = resolveAppRequest(request.url, rendererDir);
    if (file === null) return new Response('Not found', { status: 404 });
    try {
      const bytes = await readFile(file);
      return new Response(new Uint8Array(bytes), {
        headers: {
          'Content-Type': contentTypeFor(file),
          'Content-Security-Policy': CONTENT_SECURITY_POLICY,
          'X-Content-Type-Options': 'nosniff',
          'Cross-Origin-Opener-Policy': 'same-origin',
        },
      });
    } catch {
      return new Response('Not found', { status: 404 });
    }
  });
}

function createWindow(): void {
  const win = new BrowserWindow(
    buildWindowOptions(
      path.join(shellDir, 'preload.cjs'),
      path.join(shellDir, 'icon.png'),
      app.getVersion(),
      !app.isPackaged,
    ),
  );
  window = win;
  win.once('ready-to-show', () => win.show());
  win.webContents.on('did-finish-load', () => {
    const paths = waitingPaths.splice(0);
    if (paths.length > 0) openFromOutside(paths);
  });
  win.webContents.on('console-message', (event) => {
    const entry = uncaughtFromConsole(event.level, event.message, event.sourceId, event.lineNumber);
    if (entry) reportAndShow(entry);
  });
  win.webContents.on('render-process-gone', (_event, details) => {
    reportAndShow({ where: 'renderer', message: `The window's page stopped (${details.reason}).` });
    if (details.reason !== 'clean-exit' && !win.isDestroyed()) win.webContents.reload();
  });
  win.webContents.on(
    'unresponsive',
    () =>
      void appendErrorLog(
        dataDir(),
        { where: 'renderer', message: 'The page stopped responding.' },
        new Date(),
      ),
  );
  win.on('close', (event) => {
    if (!autosaver.dirty) return;
    event.preventDefault();
    void confirmClose(win);
  });
  win.on('closed', () => {
    window = null;
  });
  void win.loadURL(APP_ENTRY_URL);
}

/** Ask about unsaved changes before the window closes; saving uses the latest state the page gave. */
async function confirmClose(win: BrowserWindow): Promise<void> {
  const { response } = await dialog.showMessageBox(win, {
    type: 'question',
    message: 'Save the changes to this project before closing?',
    detail: 'Changes you do not save are lost.',
    buttons: ['Save', "Don't Save", 'Cancel'],
    defaultId: 0,
    cancelId: 2,
  });
  if (response === 2) return;
  if (response === 0) {
    const project = autosaver.latest;
    if (project && !(await saveOnClose(win, project))) return;
  }
  autosaver.note(null);
  await autosaver.flush();
  win.destroy();
}

async function saveOnClose(win: BrowserWindow, project: PlotrateProject): Promise<boolean> {
  let target = state.projectPath;
  if (target === null) {
    const chosen = await dialog.showSaveDialog(win, {
      title: 'Save project',
      defaultPath: path.join(app.getPath('documents'), 'Untitled.plotrate'),
      filters: [{ name: 'Plotrate project', extensions: ['plotrate'] }],
    });
    if (chosen.canceled || !chosen.filePath) return false;
    target = withExtension(chosen.filePath, 'plotrate');
  }
  try {
    await sources.assertWritable(target);
    await writeProjectFile(target, project, new Date());
    return true;
  } catch (e) {
    reportAndShow(entryFromUnknown('saving before close', e));
    return false;
  }
}

function deps(): ShellDeps {
  return {
    dialogs: {
      async openFiles({ title, filters, multiple }) {
        const options = {
          title,
          filters,
          properties: multiple
            ? (['openFile', 'multiSelections'] as const)
            : (['openFile'] as const),
        };
        const r = window
          ? await dialog.showOpenDialog(window, { ...options, properties: [...options.properties] })
          : await dialog.showOpenDialog({ ...options, properties: [...options.properties] });
        return r.canceled ? [] : r.filePaths;
      },
      async saveFile({ title, defaultPath, filters }) {
        const r = window
          ? await dialog.showSaveDialog(window, { title, defaultPath, filters })
          : await dialog.showSaveDialog({ title, defaultPath, filters });
        return r.canceled || !r.filePath ? null : r.filePath;
      },
    },
    printing: {
      print: () =>
        new Promise((resolve, reject) => {
          if (!window) return resolve(false);
          window.webContents.print({ silent: false, printBackground: true }, (ok, reason) => {
            if (ok || reason === 'cancelled' || reason === 'Print job canceled') resolve(ok);
            else reject(new Error(`Printing failed: ${reason}`));
          });
        }),
      async printToPdf() {
        if (!window) throw new Error('There is no window to print.');
        // Letter where it is the usual paper size, A4 elsewhere (one rule with the reports).
        const letter =
          paperSize({ rate: 'kg/ha', yield: 't/ha' }, app.getLocaleCountryCode()) === 'letter';
        const pdf = await window.webContents.printToPDF({
          pageSize: letter ? 'Letter' : 'A4',
          printBackground: true,
          generateDocumentOutline: true,
          generateTaggedPDF: true,
        });
        return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength);
      },
    },
    clock: () => new Date(),
    recent,
    sources,
    autosave: {
      note: (project) => autosaver.note(project),
      pendingRecovery: () => recovery,
      async discardRecovery() {
        recovery = null;
        await discardRecovered(dataDir());
      },
    },
    writeFile: writeFileAtomic,
    writeProject: writeProjectFile,
    log: (report: ErrorReport) =>
      void appendErrorLog(
        dataDir(),
        { where: `page: ${report.where}`, message: report.message, stack: report.stack },
        new Date(),
      ),
    documentsFolder: app.getPath('documents'),
    onProjectPathChanged: (projectPath) => {
      window?.setTitle(projectPath ? `${path.basename(projectPath)} — Plotrate` : 'Plotrate');
      if (projectPath) app.addRecentDocument(projectPath);
    },
  };
}

function registerIpc(): void {
  const handlers = createIpcHandlers(deps(), state);
  for (const [channel, handler] of Object.entries(handlers)) {
    ipcMain.handle(channel, async (event, ...args) => {
      const before = JSON.stringify(recent.paths());
      try {
        return await handler(event, ...args);
      } catch (e) {
        void appendErrorLog(dataDir(), entryFromUnknown(`ipc ${channel}`, e), new Date());
        throw e;
      } finally {
        if (JSON.stringify(recent.paths()) !== before) rebuildMenu();
      }
    });
  }
}

/** Open files that came from outside a dialog and hand them to the page. */
function openFromOutside(paths: string[]): void {
  if (paths.length === 0) return;
  if (!window || window.webContents.isLoading()) {
    waitingPaths.push(...paths);
    return;
  }
  void openPaths(paths, deps(), state).then((opened: FilesOpened) => {
    rebuildMenu();
    window?.webContents.send(IPC_EVENTS.filesOpened, opened);
  });
}

function sendCommand(command: MenuCommand): void {
  window?.webContents.send(IPC_EVENTS.menuCommand, command);
}

function rebuildMenu(): void {
  const template = buildMenuTemplate(
    {
      send: sendCommand,
      recent: (recent?.paths() ?? []).map((r) => ({
        label: path.basename(r.path),
        open: () => openFromOutside([r.path]),
      })),
      clearRecent: () => {
        app.clearRecentDocuments();
        void recent.clear().then(rebuildMenu);
      },
      about: () =>
        void dialog.showMessageBox({
          type: 'info',
          title: 'About Plotrate',
          message: `Plotrate ${app.getVersion()}`,
          detail:
            'Yield response to fertilizer rate in small-plot trials: fits, economic optimum rates and grower reports.',
        }),
      showLogFolder: () => void shell.openPath(dataDir()),
    },
    process.platform,
    !app.isPackaged,
  );
  Menu.setApplicationMenu(Menu.buildFromTemplate(template));
}
