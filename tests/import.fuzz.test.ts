// Property tests: whatever bytes arrive, import either works or throws an
// ImportError with a message — never another exception, never a hang.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildPlotTable, detectColumns, isImportError, readTrialFile } from '../shared/import';
import { checkQuality } from '../shared/quality';

const demo = new Uint8Array(
  readFileSync(path.join(__dirname, '..', 'demo', 'wrenhollow-n-trials-2025.xlsx')),
);

/** Runs the whole import on bytes; resolves to "ok" or the ImportError code, rethrows anything else. */
async function importAll(name: string, bytes: Uint8Array): Promise<string> {
  try {
    const raw = await readTrialFile({ name, bytes });
    const mapping = detectColumns(raw);
    const { table } = buildPlotTable(raw, mapping, {
      crop: 'corn',
      rateBasis: 'nutrient',
      product: 'urea',
    });
    checkQuality(table);
    return 'ok';
  } catch (e) {
    if (isImportError(e) && e.message.length > 20) return (e as { code: string }).code;
    throw e;
  }
}

describe('import never throws anything but an ImportError', () => {
  it('random bytes under any file name', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.uint8Array({ maxLength: 3000 }),
        fc.constantFrom('a.xlsx', 'a.csv', 'a.tsv', 'a.txt', 'a'),
        async (bytes, name) => {
          await importAll(name, bytes);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('random bytes behind a zip or OLE2 signature', async () => {
    await fc.assert(
      fc.asyncProperty(fc.uint8Array({ maxLength: 2000 }), fc.boolean(), async (tail, zip) => {
        const head = zip
          ? [0x50, 0x4b, 0x03, 0x04]
          : [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];
        expect(await importAll('x.xlsx', Uint8Array.from([...head, ...tail]))).not.toBe('ok');
      }),
      { numRuns: 200 },
    );
  });

  it('the demo workbook truncated anywhere', async () => {
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 0, max: demo.length - 1 }), async (n) => {
        expect(await importAll('cut.xlsx', demo.subarray(0, n))).not.toBe('ok');
      }),
      { numRuns: 60 },
    );
  });

  it('the demo workbook with bytes changed', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(
          fc.tuple(fc.integer({ min: 0, max: demo.length - 1 }), fc.integer({ min: 1, max: 255 })),
          {
            minLength: 1,
            maxLength: 8,
          },
        ),
        async (flips) => {
          const b = demo.slice();
          for (const [i, x] of flips) b[i] ^= x;
          await importAll('flipped.xlsx', b);
        },
      ),
      { numRuns: 60 },
    );
  });

  it('random CSV text built from the characters that break parsers', async () => {
    const cell = fc.stringMatching(/^[0-9a-zA Z.,;"\t\r\n%/()\-é*]{0,12}$/);
    const header = fc.constantFrom(
      'Plot',
      'Block',
      'Rate (lb N/ac)',
      'Yield (bu/ac)',
      'Moisture %',
      'Site',
      'Trt',
      'Exclude',
      'x',
    );
    await fc.assert(
      fc.asyncProperty(
        fc.array(header, { minLength: 1, maxLength: 6 }),
        fc.array(fc.array(cell, { maxLength: 7 }), { maxLength: 30 }),
        fc.constantFrom(',', ';', '\t'),
        fc.boolean(),
        async (head, rows, sep, bom) => {
          const text = (bom ? '\ufeff' : '') + [head, ...rows].map((r) => r.join(sep)).join('\n');
          await importAll('fuzz.csv', new TextEncoder().encode(text));
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('buildPlotTable never throws anything but an ImportError for a damaged mapping or settings', () => {
  it('random changes to the demo mapping and settings', async () => {
    const raw = await readTrialFile({ name: 'demo.xlsx', bytes: demo });
    const base = detectColumns(raw);
    const anyValue = fc.oneof(
      fc.constantFrom(
        'plots',
        'treatment-key',
        'ignore',
        'yield',
        'rate',
        'moisture',
        'plotWeight',
        'plotArea',
        'group',
        'kg/ha',
        'bu/ac',
        'lb/ac',
        '%',
        'product',
        'nutrient',
        'harvest',
        'standard',
        'column',
        'sheet-name',
      ),
      fc.string({ maxLength: 6 }),
      fc.integer({ min: -3, max: 40 }),
      fc.constant(null),
      fc.constant(undefined),
    );
    const edit = fc.record({
      sheet: fc.nat(),
      column: fc.nat(),
      field: fc.constantFrom(
        'use',
        'headerRow',
        'site',
        'role',
        'unit',
        'basis',
        'moistureBasis',
        'col',
      ),
      value: anyValue,
    });
    await fc.assert(
      fc.asyncProperty(
        fc.array(edit, { minLength: 1, maxLength: 5 }),
        fc.constantFrom('corn', 'wheat', 'rye'),
        fc.constantFrom('product', 'nutrient', 'both'),
        fc.option(fc.constantFrom('urea', 'uan28', 'gypsum')),
        fc.option(fc.double({ min: -10, max: 120, noNaN: true })),
        async (edits, crop, rateBasis, product, std) => {
          const m = structuredClone(base) as unknown as { sheets: Record<string, unknown>[] };
          for (const e of edits) {
            const s = m.sheets[e.sheet % m.sheets.length] as {
              columns: Record<string, unknown>[];
            } & Record<string, unknown>;
            if (['use', 'headerRow'].includes(e.field)) s[e.field] = e.value;
            else if (e.field === 'site')
              s.site = typeof e.value === 'string' ? { from: e.value, value: e.value } : e.value;
            else if (s.columns.length > 0)
              s.columns[e.column % s.columns.length][e.field] = e.value;
          }
          try {
            buildPlotTable(raw, m as never, {
              crop: crop as never,
              rateBasis: rateBasis as never,
              ...(product ? { product: product as never } : {}),
              ...(std !== null ? { standardMoisturePct: std } : {}),
            });
          } catch (e) {
            if (!isImportError(e)) throw e;
          }
        },
      ),
      { numRuns: 300 },
    );
  });
});
