import { spawn } from 'node:child_process';
import { mkdtemp, readdir, rm, utimes, writeFile } from 'node:fs/promises';
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
