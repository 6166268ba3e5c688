// Each untidy habit of real trial sheets, as a small generated fixture, gives
// the right table or the right message. Expected numbers are worked by hand from
// the exact definitions (NIST SP 811 / Handbook 44: 1 lb = 0.45359237 kg,
// 1 ft = 0.3048 m, 1 acre = 43 560 ft²), USDA bushel weights (corn 56 lb/bu,
// wheat 60 lb/bu, from memory) and the dry-matter moisture formula.
import { originalRef } from '../shared/table/originalCell';
import { describe, expect, it } from 'vitest';
import {
  buildPlotTable,
  detectColumns,
  ImportError,
  readTrialFile,
  reuseMapping,
  type ImportSettings,
  type RawWorkbook,
} from '../shared/import';
import { checkQuality } from '../shared/quality';
import { makeWorkbook } from './fixtures/import/makeWorkbook';

const LB = 0.45359237;
const ACRE_M2 = 43560 * 0.3048 * 0.3048;
const LBAC = (LB * 10000) / ACRE_M2; // kg/ha per lb/ac
const corn: ImportSettings = { crop: 'corn', rateBasis: 'nutrient' };

const text = (s: string) => new TextEncoder().encode(s);
async function importText(
  name: string,
  body: string | Uint8Array,
  settings: ImportSettings = corn,
) {
  const raw = await readTrialFile({ name, bytes: typeof body === 'string' ? text(body) : body });
  return { raw, mapping: detectColumns(raw), ...buildPlotTable(raw, detectColumns(raw), settings) };
}

describe('delimited text', () => {
  it('reads a comma CSV with a BOM, CRLF, quoted fields and a title above the header', async () => {
    const csv =
      '\ufeffNorthgate Plots — fictional trial\r\n\r\n' +
      'Site,Block,Plot,"N rate (lb N/ac)","Yield (bu/ac)","Moisture (%)",Notes\r\n' +
      'Fenwold,1,101,0,"1,050.5",20,"lodged, ""some"" rows"\r\n' +
      'Fenwold,1,102,120,210.0,18,\r\n';
    const { table, raw } = await importText('t.csv', csv);
    expect(raw.separator).toBe(',');
    expect(table.plots).toHaveLength(2);
    const [a, b] = table.plots;
    expect(a.notes).toBe('lodged, "some" rows');
    expect(a.original.yield?.text).toBe('1,050.5');
    expect(a.yieldKgHa!).toBeCloseTo(1050.5 * 56 * LBAC * (80 / 84.5), 6);
    expect(b.rateKgHa!).toBeCloseTo(120 * LBAC, 9);
    expect(b.yieldKgHa!).toBeCloseTo(210 * 56 * LBAC * (82 / 84.5), 6);
    expect(originalRef(a.original.yield!)).toEqual({
      file: 't.csv',
      sheet: '',
      cell: 'E4',
      row: 4,
    });
    expect(a.site).toBe('Fenwold');
  });

  it('reads semicolons with decimal commas and dot thousands (metric wheat)', async () => {
    const csv =
      'Site;Rep;N (kg N/ha);Yield (kg/ha);Moisture %\n' +
      'Hollin Rise;1;0;4.512,5;14,2\n' +
      'Hollin Rise;1;60;6.020;13,0\n' +
      'Hollin Rise;2;0;4.390,0;14,8\n';
    const { table, raw } = await importText('w.csv', csv, { crop: 'wheat', rateBasis: 'nutrient' });
    expect(raw.separator).toBe(';');
    expect(raw.sheets[0].decimalComma).toBe(true);
    expect(table.plots.map((p) => p.moisturePct)).toEqual([14.2, 13, 14.8]);
    expect(table.plots[0].yieldKgHa!).toBeCloseTo(4512.5 * (85.8 / 86.5), 6);
    expect(table.plots[1].yieldKgHa!).toBeCloseTo(6020 * (87 / 86.5), 6);
    expect(table.plots[1].rateKgHa).toBe(60);
  });

  it('reads tab-separated text, Windows-1252 text and ignores trailing blank rows and columns', async () => {
    const tsv =
      'Site\tBlock\tRate (kg/ha)\tYield (t/ha)\t\t\nBrisé Hollow\t1\t0\t5.5\t\t\nBrisé Hollow\t1\t90\t7.25\t\t\n\t\t\t\t\t\n\n\n';
    // Windows-1252: "é" is the single byte 0xE9.
    const bytes = Uint8Array.from([...tsv].map((c) => (c === 'é' ? 0xe9 : c.charCodeAt(0))));
    const { table, raw } = await importText('w.tsv', bytes, {
      crop: 'wheat',
      rateBasis: 'nutrient',
    });
    expect(raw.separator).toBe('\t');
    expect(raw.sheets[0].rows).toHaveLength(3);
    expect(table.plots.map((p) => p.site)).toEqual(['Brisé Hollow', 'Brisé Hollow']);
    // No moisture column: t/ha taken as already at standard moisture; 1 t = 1000 kg.
    expect(table.plots[1].yieldKgHa).toBeCloseTo(7250, 9);
  });

  it('treats blank . - NA n/a * missing as no value, and reports text that is not a number', async () => {
    const markers = ['', '.', '-', 'NA', 'n/a', '*', 'missing'];
    const rows = markers.map((m, i) => `Kestrow,1,${101 + i},0,${m}`);
    const csv = [
      'Site,Block,Plot,Rate (lb N/ac),Yield (bu/ac)',
      ...rows,
      'Kestrow,1,120,0,lodged',
    ].join('\n');
    const { table } = await importText('m.csv', csv);
    expect(table.plots).toHaveLength(markers.length + 1);
    expect(table.plots.every((p) => p.yieldKgHa === null)).toBe(true);
    expect(table.plots.map((p) => p.original.yield?.text)).toEqual([...markers, 'lodged']);
    const f = checkQuality(table);
    const nan = f.filter((x) => x.code === 'not-a-number');
    expect(nan).toHaveLength(1);
    expect(nan[0].message).toBe(
      'm.csv › E9 should hold the yield as a number but says "lodged"; the plot has no yield until the cell is corrected.',
    );
    expect(f.filter((x) => x.code === 'missing-value')).toHaveLength(markers.length);
  });

  it('skips summary rows under the plots and says so', async () => {
    const csv =
      'Block,Plot,Rate (lb N/ac),Yield (bu/ac)\n1,101,0,150\n1,102,80,190\nMean,,,170\nCV %,,,8.1\n';
    const { table, findings } = await importText('s.csv', csv);
    expect(table.plots).toHaveLength(2);
    expect(table.plots[0].site).toBe('s');
    const f = findings.find((x) => x.code === 'summary-row-skipped')!;
    expect(f.message).toBe(
      's.csv: rows 4, 5 look like summary rows (mean, CV, LSD) and were not read as plots.',
    );
  });

  it('names the row of a quote that is never closed', async () => {
    const e = await readTrialFile({
      name: 'q.csv',
      bytes: text('Plot,Yield\n1,200\n2,"20\n3,190\n'),
    }).catch((x) => x);
    expect(e).toBeInstanceOf(ImportError);
    expect(e.message).toBe(
      '"q.csv", row 3: a quoted field starts there and is never closed; check for a stray double quote (") in that row and save the file again.',
    );
  });
});

describe('workbook cells', () => {
  it('uses a formula’s cached result and flags a formula saved without one', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'Tamsin Field',
        rows: [
          ['Plot', 'Block', 'N rate (kg N/ha)', 'Grain yield (kg/ha)'],
          [101, 1, 0, { formula: '9000*1', result: 9000 }],
          [102, 1, 100, { formula: 'D2+2000' }],
        ],
      },
    ]);
    const { table, findings } = await importText('f.xlsx', bytes);
    expect(table.plots[0].yieldKgHa).toBe(9000);
    expect(table.plots[1].yieldKgHa).toBeNull();
    const f = findings.find((x) => x.code === 'formula-without-result')!;
    expect(f.refs[0]).toEqual({ file: 'f.xlsx', sheet: 'Tamsin Field', cell: 'D3', row: 3 });
    expect(f.message).toMatch(
      /^f\.xlsx › Tamsin Field D3 \(Grain yield \(kg\/ha\)\) is a formula \(=D2\+2000\) saved without a calculated result/,
    );
  });

  it('gives every row of a merged block cell its block, and reads numbers stored as text', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'Marl Pit',
        rows: [
          ['Block', 'Plot', 'Rate (lb N/ac)', 'Yield (bu/ac)'],
          ['I', 101, 0, 150.5],
          [null, 102, 60, '181.0'],
          [null, 103, 120, 205],
          ['II', 201, 0, 149],
        ],
        merges: ['A2:A4'],
      },
    ]);
    const { table, findings } = await importText('merged.xlsx', bytes);
    expect(table.plots.map((p) => p.block)).toEqual(['I', 'I', 'I', 'II']);
    expect(table.plots[1].yieldKgHa!).toBeCloseTo(181 * 56 * LBAC, 6);
    expect(findings.filter((x) => x.code === 'number-as-text').map((x) => x.refs[0].cell)).toEqual([
      'D3',
    ]);
  });

  it('reports a date in a numeric column, hidden rows, and skips a hidden sheet', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'Plots',
        rows: [
          ['Site', 'Block', 'Rate (kg N/ha)', 'Yield (t/ha)', 'Harvest date'],
          ['Ravel Combe', 1, 0, 6.1, new Date(Date.UTC(2025, 8, 30))],
          ['Ravel Combe', 1, 80, new Date(Date.UTC(2025, 8, 30)), new Date(Date.UTC(2025, 8, 30))],
          ['Ravel Combe', 2, 0, 5.9, new Date(Date.UTC(2025, 8, 30))],
        ],
        hiddenRows: [4],
      },
      {
        name: 'Lookup',
        rows: [
          ['Block', 'Yield (t/ha)'],
          [1, 2],
        ],
        state: 'hidden',
      },
    ]);
    const { table, findings, mapping } = await importText('d.xlsx', bytes, {
      crop: 'wheat',
      rateBasis: 'nutrient',
    });
    expect(mapping.sheets.find((s) => s.sheet === 'Lookup')!.use).toBe('ignore');
    expect(table.plots).toHaveLength(3);
    expect(table.plots[1].yieldKgHa).toBeNull();
    expect(table.plots[1].original.yield?.text).toBe('2025-09-30');
    const q = checkQuality(table).find((x) => x.code === 'not-a-number')!;
    expect(q.refs[0].cell).toBe('D3');
    expect(findings.find((x) => x.code === 'hidden-rows')!.message).toBe(
      'd.xlsx › Plots: row 4 is hidden in the sheet but was imported as a plot; exclude it if it was hidden on purpose.',
    );
  });
});

describe('yields and rates in every unit', () => {
  it('plot weight over plot area (kg, m²) and over length × width (lb, ft)', async () => {
    const metric = await makeWorkbook([
      {
        name: 'Weights',
        rows: [
          ['Plot', 'Block', 'N (kg N/ha)', 'Plot wt (kg)', 'Plot area (m2)', 'Moisture (%)'],
          [1, 1, 0, 9.6, 12, 15.5],
          [2, 1, 120, 12.0, 12, 20],
        ],
      },
    ]);
    const m = await importText('wt.xlsx', metric);
    expect(m.table.plots[0].yieldKgHa).toBeCloseTo(8000, 9); // 9.6 kg / 12 m² × 10 000, at standard moisture already
    expect(m.table.plots[1].yieldKgHa).toBeCloseTo(10000 * (80 / 84.5), 6);
    const us = await makeWorkbook([
      {
        name: 'Strips',
        rows: [
          [
            'Plot',
            'Rep',
            'Rate (lb N/ac)',
            'Harvest weight (lb)',
            'Length (ft)',
            'Width (ft)',
            'Moisture',
          ],
          [1, 1, 150, 60, 400, 10, 17],
        ],
      },
    ]);
    const u = await importText('strip.xlsx', us);
    // 60 lb over 4 000 ft² → 60 × 43 560 / 4 000 lb/ac = 653.4 lb/ac, then moisture.
    expect(u.table.plots[0].yieldKgHa!).toBeCloseTo(((60 * 43560) / 4000) * LBAC * (83 / 84.5), 6);
  });

  it('refuses plot weights with no area, saying what to map', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'W',
        rows: [
          ['Plot', 'Rate (kg/ha)', 'Plot weight (kg)'],
          [1, 0, 5],
        ],
      },
    ]);
    const raw = await readTrialFile({ name: 'w.xlsx', bytes });
    expect(() => buildPlotTable(raw, detectColumns(raw), corn)).toThrow(
      `Sheet "W" of "w.xlsx" gives plot weights (column C) but no plot area or length and width; map those columns, or give every plot's area (the import's plot area setting; --plot-area on the command line).`,
    );
    const t = buildPlotTable(raw, detectColumns(raw), { ...corn, plotAreaM2: 10 }).table;
    expect(t.plots[0].yieldKgHa).toBeCloseTo(5000, 9);
  });

  it('reads lb/ac, kg/ha, t/ha, bu/ac of wheat and g/m² rates', async () => {
    const csv =
      'Site,Rate (g/m2),Yield (lb/ac),Yield kg/ha,Grain t/ha,Yield (bu/A)\nOrlin,12,4000,,,\n';
    const { table, mapping } = await importText('u.csv', csv, {
      crop: 'wheat',
      rateBasis: 'nutrient',
    });
    expect(table.plots[0].rateKgHa).toBeCloseTo(120, 9); // 1 g/m² = 10 kg/ha
    expect(table.plots[0].yieldKgHa).toBeCloseTo(4000 * LBAC, 6);
    const cols = mapping.sheets[0].columns;
    expect(cols.map((c) => [c.role, c.unit])).toEqual([
      ['site', null],
      ['rate', 'g/m2'],
      ['yield', 'lb/ac'],
      ['ignore', 'kg/ha'],
      ['ignore', 't/ha'],
      ['ignore', 'bu/ac'],
    ]);
    // Choosing the bu/ac column instead: 60 lb/bu for wheat.
    const m2 = structuredClone(mapping);
    m2.sheets[0].columns[2].role = 'ignore';
    m2.sheets[0].columns[5].role = 'yield';
    const raw = await readTrialFile({
      name: 'u.csv',
      bytes: text(csv.replace(',,,\n', ',,,70\n')),
    });
    expect(
      buildPlotTable(raw, m2, { crop: 'wheat', rateBasis: 'nutrient' }).table.plots[0].yieldKgHa,
    ).toBeCloseTo(70 * 60 * LBAC, 6);
  });

  it('turns product rates into nitrogen with each product’s analysis', async () => {
    // Common practice: urea 46 % N, UAN 28 %, anhydrous ammonia 82 %, ammonium sulfate 21 %.
    const csv =
      'Plot,Source,Rate (lb/ac),Yield (bu/ac)\n1,Urea,200,180\n2,UAN 28%,300,185\n3,NH3,100,190\n4,AMS,100,150\n5,none,0,140\n';
    const { table } = await importText('p.csv', csv, { crop: 'corn', rateBasis: 'product' });
    expect(table.plots.map((p) => p.rateKgHa)).toEqual(
      [92 * LBAC, 84 * LBAC, 82 * LBAC, 21 * LBAC, 0].map((v) => expect.closeTo(v, 9)),
    );
    expect(table.plots[0].groups.Source).toBe('Urea');
  });

  it('refuses product rates when no product is known, saying how to fix it', async () => {
    const csv = 'Plot,Rate (lb/ac),Yield (bu/ac)\n1,200,180\n';
    const raw = await readTrialFile({ name: 'np.csv', bytes: text(csv) });
    expect(() =>
      buildPlotTable(raw, detectColumns(raw), { crop: 'corn', rateBasis: 'product' }),
    ).toThrow(
      /^np\.csv row 2: the rate 200 is a rate of product, but no product is named\. Choose the product \(urea 46-0-0/,
    );
    const t = buildPlotTable(raw, detectColumns(raw), {
      crop: 'corn',
      rateBasis: 'product',
      product: 'uan32',
    }).table;
    expect(t.plots[0].rateKgHa!).toBeCloseTo(64 * LBAC, 9);
  });

  it('keeps excluded plots as exclusions with the reason, never dropping them', async () => {
    const csv =
      'Plot,Rate (kg N/ha),Yield (kg/ha),Omit,Comments\n1,0,8000,x,hail\n2,0,8100,no,\n3,0,8050,,\n';
    const { table } = await importText('e.csv', csv);
    expect(table.plots).toHaveLength(3);
    expect(table.plots.map((p) => p.excluded)).toEqual([
      { reason: 'Omit column says "x"; notes: hail', by: 'sheet' },
      null,
      null,
    ]);
  });
});

describe('mappings', () => {
  async function shaped(siteA: string, siteB: string): Promise<RawWorkbook> {
    const sheet = (name: string) => ({
      name,
      rows: [
        ['Trial notes'],
        [],
        ['Plot', 'Rep', 'Trt', 'Yield'],
        [101, 1, 1, 9100],
        [102, 1, 2, 10400],
      ],
    });
    const bytes = await makeWorkbook([
      sheet(siteA),
      sheet(siteB),
      {
        name: 'Key',
        rows: [
          ['Trt', 'N rate (kg N/ha)', 'Timing'],
          [1, 0, ''],
          [2, 150, 'V6'],
        ],
      },
    ]);
    return readTrialFile({ name: `${siteA}.xlsx`, bytes });
  }

  it('joins the treatment key, takes sites from sheet names and guesses a unit it says it guessed', async () => {
    const raw = await shaped('Coldharbour', 'Wetherlee');
    const m = detectColumns(raw);
    const y = m.sheets[0].columns.find((c) => c.role === 'yield')!;
    expect(y.unit).toBe('kg/ha');
    expect(y.evidence).toMatch(/no unit in the header; values near 9750 read as kg\/ha/);
    const { table } = buildPlotTable(raw, m, corn);
    expect(table.plots.map((p) => [p.site, p.rateKgHa])).toEqual([
      ['Coldharbour', 0],
      ['Coldharbour', 150],
      ['Wetherlee', 0],
      ['Wetherlee', 150],
    ]);
    expect(originalRef(table.plots[1].original.rate!)).toEqual({
      file: 'Coldharbour.xlsx',
      sheet: 'Key',
      cell: 'B3',
      row: 3,
    });
    expect(table.plots[1].groups['Timing (treatment key)']).toBe('V6');
  });

  it('a saved mapping is plain JSON and carries the user’s corrections to the next file of the same shape', async () => {
    const first = await shaped('Coldharbour', 'Wetherlee');
    const saved = JSON.parse(JSON.stringify(detectColumns(first)));
    saved.sheets[0].columns.find((c: { role: string }) => c.role === 'yield').unit = 'lb/ac';
    const next = await shaped('Ashby Nook', 'Pellow End');
    expect(detectColumns(next).shapeSignature).toBe(saved.shapeSignature);
    const { mapping, sameShape } = reuseMapping(next, saved);
    expect(sameShape).toBe(true);
    const t = buildPlotTable(next, mapping, corn).table;
    expect(t.plots[0].yieldKgHa!).toBeCloseTo(9100 * LBAC, 6);
    expect(t.plots.map((p) => p.site)).toEqual([
      'Ashby Nook',
      'Ashby Nook',
      'Pellow End',
      'Pellow End',
    ]);
  });

  it('never changes the bytes it was given', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'S',
        rows: [
          ['Plot', 'Rate (kg/ha)', 'Yield (kg/ha)'],
          [1, 0, 9000],
        ],
      },
    ]);
    const copy = bytes.slice();
    const raw = await readTrialFile({ name: 's.xlsx', bytes });
    buildPlotTable(raw, detectColumns(raw), corn);
    expect(Buffer.from(bytes).equals(Buffer.from(copy))).toBe(true);
  });

  it('refuses settings with an unknown crop or an impossible moisture', async () => {
    const raw = await readTrialFile({
      name: 'a.csv',
      bytes: text('Plot,Rate (kg/ha),Yield (kg/ha)\n1,0,9000\n'),
    });
    const m = detectColumns(raw);
    expect(() => buildPlotTable(raw, m, { crop: 'rye' as never, rateBasis: 'nutrient' })).toThrow(
      /name no known crop \("rye"\)/,
    );
    expect(() => buildPlotTable(raw, m, { ...corn, standardMoisturePct: 80 })).toThrow(
      'The standard moisture must be between 0 % and 50 %; got 80 %. The usual value for corn is 15.5 %.',
    );
  });
});
