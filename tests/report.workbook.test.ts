// The report workbook, read back two ways: exceljs (layout: frozen panes,
// print setup, formats, images) and SheetJS, an independent .xlsx reader
// (values and the text a spreadsheet shows). Expected optima are recomputed
// from the fitted parameters with the closed forms in /work/shared design
// notes ("Economic optimum"), in display units, so a wrong unit conversion of
// a parameter or of the price ratio shows up as a wrong rate.
import ExcelJS from 'exceljs';
import { strFromU8, unzipSync } from 'fflate';
import { beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { recommendationCautions } from '../shared/economics/recommendationCautions';
import { resultsJson, type ResultsJson } from '../shared/report/resultsJson';
import type { TrialReport } from '../shared/report/trialReport';
import { reportGrowerPages, writeWorkbook } from '../shared/report/workbook';
import { P_VALUE_FORMAT, sheetName } from '../shared/report/workbookFormat';
import { demoTrial } from '../shared/demo';
import {
  METRIC_GRAIN_PER_T,
  METRIC_N_PER_KG,
  demoReport,
  gainsOverBlockCheck,
} from './report.fixture';
import { reportOf } from './report.pipeline';
import { simulatedTrial } from '../shared/demo/simulatedSite';

/** 1 lb/ac in kg/ha from the exact pound and acre (NIST SP 811; 1 ac = 43 560 ft²). */
const KG_HA_PER_LB_AC = 0.45359237 / (43560 * 0.3048 * 0.3048 * 1e-4);

// A 1×1 white PNG (the smallest valid image) stands in for the chart: the chart itself is tested in report.svgChart.
const tinyPng = Uint8Array.from(
  Buffer.from(
    'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8/5+hHgAHggJ/PchI7wAAAABJRU5ErkJggg==',
    'base64',
  ),
);

let us: TrialReport;
let metric: TrialReport;
let usBytes: Uint8Array;
let metricBytes: Uint8Array;
let usJson: ResultsJson;

beforeAll(async () => {
  us = await demoReport('us');
  metric = await demoReport('metric');
  const charts = Object.fromEntries(
    us.sites.map((s) => [s.site, { png: tinyPng, widthPx: 800, heightPx: 560 }]),
  );
  usBytes = await writeWorkbook(us, {
    siteCharts: charts,
    acrossChart: { png: tinyPng, widthPx: 800, heightPx: 460 },
  });
  metricBytes = await writeWorkbook(metric);
  usJson = resultsJson(us);
});

function findRow(ws: XLSX.WorkSheet, firstCell: string, from?: number): number {
  const range = XLSX.utils.decode_range(ws['!ref']!);
  for (let r = from ?? range.s.r; r <= range.e.r; r++) {
    const c = ws[XLSX.utils.encode_cell({ r, c: 0 })];
    if (c && c.v === firstCell) return r;
  }
  throw new Error(`no row starting with "${firstCell}"`);
}

function cell(ws: XLSX.WorkSheet, r: number, c: number): XLSX.CellObject | undefined {
  return ws[XLSX.utils.encode_cell({ r, c })];
}

describe('writeWorkbook read back by SheetJS', () => {
  it('has the overview, one sheet per site, across sites, economics, recommendations and provenance', () => {
    const wb = XLSX.read(usBytes);
    const corn = demoTrial()
      .sites.filter((s) => s.crop === 'corn')
      .map((s) => s.name);
    const taken = new Set<string>();
    expect(wb.SheetNames).toEqual([
      'Overview',
      ...corn.map((n) => sheetName(n, taken)),
      'Across sites',
      'Regional model',
      'Economics',
      'Price ratio and risk',
      'Recommendations',
      'Provenance',
    ]);
    expect(wb.SheetNames).toContain('Orrin’s Bend');
  });

  it('puts every caution above the price-ratio and risk tables, and the JSON’s numbers in them', () => {
    const ws = XLSX.read(usBytes).Sheets['Price ratio and risk'];
    const text = XLSX.utils.sheet_to_csv(ws);
    for (const c of recommendationCautions) expect(text).toContain(c);
    expect(findRow(ws, 'Cautions')).toBeLessThan(findRow(ws, 'Multiple of the price ratio'));
    // The regional table comes first: its five rows, then each site's.
    const h = findRow(ws, 'Multiple of the price ratio');
    usJson.acrossSites!.priceRatioSensitivity.forEach((row, i) => {
      expect(cell(ws, h + 1 + i, 0)?.v).toBe(row.ratioMultiplier);
      expect(cell(ws, h + 1 + i, 1)?.v as number).toBeCloseTo(row.priceRatio, 9);
      expect(cell(ws, h + 1 + i, 2)?.v as number).toBeCloseTo(row.rate!, 8);
    });
    const risk = findRow(ws, 'Rate (lb N/ac)');
    usJson.acrossSites!.shortfallRisk!.rows.forEach((row, i) => {
      expect(cell(ws, risk + 1 + i, 1)?.v as number).toBeCloseTo(row.share, 9);
      expect(cell(ws, risk + 1 + i, 2)?.v ?? '').toBe(row.recommended ? 'regional rate' : '');
    });
  });

  it('shows the regional model with the same figures as the results file, and the cautions', () => {
    const ws = XLSX.read(usBytes).Sheets['Regional model'];
    const text = XLSX.utils.sheet_to_csv(ws);
    for (const c of recommendationCautions) expect(text).toContain(c);
    expect(String(cell(ws, 1, 0)!.v)).toMatch(
      /^Across 6 site-years, the regional quadratic mixed model/,
    );
    const mixed = usJson.acrossSites!.mixed!;
    expect(cell(ws, 3, 1)!.v).toBeCloseTo(mixed.optimumRate, 9);
    const b = findRow(ws, 'b');
    expect(cell(ws, b, 1)!.v).toBeCloseTo(mixed.fixed.b, 9);
    expect(cell(ws, b, 2)!.v).toBeCloseTo(mixed.stdErrors.b, 9);
  });

  it('compares the regional model forms with the results file’s figures and its AIC sentence', () => {
    const ws = XLSX.read(usBytes).Sheets['Regional model'];
    const h = findRow(ws, 'Form');
    const forms = usJson.acrossSites!.mixedModels;
    const labels = {
      quadratic: 'Quadratic',
      quadraticPlateau: 'Quadratic-plateau',
      linearPlateau: 'Linear-plateau',
    };
    forms.forEach((f, i) => {
      expect(cell(ws, h + 1 + i, 0)!.v).toBe(labels[f.model]);
      expect(cell(ws, h + 1 + i, 4)!.v as number).toBeCloseTo(f.optimumRate, 9);
    });
    // The sheet's AICs are in kg/ha, the file's in bu/ac: the differences between forms agree,
    // since every form has the same plots (n·ln of the yield factor cancels).
    const aic = (i: number) => cell(ws, h + 1 + i, 1)!.v as number;
    expect(aic(1) - aic(0)).toBeCloseTo(forms[1].aic - forms[0].aic, 6);
    expect(XLSX.utils.sheet_to_csv(ws)).toContain(usJson.acrossSites!.mixedModelsSentence);
    // Each site-year's plateau (bu/ac) and join (lb N/ac) in the quadratic-plateau, from the
    // report's kg/ha: ÷ (K·56) and ÷ K, K kg/ha per lb/ac (NIST SP 811), 56 lb bushel (USDA).
    const K = 0.45359237 / (43560 * 0.3048 * 0.3048 * 1e-4);
    const curves = us.acrossSites!.mixedModels.find((f) => f.model === 'quadraticPlateau')!;
    const s0 = findRow(ws, 'Site-year', findRow(ws, 'Form'));
    curves.siteCurves.forEach((c, i) => {
      expect(cell(ws, s0 + 1 + i, 0)!.v).toBe(c.site);
      expect(cell(ws, s0 + 1 + i, 1)!.v as number).toBeCloseTo(c.plateauKgHa / (K * 56), 9);
      expect(cell(ws, s0 + 1 + i, 2)!.v as number).toBeCloseTo(c.joinKgHa / K, 9);
    });
  });

  it('puts every caution on the overview', () => {
    const ws = XLSX.read(usBytes).Sheets['Overview'];
    const text = XLSX.utils.sheet_to_csv(ws);
    for (const c of recommendationCautions) expect(text).toContain(c);
  });

  it('names the unit in the headers and shows tiny p-values as "< 0.001"', () => {
    const ws = XLSX.read(usBytes, { cellNF: true }).Sheets['Overview'];
    const h = findRow(ws, 'Site');
    const headers = [...Array(11).keys()].map((c) => String(cell(ws, h, c)?.v));
    expect(headers).toContain('Optimum rate (lb N/ac)');
    expect(headers).toContain('Yield at optimum (bu/ac)');
    const pCol = headers.indexOf('Intercept p');
    const p = cell(ws, h + 1, pCol)!;
    // The number is kept in full; only the shown text is rounded.
    expect(typeof p.v).toBe('number');
    expect(p.v as number).toBeLessThan(0.001);
    expect(p.w).toBe('< 0.001');
  });

  it("gives each site's optimum the closed form of its model at the price ratio, in lb N/ac", () => {
    const ws = XLSX.read(usBytes).Sheets['Overview'];
    const h = findRow(ws, 'Site');
    const pr = usJson.settings.priceRatio; // bu per lb N
    let checked = 0;
    us.sites.forEach((s, i) => {
      const js = usJson.sites[i];
      const m = js.models.find((x) => x.model === js.bestModel);
      if (!m || m.optimumRate === null) return;
      const p = m.params;
      let expected: number | null = null;
      // Design notes, "Economic optimum": one closed form per model.
      if (m.model === 'quadratic') expected = (pr - p.b) / (2 * p.c);
      if (m.model === 'quadraticPlateau') expected = p.x0 + pr / (2 * p.c);
      if (m.model === 'linearPlateau') expected = p.b > pr ? p.x0 : 0;
      if (m.model === 'exponential')
        expected = p.b * p.k > pr ? Math.log((p.b * p.k) / pr) / p.k : 0;
      if (expected === null) return;
      const lo = s.ratesKgHa[0] / KG_HA_PER_LB_AC;
      const hi = s.ratesKgHa[s.ratesKgHa.length - 1] / KG_HA_PER_LB_AC;
      expected = Math.min(Math.max(expected, lo), hi);
      expect(cell(ws, h + 1 + i, 0)?.v).toBe(s.site);
      // 0.01 lb/ac: rounding of the JSON's 12 digits only.
      expect(Math.abs((cell(ws, h + 1 + i, 3)?.v as number) - expected)).toBeLessThan(0.01);
      checked++;
    });
    expect(checked).toBeGreaterThanOrEqual(4);
  });

  it('shows rates as the demo generator wrote them (lb N/ac) and keeps excluded plots with their reason', () => {
    const wb = XLSX.read(usBytes);
    const trial = demoTrial();
    const rateOf = new Map(trial.cornTreatments.map((t) => [t.treatment, t.rateLbAc]));
    for (const site of ['Quillmere North', trial.quirks.excluded.site]) {
      const ws = wb.Sheets[sheetName(site, new Set())];
      const h = findRow(ws, 'Plot');
      const plots = trial.cornPlots.filter((p) => p.site === site);
      let matched = 0;
      for (let r = h + 1; cell(ws, r, 0)?.v !== undefined && cell(ws, r, 0)?.v !== ''; r++) {
        const label = String(cell(ws, r, 0)!.v);
        const src = plots.find((p) => p.plot === label);
        if (!src) continue;
        expect(cell(ws, r, 3)?.v as number).toBeCloseTo(rateOf.get(src.treatment)!, 9);
        if (label === trial.quirks.excluded.plot && site === trial.quirks.excluded.site) {
          expect(cell(ws, r, 6)?.v).toBe('no');
          expect(String(cell(ws, r, 7)?.v).length).toBeGreaterThan(0);
        }
        matched++;
      }
      expect(matched).toBe(plots.length);
    }
  });

  it('writes no floating-point noise into text cells (numbers stay numbers, text is rounded)', () => {
    for (const bytes of [usBytes, metricBytes]) {
      const wb = XLSX.read(bytes);
      for (const name of wb.SheetNames) {
        const ws = wb.Sheets[name];
        for (const key of Object.keys(ws)) {
          if (key.startsWith('!')) continue;
          const c = ws[key] as XLSX.CellObject;
          // Eight or more decimals in prose is binary noise such as 201.75320811500205.
          if (c.t === 's') expect(String(c.v), `${name}!${key}`).not.toMatch(/\d\.\d{8,}/);
        }
      }
    }
  });

  it('gives the same optima in kg N/ha at the same prices, converted by the exact factor', () => {
    const a = XLSX.read(usBytes).Sheets['Overview'];
    const b = XLSX.read(metricBytes).Sheets['Overview'];
    const ha = findRow(a, 'Site');
    const hb = findRow(b, 'Site');
    expect(cell(b, hb, 3)?.v).toBe('Optimum rate (kg N/ha)');
    for (let i = 1; i <= us.sites.length; i++) {
      const lb = cell(a, ha + i, 3)?.v as number | undefined;
      const kg = cell(b, hb + i, 3)?.v as number | undefined;
      if (lb === undefined) continue;
      // Same data, seed and prices: only the unit differs (relative 1e-6 for the solver's tolerance).
      expect(Math.abs(kg! - lb * KG_HA_PER_LB_AC)).toBeLessThan(1e-6 * Math.max(1, kg!) + 1e-6);
    }
  });

  it("gives each site's model table the join's profile interval in lb N/ac beside the optima", () => {
    const wb = XLSX.read(usBytes);
    const taken = new Set<string>();
    let checked = 0;
    for (const s of us.sites) {
      const ws = wb.Sheets[sheetName(s.site, taken)];
      const h = findRow(ws, 'Model');
      expect(cell(ws, h, 11)?.v).toBe('Join profile low (lb N/ac)');
      expect(cell(ws, h, 12)?.v).toBe('Join profile high (lb N/ac)');
      s.models.forEach((m, i) => {
        const low = cell(ws, h + 1 + i, 11)?.v;
        if (!m.joinProfile) return expect(low).toBeUndefined();
        expect(low as number).toBeCloseTo(m.joinProfile.lowKgHa / KG_HA_PER_LB_AC, 9);
        expect(cell(ws, h + 1 + i, 12)?.v as number).toBeCloseTo(
          m.joinProfile.highKgHa / KG_HA_PER_LB_AC,
          9,
        );
        checked++;
      });
    }
    expect(checked).toBeGreaterThan(0);
  });

  it('records the source file with its SHA-256 and the bootstrap seed on the provenance sheet', () => {
    const ws = XLSX.read(usBytes).Sheets['Provenance'];
    const text = XLSX.utils.sheet_to_csv(ws);
    expect(text).toContain('wrenhollow-n-trials-2025.xlsx');
    expect(text).toMatch(new RegExp(us.sources[0].sha256));
    expect(us.sources[0].sha256).toMatch(/^[0-9a-f]{64}$/);
    const seedRow = findRow(ws, 'Bootstrap seed');
    expect(cell(ws, seedRow, 1)?.v).toBe(11);
  });
});

describe('writeWorkbook read back by exceljs', () => {
  it('freezes headers, sets print areas, Letter for US units and A4 for metric', async () => {
    for (const [bytes, paper] of [
      [usBytes, 1],
      [metricBytes, 9],
    ] as const) {
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load(Buffer.from(bytes) as never);
      for (const ws of wb.worksheets) {
        expect(ws.pageSetup.paperSize, ws.name).toBe(paper);
        expect(ws.pageSetup.fitToWidth, ws.name).toBe(1);
      }
      const ov = wb.getWorksheet('Overview')!;
      expect(ov.views[0]).toMatchObject({ state: 'frozen' });
      expect(ov.pageSetup.printArea).toMatch(/^A1:K\d+$/);
      const site = wb.getWorksheet('Quillmere North')!;
      expect(site.views[0]).toMatchObject({ state: 'frozen', ySplit: 4 });
    }
  });

  it('embeds one chart per site sheet and formats p-value cells', async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(Buffer.from(usBytes) as never);
    for (const s of us.sites) {
      expect(wb.getWorksheet(sheetName(s.site, new Set()))!.getImages().length, s.site).toBe(1);
    }
    expect(wb.getWorksheet('Across sites')!.getImages().length).toBe(1);
    const ov = wb.getWorksheet('Overview')!;
    let formatted = 0;
    ov.eachRow((row) => {
      if (row.getCell(9).numFmt === P_VALUE_FORMAT) formatted++;
    });
    expect(formatted).toBe(us.sites.length);
  });

  it("shows each site's gain over the check as contrasts of a plain least-squares rate + block fit, in bu/lb N and kg/kg N", async () => {
    // kg grain/kg N → bu/lb N: × 0.45359237 kg N per lb N ÷ (56 × 0.45359237) kg per corn bushel
    // (USDA) = ÷ 56; metric quotes kg grain per kg N as it is. Yields: kg/ha → lb/ac (NIST SP 811
    // factor above), then ÷ 56 lb per bushel.
    const cases = [
      [usBytes, us, 'bu/lb N', 'bu/ac', 1 / 56, 1 / KG_HA_PER_LB_AC / 56],
      [metricBytes, metric, 'kg/kg N', 't/ha', 1, 1 / 1000],
    ] as const;
    for (const [bytes, report, slopeUnit, yieldUnit, perN, perYield] of cases) {
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.load(Buffer.from(bytes) as never);
      for (const s of report.sites) {
        const ws = wb.getWorksheet(sheetName(s.site, new Set()))!;
        let title = 0;
        ws.eachRow((row, n) => {
          if (String(row.getCell(1).value).startsWith('Gain over the check')) title = n;
        });
        expect(title, s.site).toBeGreaterThan(0);
        const header = ws.getRow(title + 1);
        expect(header.getCell(1).value).toBe(`Slope (${slopeUnit})`);
        expect(header.getCell(2).value).toBe(`95 % low (${slopeUnit})`);
        expect(header.getCell(4).value).toBe(`Gain at rate 0 (${yieldUnit})`);
        expect(header.getCell(8).value).toBe('p');
        expect(header.getCell(13).value).toBe('Reading');
        const row = ws.getRow(title + 2);
        const { slope, gainAtZero: a } = gainsOverBlockCheck(s.plots);
        const num = (c: number) => row.getCell(c).value as number;
        expect(num(1)).toBeCloseTo(slope.estimate * perN, 9);
        expect(num(2)).toBeCloseTo(slope.ciLow * perN, 9);
        expect(num(3)).toBeCloseTo(slope.ciHigh * perN, 9);
        expect(num(4)).toBeCloseTo(a.estimate * perYield, 8);
        expect(num(5)).toBeCloseTo(a.stdError * perYield, 8);
        expect(num(6)).toBeCloseTo(a.t, 9);
        expect(num(7)).toBe(a.df);
        expect(num(8)).toBeCloseTo(a.p, 12);
        expect(row.getCell(8).numFmt).toBe(P_VALUE_FORMAT);
        const g = s.responseOverCheck;
        if (!g.available) throw new Error(g.message);
        expect(row.getCell(13).value).toBe(
          {
            'from-zero': 'start from zero',
            'gain-at-zero': 'do not start from zero',
            bends: 'bend: a response that levels off',
          }[g.reading],
        );
      }
    }
  });
});

describe('the Recommendations sheet', () => {
  it('breaks the page before every recommendation but the first (the sheet XML, ECMA-376 rowBreaks)', () => {
    const files = unzipSync(usBytes);
    const book = strFromU8(files['xl/workbook.xml']);
    const names = [...book.matchAll(/<sheet [^>]*name="([^"]+)"/g)].map((m) => m[1]);
    const index = names.indexOf('Recommendations') + 1;
    const xml = strFromU8(files[`xl/worksheets/sheet${index}.xml`]);
    const breaks = Number(/<rowBreaks count="(\d+)"/.exec(xml)?.[1]);
    expect(breaks).toBe(reportGrowerPages(us).length - 1);
    expect(xml).toMatch(/<pageSetup [^>]*paperSize="1"[^>]*orientation="portrait"/);
  });
});

describe('sheetName', () => {
  it('drops the characters Excel forbids, keeps 31 characters and stays unique', () => {
    const taken = new Set<string>();
    expect(sheetName('North/East [2025]', taken)).toBe('North-East (2025)');
    expect(sheetName('north/east [2025]', taken)).toBe('north-east (2025) (2)');
    expect(sheetName("Orrin's Bend", taken)).toBe('Orrin’s Bend');
    const long = sheetName('A'.repeat(40), taken);
    expect(long.length).toBe(31);
    expect(sheetName('A'.repeat(40), taken)).toBe(`${'A'.repeat(27)} (2)`);
  });
});

describe('the model table of sites whose fits reach a limit', () => {
  // Simulated flat sites (shared/demo/simulatedSite, seeded): their exponential fits end at a
  // limit (no response, no plateau, full response), where b and k run off to 0 or infinity.
  // The table shows the limiting model's parameters and a dash for a blank one.
  it('writeWorkbook prints no "NaN" and no runaway parameter (every |value| under 10⁵)', async () => {
    const sim = simulatedTrial({ truths: Array(8).fill('flat'), seed: 4417 });
    const report = reportOf(
      sim.table,
      {
        units: { rate: 'kg/ha', yield: 'kg/ha' },
        unitSystem: 'metric',
        currency: 'USD',
        crop: 'corn',
        prices: {
          grainPrice: METRIC_GRAIN_PER_T,
          nutrientPrice: METRIC_N_PER_KG,
          product: null,
          defaulted: false,
        },
        boot: 0,
        seed: 1,
        blocks: 'fixed',
        intervalLevel: 0.9,
      },
      {
        tool: { name: 'Plotrate', version: '0.1.0' },
        createdAt: '2026-03-01T12:00:00Z',
        mapping: [],
      },
    );
    const statuses = new Set(
      report.sites.map((s) => s.models.find((m) => m.model === 'exponential')!.status),
    );
    expect(statuses).toEqual(
      new Set(['no-response', 'no-plateau', 'full-response-at-lowest-rate', 'ok']),
    );
    const wb = XLSX.read(await writeWorkbook(report));
    for (const site of report.sites) {
      const ws = wb.Sheets[sheetName(site.site, new Set())];
      const h = findRow(ws, 'Model');
      for (let r = h + 1; cell(ws, r, 0)?.v; r++) {
        const params = String(cell(ws, r, 2)?.v ?? '');
        expect(params).not.toMatch(/NaN|Infinity/);
        for (const m of params.matchAll(/= (-?[\d.e+-]+)/g)) {
          expect(Math.abs(Number(m[1])), `${site.site}: ${params}`).toBeLessThan(1e5);
        }
      }
    }
  });
});
