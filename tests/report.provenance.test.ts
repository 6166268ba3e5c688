// Provenance names only what the analysis read: the files that gave plots and their column
// mapping. A file opened in the workspace and closed again, or one that gave no plot rows, is
// behind no number of the report, so it is not listed (common practice for an audit trail: list
// the inputs a result depends on). The demo workbook is the project's invented trial.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { importFiles } from '../shared/import/importFiles';
import { demoPath } from './report.fixture';
import { reportOf } from './report.pipeline';

describe('report provenance', () => {
  it('lists the files that gave plots and their mapping, not a file closed or without plots', async () => {
    const name = path.basename(demoPath);
    const imported = await importFiles([{ name, bytes: new Uint8Array(readFileSync(demoPath)) }], {
      crop: 'corn',
      overrides: [],
    });
    const closed = { name: 'closed notes.csv', bytes: 120, sha256: 'a'.repeat(64) };
    const table = { ...imported.table, sources: [...imported.table.sources, closed] };
    const mapping = [
      ...imported.mapping,
      { file: closed.name, sheet: '', role: 'yield', header: 'Yield', unit: 't/ha', readAs: '' },
    ];
    const report = reportOf(
      table,
      {
        units: { rate: 'kg/ha', yield: 't/ha' },
        unitSystem: 'metric',
        currency: 'EUR',
        crop: 'corn',
        prices: { grainPrice: 180, nutrientPrice: 1.1, product: null, defaulted: false },
        boot: 0,
        seed: 1,
        blocks: 'none',
        intervalLevel: 0.9,
      },
      { tool: { name: 'Plotrate', version: 'test' }, createdAt: '2026-03-01T00:00:00Z', mapping },
    );
    expect(report.sources.map((s) => s.name)).toEqual([name]);
    expect(report.mapping.length).toBe(imported.mapping.length);
    expect(report.mapping.every((m) => m.file === name)).toBe(true);
    // The demo's rate header names N: the provenance says how its numbers were read.
    const rates = report.mapping.filter((m) => m.role === 'rate');
    expect(rates.length).toBeGreaterThan(0);
    expect(rates.every((m) => m.readAs === 'of N')).toBe(true);
    // Its yields are at harvest moisture with a moisture column: the provenance says they were
    // adjusted, to what and with which column (corn's 15.5 %, common practice in the US trade).
    const yields = report.mapping.filter((m) => m.role === 'yield');
    expect(yields.length).toBeGreaterThan(0);
    for (const y of yields)
      expect(y.readAs).toMatch(/^at harvest moisture, adjusted to 15\.5 % moisture with "[^"]+"$/);
    const others = report.mapping.filter((m) => m.role !== 'rate' && m.role !== 'yield');
    expect(others.every((m) => m.readAs === '')).toBe(true);
  });
});
