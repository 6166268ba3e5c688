// The IPC handlers run here exactly as main.ts registers them, with real files
// in a temporary folder; only the native dialogs and the printer are scripted.
// Sender checks follow Electron's security checklist, item 17 "Validate the
// sender of all IPC messages".
import { mkdir, mkdtemp, readFile, rm, stat, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { writeFileAtomic } from '../electron/atomicWrite';
import type {
  ErrorReport,
  FilesOpened,
  OpenedProject,
  SavedProject,
} from '../shared/desktop/desktopContract';
import { IPC } from '../electron/ipcChannels';
import {
  createIpcHandlers,
  type DialogPort,
  type IpcHandler,
  type ShellDeps,
  type ShellState,
} from '../electron/ipcHandlers';
import { readProjectFile, writeProjectFile } from '../electron/projectFiles';
import { RecentFiles } from '../electron/recentFiles';
import { IpcArgumentError, IpcSenderError, ProtectedFileError } from '../electron/shellErrors';
import { SourceGuard } from '../electron/sourceGuard';
import type { PlotrateProject } from '../shared/project/projectFormat';
import { exampleProject, exampleProjectV1, projectFileText } from './project.exampleProject';

const APP = { senderFrame: { url: 'app://plotrate/index.html', parent: null } };
const CSV = 'site,block,rate,yield\nHollow Creek,1,0,8.1\nHollow Creek,1,80,10.9\n';

let dir: string;
let handlers: Record<string, IpcHandler>;
let state: ShellState;
let openAnswers: string[][];
let saveAnswers: (string | null)[];
let logged: ErrorReport[];
let noted: (PlotrateProject | null)[];
let dialogCalls: number;

beforeEach(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'plotrate-ipc-'));
  openAnswers = [];
  saveAnswers = [];
  logged = [];
  noted = [];
  dialogCalls = 0;
  const dialogs: DialogPort = {
    async openFiles() {
      dialogCalls++;
      return openAnswers.shift() ?? [];
    },
    async saveFile() {
      dialogCalls++;
      const a = saveAnswers.shift();
      return a === undefined ? null : a;
    },
  };
  const recent = new RecentFiles(path.join(dir, 'recent-files.json'));
  await recent.load();
  const deps: ShellDeps = {
    dialogs,
    printing: {
      print: async () => true,
      printToPdf: async () => new TextEncoder().encode('%PDF-1.7\n%grower page\n'),
    },
    clock: () => new Date('2026-04-01T07:00:00.000Z'),
    recent,
    sources: new SourceGuard(),
    autosave: {
      note: (p) => void noted.push(p),
      pendingRecovery: () => null,
      discardRecovery: async () => undefined,
    },
    writeFile: writeFileAtomic,
    writeProject: writeProjectFile,
    log: (report) => void logged.push(report),
    documentsFolder: dir,
    onProjectPathChanged: () => undefined,
  };
  state = { projectPath: null };
  handlers = createIpcHandlers(deps, state);
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

const call = (channel: string, ...args: unknown[]) => handlers[channel](APP, ...args);

describe('IPC handlers refuse foreign senders', () => {
  const foreign = [
    { title: 'another web site', frame: { url: 'https://example.org/', parent: null } },
    { title: 'a look-alike host', frame: { url: 'app://plotrate.evil/index.html', parent: null } },
    { title: 'a user name trick', frame: { url: 'app://plotrate@evil/index.html', parent: null } },
    { title: 'a local file page', frame: { url: 'file:///tmp/index.html', parent: null } },
    {
      title: 'a frame inside the app page',
      frame: { url: 'app://plotrate/index.html', parent: {} },
    },
    { title: 'a frame that has gone', frame: null },
  ];
  for (const f of foreign) {
    it(`such as ${f.title}, on every channel, before doing anything`, async () => {
      for (const channel of Object.values(IPC)) {
        await expect(handlers[channel]({ senderFrame: f.frame }), channel).rejects.toBeInstanceOf(
          IpcSenderError,
        );
      }
      expect(dialogCalls).toBe(0);
    });
  }

  it('covers every channel the preload uses', () => {
    expect(Object.keys(handlers).sort()).toEqual(Object.values(IPC).sort());
  });
});

describe('IPC handlers reject malformed arguments with the call and argument named', () => {
  const cases: { channel: string; args: unknown[]; message: RegExp }[] = [
    { channel: IPC.openTrialFiles, args: ['/etc/passwd'], message: /should have 0 value/ },
    { channel: IPC.openRecent, args: ['../../etc'], message: /argument id should be an id/ },
    {
      channel: IPC.saveProject,
      args: [{ format: 'x' }, { saveAs: false }],
      message: /argument project is not a valid project/,
    },
    {
      channel: IPC.saveProject,
      args: [exampleProject(), { saveAs: 'yes' }],
      message: /argument options should be \{ saveAs/,
    },
    {
      channel: IPC.saveProject,
      args: [null, { saveAs: true }],
      message: /should be a project object/,
    },
    {
      channel: IPC.exportFile,
      args: ['../../x.csv', new Uint8Array(1), 'csv'],
      message: /suggestedName should be a bare file name/,
    },
    { channel: IPC.exportFile, args: ['a.csv', 'text', 'csv'], message: /bytes should be bytes/ },
    {
      channel: IPC.exportFile,
      args: ['a.exe', new Uint8Array(1), 'exe'],
      message: /kind should be one of xlsx, csv/,
    },
    {
      channel: IPC.exportFile,
      args: ['bad\u0007name.csv', new Uint8Array(1), 'csv'],
      message: /bare file name/,
    },
    { channel: IPC.saveGrowerPdf, args: [42], message: /suggestedName should be text/ },
    {
      channel: IPC.noteUnsavedChanges,
      args: [{ ...exampleProject(), bootstrap: { resamples: -1, seed: 1, confidenceLevel: 0.9 } }],
      message: /bootstrap\.resamples/,
    },
    { channel: IPC.reportError, args: ['boom'], message: /report should be \{ message/ },
    {
      channel: IPC.filesDropped,
      args: [['relative/path.csv']],
      message: /paths\[0\] should be an absolute path/,
    },
    { channel: IPC.filesDropped, args: ['/a.csv'], message: /list of at most 50 paths/ },
  ];
  for (const c of cases) {
    it(`${c.channel} with ${JSON.stringify(c.args).slice(0, 60)}`, async () => {
      const err = await call(c.channel, ...c.args).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(IpcArgumentError);
      expect((err as Error).message.startsWith(`${c.channel}: argument`)).toBe(true);
      expect((err as Error).message).toMatch(c.message);
      expect(dialogCalls).toBe(0);
    });
  }
});

describe('opening files', () => {
  it('reads the chosen trial sheets and never changes them', async () => {
    const sheet = path.join(dir, 'Hollow Creek 2025.csv');
    await writeFile(sheet, CSV);
    const before = await stat(sheet);
    openAnswers.push([sheet]);
    const files = (await call(IPC.openTrialFiles)) as { name: string; bytes: Uint8Array }[];
    expect(files.map((f) => f.name)).toEqual(['Hollow Creek 2025.csv']);
    expect(new TextDecoder().decode(files[0].bytes)).toBe(CSV);
    expect((await stat(sheet)).mtimeMs).toBe(before.mtimeMs);
  });

  it('opens a version 1 project migrated and reports the old version', async () => {
    const file = path.join(dir, 'first season.plotrate');
    await writeFile(file, projectFileText(exampleProjectV1()));
    openAnswers.push([file]);
    const opened = (await call(IPC.openProject)) as OpenedProject;
    expect(opened.migratedFrom).toBe(1);
    expect(opened.project.prices.nutrientPerKg).toBe(1.15);
    expect(state.projectPath).toBe(file);
  });

  it('resolves null when the open dialog is cancelled', async () => {
    expect(await call(IPC.openProject)).toBeNull();
  });

  it('rejects a future-version project with its message and leaves the file alone', async () => {
    const file = path.join(dir, 'newer.plotrate');
    const text = JSON.stringify({ ...exampleProject(), version: 99 });
    await writeFile(file, text);
    openAnswers.push([file]);
    await expect(call(IPC.openProject)).rejects.toThrow(/newer Plotrate \(file version 99/);
    expect(await readFile(file, 'utf8')).toBe(text);
    expect(state.projectPath).toBeNull();
  });

  it('opens dropped files, lists the ones it cannot open with a reason, and remembers them as recent', async () => {
    const sheet = path.join(dir, 'marl-ridge-n.csv');
    await writeFile(sheet, CSV);
    const project = path.join(dir, 'Marl Ridge.plotrate');
    await writeProjectFile(project, exampleProject(), new Date('2026-03-01T00:00:00Z'));
    const opened = (await call(IPC.filesDropped, [
      sheet,
      path.join(dir, 'photo.jpg'),
      project,
      path.join(dir, 'gone.csv'),
    ])) as FilesOpened;
    expect(opened.trialFiles.map((f) => f.name)).toEqual(['marl-ridge-n.csv']);
    expect(opened.project?.name).toBe('Marl Ridge.plotrate');
    expect(opened.failures.map((f) => f.name)).toEqual(['photo.jpg', 'gone.csv']);
    expect(opened.failures[0].message).toMatch(/not a file Plotrate opens/);
    expect(opened.failures[1].message).toMatch(/gone\.csv: does not exist/);
    const recent = (await call(IPC.recentFiles)) as { id: string; name: string; kind: string }[];
    expect(recent.map((r) => r.name)).toEqual(['Marl Ridge.plotrate', 'marl-ridge-n.csv']);
    const again = (await call(IPC.openRecent, recent[1].id)) as FilesOpened;
    expect(again.trialFiles[0].name).toBe('marl-ridge-n.csv');
  });
});

describe('saving and exporting', () => {
  it('asks where on the first save, adds the extension, then saves in place without asking', async () => {
    saveAnswers.push(path.join(dir, 'North block'));
    const first = (await call(IPC.saveProject, exampleProject(), {
      saveAs: false,
    })) as SavedProject;
    expect(first).toEqual({ name: 'North block.plotrate', savedAt: '2026-04-01T07:00:00.000Z' });
    expect(dialogCalls).toBe(1);
    const changed = { ...exampleProject(), notes: 'second thoughts' };
    await call(IPC.saveProject, changed, { saveAs: false });
    expect(dialogCalls).toBe(1);
    const { project } = await readProjectFile(path.join(dir, 'North block.plotrate'));
    expect(project.notes).toBe('second thoughts');
    expect(noted).toEqual([null, null]);
  });

  it('resolves null and writes nothing when the save dialog is cancelled', async () => {
    expect(await call(IPC.saveProject, exampleProject(), { saveAs: true })).toBeNull();
    expect(noted).toEqual([]);
  });

  it('refuses to export over a spreadsheet the user imported from', async () => {
    const sheet = path.join(dir, 'Hollow Creek 2025.csv');
    await writeFile(sheet, CSV);
    openAnswers.push([sheet]);
    await call(IPC.openTrialFiles);
    saveAnswers.push(sheet);
    const err = await call(
      IPC.exportFile,
      'Hollow Creek 2025.csv',
      new TextEncoder().encode('x'),
      'csv',
    ).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ProtectedFileError);
    expect((err as Error).message).toMatch(/never writes to its sources/);
    expect(await readFile(sheet, 'utf8')).toBe(CSV);
  });

  it('refuses the same source reached through a symbolic link to its folder', async () => {
    const real = path.join(dir, 'real');
    await mkdir(real);
    const sheet = path.join(real, 'trial.csv');
    await writeFile(sheet, CSV);
    const link = path.join(dir, 'link');
    await import('node:fs/promises').then((fs) => fs.symlink(real, link));
    openAnswers.push([sheet]);
    await call(IPC.openTrialFiles);
    saveAnswers.push(path.join(link, 'trial.csv'));
    await expect(
      call(IPC.exportFile, 'trial.csv', new Uint8Array([1]), 'csv'),
    ).rejects.toBeInstanceOf(ProtectedFileError);
    expect(await readFile(sheet, 'utf8')).toBe(CSV);
  });

  it('exports bytes to the chosen file with the kind’s extension', async () => {
    saveAnswers.push(path.join(dir, 'results'));
    const bytes = new Uint8Array([0x50, 0x4b, 0x03, 0x04]);
    expect(await call(IPC.exportFile, 'results.xlsx', bytes, 'xlsx')).toEqual({
      name: 'results.xlsx',
    });
    expect(new Uint8Array(await readFile(path.join(dir, 'results.xlsx')))).toEqual(bytes);
  });

  it('saves the grower page as a PDF the printer produced', async () => {
    saveAnswers.push(path.join(dir, 'grower page.pdf'));
    expect(await call(IPC.saveGrowerPdf, 'grower page.pdf')).toEqual({ name: 'grower page.pdf' });
    expect((await readFile(path.join(dir, 'grower page.pdf'), 'utf8')).startsWith('%PDF-')).toBe(
      true,
    );
  });
});

describe('error reports', () => {
  it('are logged with what the page said and where', async () => {
    await call(IPC.reportError, { message: 'fit failed', where: 'fit screen', stack: 'at fit' });
    expect(logged).toEqual([{ message: 'fit failed', where: 'fit screen', stack: 'at fit' }]);
  });
});
