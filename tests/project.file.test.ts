import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { readProjectFile, writeProjectFile } from '../electron/projectFiles';
import { parseProject } from '../shared/project/parseProject';
import { ProjectFileError } from '../shared/project/projectFileError';
import { PROJECT_FORMAT_VERSION } from '../shared/project/projectFormat';
import { serializeProject } from '../shared/project/serializeProject';
import { exampleProject, exampleProjectV1, projectFileText } from './project.exampleProject';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'plotrate-project-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('writeProjectFile and readProjectFile', () => {
  it('reopen a saved project identically, original cell text and exclusions included', async () => {
    const project = exampleProject();
    const file = path.join(dir, 'North block.plotrate');
    const savedAt = await writeProjectFile(file, project, new Date('2026-03-01T08:00:00.000Z'));
    expect(savedAt).toBe('2026-03-01T08:00:00.000Z');
    const { project: reopened, migratedFrom } = await readProjectFile(file);
    expect(migratedFrom).toBeNull();
    expect(reopened).toEqual({ ...project, savedAt });
    expect(reopened.table!.plots[5].original.yield!.text).toBe(
      project.table!.plots[5].original.yield!.text,
    );
    expect(reopened.table!.plots.filter((p) => p.excluded !== null)).toHaveLength(3);
  });

  it('write the same bytes when a reopened project is saved again at the same moment', async () => {
    const at = new Date('2026-03-01T08:00:00.000Z');
    const a = path.join(dir, 'a.plotrate');
    const b = path.join(dir, 'b.plotrate');
    await writeProjectFile(a, exampleProject(), at);
    await writeProjectFile(b, (await readProjectFile(a)).project, at);
    expect(await readFile(b, 'utf8')).toBe(await readFile(a, 'utf8'));
  });

  it('start the file with its format name and version so a reader can tell what it is', () => {
    const text = serializeProject(exampleProject(), new Date('2026-03-01T08:00:00.000Z'));
    expect(text.startsWith('{\n  "format": "plotrate-project",\n  "version": 2,')).toBe(true);
    expect(text.endsWith('}\n')).toBe(true);
  });

  it('spell out the reference of each original cell for a person reading the file', () => {
    const project = exampleProject();
    const plot = project.table!.plots[0];
    const json = JSON.parse(serializeProject(project, new Date('2026-03-01T08:00:00.000Z')));
    const y = plot.original.yield!;
    expect(json.table.plots[0].original.yield).toEqual({
      text: y.text,
      ref: { file: y.file, sheet: y.sheet, cell: `D${y.row}`, row: y.row },
    });
  });
});

describe('a rate × factor table', () => {
  it('keeps its treatment-factor columns (factorKeys) through save and open', () => {
    const project = exampleProject();
    project.table!.factorKeys = ['Timing'];
    const text = serializeProject(project, new Date('2026-03-01T08:00:00.000Z'));
    expect(parseProject(text, 'timing.plotrate').project.table!.factorKeys).toEqual(['Timing']);
    // An older project has none, and reads as a rate-only table.
    const plain = serializeProject(exampleProject(), new Date('2026-03-01T08:00:00.000Z'));
    expect(parseProject(plain, 'plain.plotrate').project.table!.factorKeys).toBeUndefined();
  });
});

describe('a table with a corrected value', () => {
  it('keeps the correction, the value read and the cell text through save and open', () => {
    const project = exampleProject();
    const plot = project.table!.plots[2];
    plot.corrections = [
      { role: 'yield', fromKgHa: plot.yieldKgHa, toKgHa: 9876, reason: 'decimal slipped' },
    ];
    plot.yieldKgHa = 9876;
    const text = serializeProject(project, new Date('2026-03-01T08:00:00.000Z'));
    const reopened = parseProject(text, 'corrected.plotrate').project.table!.plots[2];
    expect(reopened.corrections).toEqual(plot.corrections);
    expect(reopened.original.yield!.text).toBe(plot.original.yield!.text);
    // A correction without a reason is damage, named by its field.
    const broken = text.replace('"reason": "decimal slipped"', '"why": "decimal slipped"');
    expect(() => parseProject(broken, 'broken.plotrate')).toThrow(/reason/);
  });
});

describe('migration from version 1', () => {
  it('renames the prices, moves exclusions onto plots, keeps unmatched reasons and leaves the old file untouched', async () => {
    const file = path.join(dir, 'first season.plotrate');
    const v1Text = projectFileText(exampleProjectV1(), 2);
    await writeFile(file, v1Text);
    const { project, migratedFrom } = await readProjectFile(file);
    expect(migratedFrom).toBe(1);
    expect(project.version).toBe(PROJECT_FORMAT_VERSION);
    expect(project.prices).toEqual({ currency: 'EUR', nutrientPerKg: 1.15, grainPerKg: 0.19 });
    expect(project.bootstrap).toEqual({ resamples: 500, seed: 7, confidenceLevel: 0.9 });
    const expected = exampleProject().table!.plots;
    const byUser = project.table!.plots.filter((p) => p.excluded?.by === 'user');
    expect(byUser.map((p) => p.id)).toEqual(
      expected.filter((p) => p.excluded?.by === 'user').map((p) => p.id),
    );
    expect(byUser[0].excluded).toEqual({ reason: 'sprayer skip', by: 'user' });
    const sheet = project.table!.plots.find((p) => p.excluded?.by === 'sheet')!;
    expect(sheet.excluded!.reason).toBe('flooded after planting');
    expect(project.notes).toContain('First season.');
    expect(project.notes).toContain('old-sheet.xlsx|Plots|99: deer damage');
    expect(project.view).toEqual({});
    expect(await readFile(file, 'utf8')).toBe(v1Text);
  });

  it('produces a project that saves and reopens as version 2 without further migration', async () => {
    const file = path.join(dir, 'old.plotrate');
    await writeFile(file, projectFileText(exampleProjectV1()));
    const migrated = (await readProjectFile(file)).project;
    const saved = path.join(dir, 'old-v2.plotrate');
    await writeProjectFile(saved, migrated, new Date('2026-03-02T10:00:00.000Z'));
    const again = await readProjectFile(saved);
    expect(again.migratedFrom).toBeNull();
    expect(again.project).toEqual({ ...migrated, savedAt: '2026-03-02T10:00:00.000Z' });
  });
});

/** The valid example as JSON, with one change applied. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any -- the cases edit arbitrary JSON on purpose
function edited(change: (json: Record<string, any>) => void): string {
  const json = JSON.parse(serializeProject(exampleProject(), new Date('2026-03-01T08:00:00.000Z')));
  change(json);
  return JSON.stringify(json);
}

describe('parseProject refuses bad files with the problem and the field', () => {
  const cases: {
    title: string;
    text: () => string;
    problem: string;
    field: string;
    message: RegExp;
  }[] = [
    {
      title: 'a file cut short',
      text: () => serializeProject(exampleProject(), new Date()).slice(0, 900),
      problem: 'not-json',
      field: '',
      message: /not readable JSON/,
    },
    {
      title: 'an empty file',
      text: () => '',
      problem: 'not-json',
      field: '',
      message: /the file is empty/,
    },
    {
      title: 'JSON of another program',
      text: () => JSON.stringify({ rows: [1, 2, 3] }),
      problem: 'not-a-project',
      field: '',
      message: /not a Plotrate project/,
    },
    {
      title: 'a file from a newer version',
      text: () => edited((j) => (j.version = PROJECT_FORMAT_VERSION + 1)),
      problem: 'future-version',
      field: 'version',
      message: new RegExp(
        `file version ${PROJECT_FORMAT_VERSION + 1}, this Plotrate reads up to ${PROJECT_FORMAT_VERSION}`,
      ),
    },
    {
      title: 'a version that is not a whole number',
      text: () => edited((j) => (j.version = '2')),
      problem: 'invalid',
      field: 'version',
      message: /whole number ≥ 1, found text "2"/,
    },
    {
      title: 'a rate stored as text',
      text: () => edited((j) => (j.table.plots[3].rateKgHa = '80 kg')),
      problem: 'invalid',
      field: 'table.plots[3].rateKgHa',
      message: /should be a number, found text "80 kg"/,
    },
    {
      title: 'a missing field',
      text: () => edited((j) => delete j.prices.grainPerKg),
      problem: 'invalid',
      field: 'prices.grainPerKg',
      message: /the field is missing/,
    },
    {
      title: 'a repeated plot id',
      text: () => edited((j) => (j.table.plots[4].id = j.table.plots[0].id)),
      problem: 'invalid',
      field: 'table.plots[4].id',
      message: /repeats the plot id/,
    },
    {
      title: 'an unknown exclusion source',
      text: () => edited((j) => (j.table.plots[5].excluded = { reason: 'x', by: 'robot' })),
      problem: 'invalid',
      field: 'table.plots[5].excluded.by',
      message: /one of "sheet", "user", "quality-check", found "robot"/,
    },
    {
      title: 'a preferred model that is not fitted',
      text: () => edited((j) => (j.models.preferred = 'exponential')),
      problem: 'invalid',
      field: 'models.preferred',
      message: /not among the fitted models/,
    },
    {
      title: 'an unknown model name',
      text: () => edited((j) => j.models.fitted.push('cubic')),
      problem: 'invalid',
      field: 'models.fitted[3]',
      message: /found "cubic"/,
    },
    {
      title: 'a source checksum that is not SHA-256',
      text: () => edited((j) => (j.sources[1].sha256 = 'abc')),
      problem: 'invalid',
      field: 'sources[1].sha256',
      message: /64 lower-case hexadecimal/,
    },
    {
      title: 'a negative price',
      text: () => edited((j) => (j.prices.nutrientPerKg = -1)),
      problem: 'invalid',
      field: 'prices.nutrientPerKg',
      message: /price from 0 to 1,000,000 per kg, found -1/,
    },
    {
      title: 'a price of 1e308 per kg',
      text: () => edited((j) => (j.prices.grainPerKg = 1e308)),
      problem: 'invalid',
      field: 'prices.grainPerKg',
      message: /price from 0 to/,
    },
    {
      title: 'a yield unit Plotrate does not know',
      text: () => edited((j) => (j.units.yield = 'bushels')),
      problem: 'invalid',
      field: 'units.yield',
      message: /should be one of .*found "bushels"/,
    },
    {
      title: 'a view nested 10,000 levels deep (no stack overflow)',
      text: () =>
        edited((j) => (j.view = { x: 1 })).replace(
          '"x":1',
          `"x": ${'{"a":'.repeat(10_000)}1${'}'.repeat(10_000)}`,
        ),
      problem: 'invalid',
      field: `view.x${'.a'.repeat(31)}`, // refused at the 32nd level below the view
      message: /nested more than 32 levels/,
    },
    {
      title: 'a million resamples',
      text: () => edited((j) => (j.bootstrap.resamples = 1e6)),
      problem: 'invalid',
      field: 'bootstrap.resamples',
      message: /from 0 to 100,000/,
    },
    {
      title: 'a confidence level given in percent',
      text: () => edited((j) => (j.bootstrap.confidenceLevel = 90)),
      problem: 'invalid',
      field: 'bootstrap.confidenceLevel',
      message: /strictly between 0 and 1/,
    },
    {
      title: 'an original cell under a role that does not exist',
      text: () => edited((j) => (j.table.plots[0].original.color = j.table.plots[0].original.rate)),
      problem: 'invalid',
      field: 'table.plots[0].original',
      message: /"color", which is not a column role/,
    },
    {
      title: 'an original cell whose address is no A1 address',
      text: () => edited((j) => (j.table.plots[0].original.rate.ref.cell = 'row 3')),
      problem: 'invalid',
      field: 'table.plots[0].original.rate.ref.cell',
      message: /should be an A1 address such as "E4", found "row 3"/,
    },
  ];
  for (const c of cases) {
    it(`for ${c.title}`, () => {
      let caught: unknown;
      try {
        parseProject(c.text(), 'Field 7.plotrate');
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(ProjectFileError);
      const e = caught as ProjectFileError;
      expect(e.problem).toBe(c.problem);
      expect(e.field).toBe(c.field);
      expect(e.where).toBe('Field 7.plotrate');
      expect(e.message).toMatch(c.message);
      expect(e.message.startsWith('Field 7.plotrate: ')).toBe(true);
    });
  }

  it('leaves a future-version file on disk byte for byte', async () => {
    const file = path.join(dir, 'from the future.plotrate');
    const text = edited((j) => (j.version = 9));
    await writeFile(file, text);
    await expect(readProjectFile(file)).rejects.toMatchObject({ problem: 'future-version' });
    expect(await readFile(file, 'utf8')).toBe(text);
  });

  it('refuses bytes that are not UTF-8 with a clear message', async () => {
    const file = path.join(dir, 'binary.plotrate');
    await writeFile(file, Buffer.from([0x50, 0x4b, 0x03, 0x04, 0xff, 0xfe, 0x00]));
    await expect(readProjectFile(file)).rejects.toThrow(/not UTF-8 text/);
  });

  it('accepts a leading byte-order mark, as some editors write one', () => {
    const text = `\uFEFF${serializeProject(exampleProject(), new Date('2026-03-01T08:00:00.000Z'))}`;
    expect(parseProject(text, 'bom.plotrate').project.notes).toBe(exampleProject().notes);
  });
});
