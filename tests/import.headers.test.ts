// Header words and unit hints as trial sheets write them, table-driven; the
// mapping checks; several files in one table; a treatment key of product rates.
import { describe, expect, it } from 'vitest';
import {
  buildPlotTable,
  detectColumns,
  ImportError,
  parseNumberText,
  rateHeaderBasis,
  readTrialFile,
  roleFromHeader,
  unitFromHeader,
} from '../shared/import';
import { importFiles } from '../shared/import/importFiles';
import { makeWorkbook } from './fixtures/import/makeWorkbook';

const LBAC = (0.45359237 * 10000) / (43560 * 0.3048 * 0.3048); // exact pound and acre (NIST SP 811)

describe('roleFromHeader and unitFromHeader', () => {
  const cases: [string, string | null, string | null, string | null][] = [
    // header, role, unit, basis
    ['N rate (lb N/A)', 'rate', 'lb/ac', 'nutrient'],
    ['Rate (lb/ac)', 'rate', 'lb/ac', null],
    ['N applied, kg N/ha', 'rate', 'kg/ha', 'nutrient'],
    ['Urea (lb product/ac)', 'rate', 'lb/ac', 'product'],
    ['UAN (kg urea/ha)', 'rate', 'kg/ha', 'product'],
    ['Urea (lb/ac)', 'rate', 'lb/ac', null],
    ['UAN-32 kg/ha', 'rate', 'kg/ha', null],
    ['UAN (lb/ac)', 'rate', 'lb/ac', null],
    ['Dry matter (kg grain/ha)', null, 'kg/ha', null],
    ['Total N (kg/ha)', 'rate', 'kg/ha', null],
    ['Nitrogen g/m²', 'rate', 'g/m2', null],
    ['Yield bu/A', 'yield', 'bu/ac', null],
    ['Grain Yield (bu/acre)', 'yield', 'bu/ac', null],
    ['Yld (BPA)', 'yield', 'bu/ac', null],
    ['Yield (Mg/ha)', 'yield', 't/ha', null],
    ['Grain t/ha', 'yield', 't/ha', null],
    ['Yield, kg/ha', 'yield', 'kg/ha', null],
    ['Yield (lbs/ac)', 'yield', 'lb/ac', null],
    ['Moisture (%)', 'moisture', '%', null],
    ['H2O %', 'moisture', '%', null],
    ['Test wt (lb/bu)', 'testWeight', 'lb/bu', null],
    ['TW kg/hl', 'testWeight', 'kg/hl', null],
    ['Plot wt (kg)', 'plotWeight', 'kg', null],
    ['Harvest weight lbs', 'plotWeight', 'lb', null],
    ['Plot area (m2)', 'plotArea', 'm2', null],
    ['Area sq ft', 'plotArea', 'ft2', null],
    ['Length (ft)', 'plotLength', 'ft', null],
    ['Width m', 'plotWidth', 'm', null],
    ['Rep', 'block', null, null],
    ['BLK', 'block', null, null],
    ['Trt #', 'treatment', null, null],
    ['Plot No', 'plot', null, null],
    ['Location', 'site', null, null],
    ['Yr', 'year', null, null],
    ['Previous crop', 'group', null, null],
    ['Soil N (ppm)', 'group', null, null],
    ['Omit?', 'exclude', null, null],
    ['Comments', 'notes', null, null],
    ['Source', 'product', null, null],
    ['Timing', 'timing', null, null],
    ['Stand count', null, null, null],
  ];
  it.each(cases)('%s → role %s, unit %s, basis %s', (header, role, unit, basis) => {
    expect(roleFromHeader(header)?.role ?? null).toBe(role);
    const u = unitFromHeader(header);
    expect(u?.unit ?? null).toBe(unit);
    if (u && (u.unit.includes('/ac') || u.unit.includes('/ha') || u.unit === 'g/m2'))
      expect(u.basis).toBe(basis);
  });
});

describe('rateHeaderBasis', () => {
  it.each([
    ['Urea (lb/ac)', 'product', 'urea'],
    ['UAN-32 kg/ha', 'product', 'uan32'],
    ['Rate (lb urea/ac)', 'product', 'urea'],
    ['Product rate (lb/ac)', 'product', null],
    ['N rate (lb/ac)', 'nutrient', null],
    // N from urea is nitrogen: the N word wins over the product's name.
    ['Urea N (lb/ac)', 'nutrient', null],
    ['Rate (lb/ac)', null, null],
    // UAN comes at 28 or 32 % N: without the grade the product is asked for, not guessed.
    ['UAN (lb/ac)', 'product', null],
  ])('%s → basis %s, product %s', (header, basis, product) => {
    expect(rateHeaderBasis(header)).toEqual({ basis, product });
  });

  it('reads a product named in the rate header as that product (urea 46 % N)', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'Corrow',
        rows: [
          ['Plot', 'Block', 'Urea (lb/ac)', 'Yield (bu/ac)'],
          [1, 1, 0, 150],
          [2, 1, 100, 180],
          [3, 1, 200, 186],
        ],
      },
    ]);
    const raw = await readTrialFile({ name: 'u.xlsx', bytes });
    const m = detectColumns(raw);
    expect(m.sheets[0].columns[2]).toMatchObject({
      role: 'rate',
      basis: 'product',
      product: 'urea',
    });
    // The import settings say nutrient: the header's product is more specific and wins.
    const { table } = buildPlotTable(raw, m, { crop: 'corn', rateBasis: 'nutrient' });
    // Common practice: urea is 46 % N (46-0-0); 100 lb urea/ac is 46 lb N/ac.
    expect(table.plots.map((p) => p.rateKgHa)).toEqual(
      [0, 46 * LBAC, 92 * LBAC].map((v) => expect.closeTo(v, 9)),
    );
  });
});

describe('headers in words Plotrate does not know', () => {
  // Invented: a German-language sheet, semicolons and decimal commas, yields in dt/ha.
  const text = [
    'Standort;Wdh;N-Menge (kg N/ha);Ertrag (dt/ha)',
    'Holmbach;1;0;62,5',
    'Holmbach;1;60;78,1',
    'Holmbach;2;0;60,1',
    'Holmbach;2;60;80,3',
  ].join('\n');
  const files = [{ name: 'holmbach.csv', bytes: new TextEncoder().encode(`${text}\n`) }];

  it('are refused with the header-like row and how to name its columns', async () => {
    await expect(importFiles(files, { crop: 'wheat', overrides: [] })).rejects.toThrow(
      /no sheet reads as plots .* reads "Standort", "Wdh", "N-Menge \(kg N\/ha\)", "Ertrag \(dt\/ha\)"\. Name the columns with --map/,
    );
  });

  it('are read once --map names them: the header row is found by the named columns', async () => {
    const { table } = await importFiles(files, {
      crop: 'wheat',
      overrides: [
        { role: 'yield', header: 'Ertrag (dt/ha)' },
        { role: 'site', header: 'Standort' },
        { role: 'block', header: 'Wdh' },
      ],
    });
    expect(table.plots.map((p) => p.site)).toEqual([
      'Holmbach',
      'Holmbach',
      'Holmbach',
      'Holmbach',
    ]);
    expect(table.plots.map((p) => p.block)).toEqual(['1', '1', '2', '2']);
    expect(table.plots.map((p) => p.rateKgHa)).toEqual([0, 60, 0, 60]);
    // 1 dt = 100 kg (a decitonne, the quintal of common practice): 62.5 dt/ha is 6,250 kg/ha.
    expect(table.plots[0].yieldKgHa).toBeCloseTo(6250, 9);
  });
});

describe('parseNumberText', () => {
  const cases: [string, boolean, number | null][] = [
    ['1,234.5', false, 1234.5],
    ['1.234,5', true, 1234.5],
    ['12,5', true, 12.5],
    ['12,5', false, 12.5],
    ['1,234', false, 1234],
    ['1,234', true, 1.234],
    [' +180 ', false, 180],
    ['1\u00a0234', false, 1234],
    ['-3.5e2', false, -350],
    ['.75', false, 0.75],
    ['12 bu', false, null],
    ['1,2,3', false, null],
    ['', false, null],
  ];
  it.each(cases)('"%s" (decimal comma %s) → %s', (t, dc, v) => {
    expect(parseNumberText(t, dc)).toBe(v);
  });
});

describe('mapping checks and layouts', () => {
  const csv = (site: string) =>
    new TextEncoder().encode(
      `Plot,Rate (kg N/ha),Yield (kg/ha)\n1,0,8000\n2,100,9500\n`.replace('Plot', 'Plot') +
        `3,200,${site.length * 1000}\n`,
    );

  it('refuses a mapping with a wrong unit or role, naming the column and sheet', async () => {
    const raw = await readTrialFile({ name: 'm.csv', bytes: csv('Eastmere') });
    const m = detectColumns(raw);
    const wrongUnit = structuredClone(m);
    wrongUnit.sheets[0].columns[2].unit = 'lb/bu';
    expect(() => buildPlotTable(raw, wrongUnit, { crop: 'corn', rateBasis: 'nutrient' })).toThrow(
      'The column mapping for "m.csv" gives column C ("Yield (kg/ha)") of sheet "" the unit "lb/bu", which a yield column cannot have; choose one of kg/ha, t/ha, q/ha, lb/ac, bu/ac, g/m2; detect the columns again or correct it.',
    );
    const wrongRole = structuredClone(m);
    (wrongRole.sheets[0].columns[0] as { role: string }).role = 'plotNumber';
    expect(() => buildPlotTable(raw, wrongRole, { crop: 'corn', rateBasis: 'nutrient' })).toThrow(
      /gives column A \("Plot"\) of sheet "" the unknown role "plotNumber"/,
    );
    expect(() => buildPlotTable(raw, {} as never, { crop: 'corn', rateBasis: 'nutrient' })).toThrow(
      ImportError,
    );
  });

  it('builds one table from several files, one site each, with unique plot ids and every source', async () => {
    const a = await readTrialFile({ name: 'Eastmere.csv', bytes: csv('Eastmere') });
    const b = await readTrialFile({ name: 'Wyvenhoe.csv', bytes: csv('Wyvenhoe') });
    const { table } = buildPlotTable([a, b], [detectColumns(a), detectColumns(b)], {
      crop: 'corn',
      rateBasis: 'nutrient',
    });
    expect([...new Set(table.plots.map((p) => p.site))]).toEqual(['Eastmere', 'Wyvenhoe']);
    expect(new Set(table.plots.map((p) => p.id)).size).toBe(6);
    expect(table.sources.map((s) => s.name)).toEqual(['Eastmere.csv', 'Wyvenhoe.csv']);
  });

  it('converts a treatment key of product rates with each treatment’s product', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'Key',
        rows: [
          ['Treatment', 'Product rate (lb/ac)', 'Fertilizer'],
          [1, 0, 'none'],
          [2, 100, 'Urea'],
          [3, 100, 'Ammonium nitrate'],
        ],
      },
      {
        name: 'Brenlow',
        rows: [
          ['Plot', 'Block', 'Treatment', 'Yield (bu/ac)'],
          [1, 1, 1, 150],
          [2, 1, 2, 180],
          [3, 1, 3, 176],
        ],
      },
    ]);
    const raw = await readTrialFile({ name: 'k.xlsx', bytes });
    const m = detectColumns(raw);
    expect(m.sheets[0].use).toBe('treatment-key');
    expect(m.sheets[0].columns[1].basis).toBe('product');
    const { table } = buildPlotTable(raw, m, { crop: 'corn', rateBasis: 'nutrient' });
    // Common practice: urea 46 % N, ammonium nitrate 34 % N.
    expect(table.plots.map((p) => p.rateKgHa)).toEqual(
      [0, 46 * LBAC, 34 * LBAC].map((v) => expect.closeTo(v, 9)),
    );
    expect(table.plots[1].site).toBe('Brenlow');
  });

  it('says which treatment is missing from the key', async () => {
    const bytes = await makeWorkbook([
      {
        name: 'Key',
        rows: [
          ['Trt', 'N rate (kg N/ha)'],
          [1, 0],
        ],
      },
      {
        name: 'Lowfold',
        rows: [
          ['Plot', 'Trt', 'Yield (t/ha)'],
          [1, 1, 6],
          [2, 7, 7],
        ],
      },
    ]);
    const raw = await readTrialFile({ name: 'k2.xlsx', bytes });
    const { table, findings } = buildPlotTable(raw, detectColumns(raw), {
      crop: 'wheat',
      rateBasis: 'nutrient',
    });
    expect(table.plots[1].rateKgHa).toBeNull();
    expect(findings.find((f) => f.code === 'treatment-not-in-key')!.message).toBe(
      'k2.xlsx › Lowfold row 3: treatment "7" is not in the treatment key, so the plot has no rate. Add it to the key or correct the treatment.',
    );
  });

  it('lists a column with values under a blank header and warns about a numeric column of text', async () => {
    const raw = await readTrialFile({
      name: 'b.csv',
      bytes: new TextEncoder().encode(
        'Plot,Rate (kg N/ha),Yield (kg/ha),\n1,0,lodged,x\n2,50,gone,y\n3,100,9000,z\n',
      ),
    });
    const cols = detectColumns(raw).sheets[0].columns;
    expect(cols[3]).toMatchObject({ col: 4, letter: 'D', header: '', role: 'ignore' });
    expect(cols[3].evidence).toBe(
      'column D has no header but holds values (0 of 3 values are numbers); give it a role by hand if it matters',
    );
    expect(cols[2].evidence).toMatch(
      /1 of 3 values are numbers; most values are not numbers: check that this is the right column/,
    );
  });

  it('refuses an HTML table saved as .xls with a message saying what it is', async () => {
    const html = new TextEncoder().encode(
      '<html><body><table><tr><td>Plot</td></tr></table></body></html>',
    );
    const e = await readTrialFile({ name: 'export.xls', bytes: html }).catch((x) => x);
    expect(e.message).toBe(
      '"export.xls" is a web page (HTML) saved under a spreadsheet name, not a trial workbook; open it in your spreadsheet program and save it as .xlsx, then import that.',
    );
  });
});
