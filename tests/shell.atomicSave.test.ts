import { spawn } from 'node:child_process';
import { watch } from 'node:fs';
import { mkdtemp, readFile, readdir, rm, utimes, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  STALE_TEMPORARY_MS,
  removeStaleTemporaries,
  writeFileAtomic,
} from '../electron/atomicWrite';
import { readProjectFile, writeProjectFile } from '../electron/projectFiles';
import { syntheticCsv } from '../shared/demo';
import { exampleProject } from './project.exampleProject';

const here = path.dirname(fileURLToPath(import.meta.url));
const child = path.join(here, 'shell.atomicSaveChild.ts');
let dir: string;

beforeAll(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'plotrate-atomic-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** The atomic saver's temporary files in the folder. */
async function temporaries(): Promise<string[]> {
  return (await readdir(dir)).filter((n) => n.endsWith('.tmp'));
}

/**
 * Run the child and SIGKILL it: with `afterTempMs` null as soon as it says it
 * starts, else that many ms after its temporary file appears (mid-write).
 */
function saveAndKill(target: string, afterTempMs: number | null): Promise<'killed' | 'finished'> {
  return new Promise((resolve, reject) => {
    const proc = spawn(
      process.execPath,
      ['--import', 'tsx', child, target, '300', `run ${afterTempMs}`],
      {
        stdio: ['ignore', 'pipe', 'inherit'],
      },
    );
    let out = '';
    let armed = false;
    const arm = async () => {
      if (afterTempMs === null) return void proc.kill('SIGKILL');
      while (!out.includes('done') && (await temporaries()).length === 0)
        await new Promise((r) => setTimeout(r, 1));
      setTimeout(() => proc.kill('SIGKILL'), afterTempMs);
    };
    proc.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('writing') && !armed) {
        armed = true;
        void arm();
      }
    });
    proc.on('error', reject);
    proc.on('exit', () => resolve(out.includes('done') ? 'finished' : 'killed'));
  });
}

describe('writeFileAtomic under a hard kill', () => {
  it('leaves the previous project intact and readable whenever the save is killed', async () => {
    const target = path.join(dir, 'Hollow Creek.plotrate');
    const previous = { ...exampleProject(), notes: 'the previous save' };
    await writeProjectFile(target, previous, new Date('2026-03-04T12:00:00.000Z'));
    const outcomes: string[] = [];
    for (const delayMs of [null, 0, 5, 15, 30, 60, 400]) {
      const ended = await saveAndKill(target, delayMs);
      const leftOver = await temporaries();
      for (const name of leftOver) await rm(path.join(dir, name));
      const { project } = await readProjectFile(target);
      // Either the old file or the complete new one: never a mix, never unreadable.
      if (project.notes === 'the previous save') {
        expect(project).toEqual({ ...previous, savedAt: '2026-03-04T12:00:00.000Z' });
        outcomes.push(
          `${delayMs} ms: ${ended}, previous kept${leftOver.length ? ', partial temporary left' : ''}`,
        );
      } else {
        expect(project.notes).toBe(`run ${delayMs}`);
        expect(project.table!.plots).toHaveLength(2 * 300 * 24);
        outcomes.push(`${delayMs} ms: ${ended}, new file complete`);
        // Put the previous version back so the next run again has something to lose.
        await writeProjectFile(target, previous, new Date('2026-03-04T12:00:00.000Z'));
      }
    }
    // At least one kill must have landed before the rename, or the test proved nothing.
    expect(
      outcomes.some((o) => o.includes('killed, previous kept')),
      outcomes.join('\n'),
    ).toBe(true);
  }, 120_000);

  it('removes its temporary file and keeps the target when the write itself fails', async () => {
    const target = path.join(dir, 'missing folder', 'x.plotrate');
    await expect(writeFileAtomic(target, 'x')).rejects.toMatchObject({ code: 'ENOENT' });
    const existing = path.join(dir, 'kept.json');
    await writeFileAtomic(existing, 'first');
    // Writing "through" a path whose parent is a file fails after nothing was replaced.
    await expect(writeFileAtomic(path.join(existing, 'child'), 'second')).rejects.toBeTruthy();
    const names = await readdir(dir);
    expect(names.filter((n) => n.startsWith('.kept.json') && n.endsWith('.tmp'))).toEqual([]);
    await writeFileAtomic(existing, 'second');
    expect(await import('node:fs/promises').then((fs) => fs.readFile(existing, 'utf8'))).toBe(
      'second',
    );
  });

  it('clears what an interrupted write left behind once it is stale, and nothing else', async () => {
    const target = path.join(dir, 'Marl Ridge.plotrate');
    await writeFileAtomic(target, 'v1');
    const old = path.join(dir, '.Marl Ridge.plotrate.4242-0a1b2c3d.tmp');
    const fresh = path.join(dir, '.Marl Ridge.plotrate.4243-0a1b2c3e.tmp');
    const otherTarget = path.join(dir, '.Other.plotrate.4242-0a1b2c3d.tmp');
    const userFile = path.join(dir, '.Marl Ridge.plotrate.notes.tmp');
    for (const f of [old, fresh, otherTarget, userFile]) await writeFile(f, 'partial');
    const longAgo = (Date.now() - STALE_TEMPORARY_MS - 60_000) / 1000;
    for (const f of [old, otherTarget, userFile]) await utimes(f, longAgo, longAgo);
    await writeFileAtomic(target, 'v2');
    const names = await readdir(dir);
    expect(names).not.toContain(path.basename(old));
    expect(names).toEqual(
      expect.arrayContaining([
        path.basename(fresh),
        path.basename(otherTarget),
        path.basename(userFile),
      ]),
    );
    expect(await removeStaleTemporaries(target)).toEqual([]);
  });
});

describe('one atomic writer for the shell and the command line', () => {
  it('imports nothing but Node itself, so the command line can use it outside Electron', async () => {
    const source = await readFile(path.join(here, '..', 'electron', 'atomicWrite.ts'), 'utf8');
    const imports = [...source.matchAll(/^import .* from '([^']+)';$/gm)].map((m) => m[1]);
    expect(imports.length).toBeGreaterThan(0);
    expect(imports.filter((m) => !m.startsWith('node:'))).toEqual([]);
    // And the command line writes through it, not through a writer of its own.
    for (const file of ['analyzeCommand.ts', 'demoCommand.ts']) {
      const cli = await readFile(path.join(here, '..', 'cli', file), 'utf8');
      expect(cli, file).toMatch(
        /import \{ (writeFileAtomic|writeFilesAtomic, type PendingOutput) \} from '\.\.\/electron\/atomicWrite';/,
      );
      expect(cli, file).not.toMatch(/\b(writeFileSync|renameSync|createWriteStream)\b/);
    }
  });
});

describe('plotrate analyze under a hard kill', () => {
  const cli = path.join(here, '..', 'cli', 'plotrate.mjs');
  const sites = 150;
  const previous = '{ "previous": "the results of an earlier run" }\n';

  /**
   * Run `plotrate analyze --json` over an existing results file and SIGKILL it:
   * with `afterTempMs` null as soon as it says it is writing, else that many ms
   * after the writer's temporary file appears (seen through fs.watch).
   */
  function analyzeAndKill(
    folder: string,
    afterTempMs: number | null,
  ): Promise<{ ended: 'killed' | 'finished'; sawTemporary: boolean }> {
    return new Promise((resolve, reject) => {
      let sawTemporary = false;
      let armed = false;
      const proc = spawn(
        process.execPath,
        [cli, 'analyze', 'trial.csv', '--json', 'results.json', '--boot', '0'],
        { cwd: folder, stdio: ['ignore', 'ignore', 'pipe'] },
      );
      const watcher = watch(folder, (_event, name) => {
        if (!armed || sawTemporary || !name?.startsWith('.results.json.')) return;
        sawTemporary = true;
        if (afterTempMs === 0) proc.kill('SIGKILL');
        else if (afterTempMs !== null) setTimeout(() => proc.kill('SIGKILL'), afterTempMs);
      });
      let err = '';
      proc.stderr.on('data', (d: Buffer) => {
        err += d.toString();
        if (!armed && err.includes('writing results.json')) {
          armed = true;
          if (afterTempMs === null) proc.kill('SIGKILL');
        }
      });
      proc.on('error', reject);
      proc.on('exit', (code) => {
        watcher.close();
        resolve({ ended: code === 0 ? 'finished' : 'killed', sawTemporary });
      });
    });
  }

  it('leaves the earlier results intact or the new ones complete, never a mix', async () => {
    const folder = await mkdtemp(path.join(os.tmpdir(), 'plotrate-atomic-cli-'));
    try {
      // Invented trial from the seeded generator; about 0.6 MB of results JSON.
      await writeFile(path.join(folder, 'trial.csv'), syntheticCsv({ sites, seed: 11 }));
      const target = path.join(folder, 'results.json');
      const outcomes: string[] = [];
      for (const delayMs of [null, 0, 0, 1, 3, 10, 10_000]) {
        await writeFile(target, previous);
        const { ended, sawTemporary } = await analyzeAndKill(folder, delayMs);
        const leftOver = (await readdir(folder)).filter((n) => n.endsWith('.tmp'));
        for (const name of leftOver) await rm(path.join(folder, name));
        const text = await readFile(target, 'utf8');
        if (text === previous) {
          outcomes.push(
            `${delayMs} ms: ${ended}, previous kept${leftOver.length ? ', partial temporary left' : ''}`,
          );
        } else {
          // Not the old file, so it must be the whole new one.
          expect(JSON.parse(text).sites).toHaveLength(sites);
          outcomes.push(`${delayMs} ms: ${ended}, new file complete`);
        }
        if (delayMs === 10_000) expect(ended).toBe('finished');
        if (delayMs !== null && delayMs !== 10_000) expect(sawTemporary).toBe(true);
      }
      // A kill must have landed while the temporary file was being written or
      // synced, or the test proved nothing about a half-written output.
      expect(
        outcomes.some((o) => o.includes('killed, previous kept, partial temporary left')),
        outcomes.join('\n'),
      ).toBe(true);
    } finally {
      await rm(folder, { recursive: true, force: true });
    }
  }, 180_000);
});
