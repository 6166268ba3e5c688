// Autosave and crash recovery with real files in a temporary data folder. The
// clock of the interval is vitest's fake timers; every write is real.
import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import {
  AUTOSAVE_INTERVAL_MS,
  Autosaver,
  beginSession,
  discardAutosave,
  discardRecovered,
  endSessionCleanly,
  writeAutosave,
} from '../electron/autosave';
import { appendErrorLog, entryFromUnknown, uncaughtFromConsole } from '../electron/errorLog';
import { writeProjectFile } from '../electron/projectFiles';
import { exampleProject } from './project.exampleProject';

let dataDir: string;
beforeEach(async () => {
  dataDir = await mkdtemp(path.join(os.tmpdir(), 'plotrate-data-'));
});
afterEach(async () => {
  vi.useRealTimers();
  await rm(dataDir, { recursive: true, force: true });
});

function autosaverFor(projectPath: string | null, errors: unknown[] = []) {
  return new Autosaver(
    (p) => writeAutosave(dataDir, p, projectPath, new Date('2026-04-02T10:00:00.000Z')),
    () => discardAutosave(dataDir),
    (e) => void errors.push(e),
  );
}

describe('crash recovery', () => {
  it('returns the unsaved work after a session that did not shut down cleanly', async () => {
    vi.useFakeTimers();
    const first = await beginSession(dataDir, new Date('2026-04-02T09:00:00.000Z'));
    expect(first).toEqual({ uncleanExit: false, recovered: null, unreadable: null });
    const projectFile = path.join(dataDir, 'Hollow Creek.plotrate');
    await writeProjectFile(projectFile, exampleProject(), new Date('2026-04-02T09:05:00.000Z'));
    const savedText = await readFile(projectFile, 'utf8');

    const saver = autosaverFor(projectFile);
    const unsaved = { ...exampleProject(), notes: 'excluded the flooded corner, not yet saved' };
    saver.note(unsaved);
    expect(await readdir(dataDir)).not.toContain('autosave.json');
    await vi.advanceTimersByTimeAsync(AUTOSAVE_INTERVAL_MS);
    await saver.flush();
    expect(await readdir(dataDir)).toContain('autosave.json');
    // The app dies here: no endSessionCleanly.

    const next = await beginSession(dataDir, new Date('2026-04-02T11:00:00.000Z'));
    expect(next.uncleanExit).toBe(true);
    expect(next.recovered).toEqual({
      project: unsaved,
      autosavedAt: '2026-04-02T10:00:00.000Z',
      name: 'Hollow Creek.plotrate',
      projectPath: projectFile,
    });
    // Autosave never touches the user's own file.
    expect(await readFile(projectFile, 'utf8')).toBe(savedText);
    saver.dispose();
  });

  it('keeps offering a crashed session’s work until the user answers, even across clean shutdowns', async () => {
    await beginSession(dataDir, new Date());
    const lost = { ...exampleProject(), notes: 'work from before the crash' };
    await writeAutosave(dataDir, lost, null, new Date('2026-04-02T10:00:00.000Z'));
    // Crash. The next session autosaves its own work and then shuts down cleanly without an answer.
    expect((await beginSession(dataDir, new Date())).recovered?.project).toEqual(lost);
    await writeAutosave(dataDir, { ...exampleProject(), notes: 'new session' }, null, new Date());
    await endSessionCleanly(dataDir);
    const third = await beginSession(dataDir, new Date());
    expect(third.uncleanExit).toBe(false);
    expect(third.recovered?.project).toEqual(lost);
    // Declined (or taken over): gone for good.
    await discardRecovered(dataDir);
    await endSessionCleanly(dataDir);
    expect((await beginSession(dataDir, new Date())).recovered).toBeNull();
  });

  it('offers nothing after a clean shutdown', async () => {
    await beginSession(dataDir, new Date());
    await writeAutosave(dataDir, exampleProject(), null, new Date());
    await endSessionCleanly(dataDir);
    expect(await beginSession(dataDir, new Date())).toEqual({
      uncleanExit: false,
      recovered: null,
      unreadable: null,
    });
  });

  it('says why when the autosave copy is damaged, instead of failing to start', async () => {
    await beginSession(dataDir, new Date());
    await writeFile(
      path.join(dataDir, 'autosave.json'),
      '{"format":"plotrate-autosave","projectText":"{',
    );
    const next = await beginSession(dataDir, new Date());
    expect(next.uncleanExit).toBe(true);
    expect(next.recovered).toBeNull();
    expect(next.unreadable).toMatch(/not readable JSON/);
  });
});

describe('Autosaver', () => {
  it('writes once per interval only while there are unwritten changes, and drops the copy when clean', async () => {
    vi.useFakeTimers();
    const saver = autosaverFor(null);
    const file = path.join(dataDir, 'autosave.json');
    saver.note({ ...exampleProject(), notes: 'one' });
    await vi.advanceTimersByTimeAsync(AUTOSAVE_INTERVAL_MS);
    await saver.flush();
    const firstText = await readFile(file, 'utf8');
    expect(JSON.parse(firstText).projectText).toContain('"notes": "one"');
    // Nothing new: the next tick leaves the copy alone.
    await rm(file);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_INTERVAL_MS);
    await saver.flush();
    expect(await readdir(dataDir)).not.toContain('autosave.json');
    saver.note({ ...exampleProject(), notes: 'two' });
    await vi.advanceTimersByTimeAsync(AUTOSAVE_INTERVAL_MS);
    await saver.flush();
    expect(JSON.parse(await readFile(file, 'utf8')).projectText).toContain('"notes": "two"');
    expect(saver.dirty).toBe(true);
    saver.note(null);
    await saver.flush();
    expect(saver.dirty).toBe(false);
    expect(await readdir(dataDir)).not.toContain('autosave.json');
    saver.dispose();
  });

  it('reports a failed write and tries again on the next interval', async () => {
    vi.useFakeTimers();
    const errors: unknown[] = [];
    let failNext = true;
    const saver = new Autosaver(
      async (p) => {
        if (failNext) {
          failNext = false;
          throw new Error('disk full');
        }
        await writeAutosave(dataDir, p, null, new Date());
      },
      () => discardAutosave(dataDir),
      (e) => void errors.push(e),
    );
    saver.note(exampleProject());
    await vi.advanceTimersByTimeAsync(AUTOSAVE_INTERVAL_MS);
    await saver.flush();
    expect(errors.map((e) => (e as Error).message)).toEqual(['disk full']);
    await vi.advanceTimersByTimeAsync(AUTOSAVE_INTERVAL_MS);
    await saver.flush();
    expect(await readdir(dataDir)).toContain('autosave.json');
    saver.dispose();
  });
});

describe('appendErrorLog', () => {
  it('appends one JSON line per error in the data folder', async () => {
    await appendErrorLog(
      dataDir,
      entryFromUnknown('main', new TypeError('x is undefined')),
      new Date('2026-04-02T10:00:00Z'),
    );
    await appendErrorLog(
      dataDir,
      entryFromUnknown('renderer', 'plain text thrown'),
      new Date('2026-04-02T10:01:00Z'),
    );
    const lines = (await readFile(path.join(dataDir, 'errors.log'), 'utf8'))
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l));
    expect(lines.map((l) => [l.at, l.where, l.message])).toEqual([
      ['2026-04-02T10:00:00.000Z', 'main', 'x is undefined'],
      ['2026-04-02T10:01:00.000Z', 'renderer', 'plain text thrown'],
    ]);
    expect(lines[0].stack).toMatch(/TypeError: x is undefined/);
  });

  it('does not throw when the folder cannot be written', async () => {
    await expect(
      appendErrorLog(
        path.join(dataDir, 'missing', 'deeper'),
        { where: 'main', message: 'm' },
        new Date(),
      ),
    ).resolves.toMatch(/errors\.log$/);
  });
});

describe('uncaughtFromConsole', () => {
  it('recognizes Chromium’s uncaught-error lines and nothing else', () => {
    expect(
      uncaughtFromConsole(
        'error',
        'Uncaught TypeError: x is undefined',
        'app://plotrate/assets/index.js',
        12,
      ),
    ).toEqual({
      where: 'page app://plotrate/assets/index.js:12',
      message: 'TypeError: x is undefined',
    });
    expect(
      uncaughtFromConsole(
        'error',
        'Uncaught (in promise) Error: worker gone',
        'app://plotrate/w.js',
        1,
      )?.message,
    ).toBe('Error: worker gone');
    expect(
      uncaughtFromConsole('error', 'Failed to load resource', 'app://plotrate/x', 0),
    ).toBeNull();
    expect(uncaughtFromConsole('warning', 'Uncaught but only a warning', 'x', 0)).toBeNull();
  });
});
