// Quality checks on small generated tables. Expected CVs and residuals come from
// the balanced two-way ANOVA by hand (Steel & Torrie, Principles and Procedures
// of Statistics, ch. 9: residual = y − treatment mean − block mean + grand mean,
// df = (t − 1)(b − 1)), not from the least-squares code under test.
import { parseAddress } from '../shared/table/cellAddress';
import { describe, expect, it } from 'vitest';
import { checkQuality, checkDesign, checkValues, fitTreatmentBlock } from '../shared/quality';
import { mulberry32 } from '../shared/demo';
import { analyzablePlots, type Plot, type PlotTable } from '../shared/table/plotTable';

const ratesKgHa = [0, 50, 100, 150, 200, 250];

function plot(
  site: string,
  block: number,
  rate: number,
  y: number,
  row: number,
  extra: Partial<Plot> = {},
): Plot {
  const ref = (col: string) => ({
    file: 'gen.xlsx',
    sheet: site,
    ...parseAddress(`${col}${row}`)!,
  });
  return {
    id: `gen.xlsx|${site}|${row}`,
    site,
    year: 2025,
    block: String(block),
    plotLabel: `${block}0${ratesKgHa.indexOf(rate) + 1}`,
    treatment: String(ratesKgHa.indexOf(rate) + 1),
    rateKgHa: rate,
    yieldKgHa: y,
    moisturePct: 18,
    testWeight: null,
    notes: null,
    groups: {},
    excluded: null,
    original: {
      yield: { text: String(y), ...ref('D') },
      rate: { text: String(rate), ...ref('C') },
      plot: { text: `${block}0${ratesKgHa.indexOf(rate) + 1}`, ...ref('A') },
      moisture: { text: '18', ...ref('E') },
    },
    ...extra,
  };
}

function site(name: string, seed: number, cv = 0.06): Plot[] {
  const rng = mulberry32(seed);
  const out: Plot[] = [];
  let row = 2;
  for (let b = 1; b <= 4; b++) {
    const be = 300 * rng.normal();
    for (const r of ratesKgHa) {
      const mean = 8000 + 4000 * (1 - Math.exp(-0.015 * r)) + be;
      out.push(plot(name, b, r, mean * (1 + cv * rng.normal()), row++));
    }
  }
  return out;
}

const table = (plots: Plot[]): PlotTable => ({
  crop: 'corn',
  standardMoisturePct: 15.5,
  plots,
  sources: [],
});

function handAnova(plots: Plot[]) {
  const t = ratesKgHa.length;
  const b = 4;
  const y = (bi: number, ti: number) =>
    plots.find((p) => p.block === String(bi + 1) && p.rateKgHa === ratesKgHa[ti])!.yieldKgHa!;
  let grand = 0;
  const tm = new Array(t).fill(0);
  const bm = new Array(b).fill(0);
  for (let i = 0; i < b; i++)
    for (let j = 0; j < t; j++) {
      grand += y(i, j) / (b * t);
      tm[j] += y(i, j) / b;
      bm[i] += y(i, j) / t;
    }
  let sse = 0;
  const resid = (i: number, j: number) => y(i, j) - tm[j] - bm[i] + grand;
  for (let i = 0; i < b; i++) for (let j = 0; j < t; j++) sse += resid(i, j) ** 2;
  const df = (t - 1) * (b - 1);
  return { grand, mse: sse / df, df, resid, h: 1 / b + 1 / t - 1 / (b * t) };
}

describe('fitTreatmentBlock', () => {
  it('gives the CV of the balanced two-way ANOVA', () => {
    const plots = site('Alpha', 11);
    const m = fitTreatmentBlock(plots);
    if ('reason' in m) throw new Error(m.reason);
    const a = handAnova(plots);
    expect(m.fit.dfResidual).toBe(a.df);
    expect(m.cvPct).toBeCloseTo((100 * Math.sqrt(a.mse)) / a.grand, 8);
  });
});

describe('checkQuality', () => {
  it('flags an injected outlier by its studentized residual and nothing else in a clean site', () => {
    const clean = site('Alpha', 5, 0.04);
    expect(checkQuality(table(clean)).filter((f) => f.code === 'outlier')).toHaveLength(0);
    const bad = clean.map((p) =>
      p.block === '2' && p.rateKgHa === 100 ? { ...p, yieldKgHa: p.yieldKgHa! * 0.6 } : p,
    );
    const out = checkQuality(table(bad)).filter((f) => f.code === 'outlier');
    expect(out).toHaveLength(1);
    expect(out[0].plotIds).toEqual([bad.find((p) => p.block === '2' && p.rateKgHa === 100)!.id]);
    expect(out[0].refs[0].cell).toBe('D10');
    // Externally studentized residual by hand: r = e/(s√(1−h)), t = r√((df−1)/(df−r²)) (Belsley, Kuh & Welsch 1980).
    const a = handAnova(bad);
    const e = a.resid(1, 2);
    const r = e / Math.sqrt(a.mse * (1 - a.h));
    const tExt = r * Math.sqrt((a.df - 1) / (a.df - r * r));
    expect(out[0].value!).toBeCloseTo(tExt, 8);
    expect(out[0].severity).toBe('warning');
  });

  it('reports each site’s CV and warns above the threshold', () => {
    const f = checkQuality(table([...site('Alpha', 3, 0.05), ...site('Beta', 4, 0.25)]), {
      cvWarnPct: 15,
    });
    const alpha = f.find(
      (x) => x.site === 'Alpha' && (x.code === 'trial-cv' || x.code === 'high-cv'),
    )!;
    const beta = f.find(
      (x) => x.site === 'Beta' && (x.code === 'trial-cv' || x.code === 'high-cv'),
    )!;
    expect(alpha.code).toBe('trial-cv');
    expect(beta.code).toBe('high-cv');
    expect(beta.message).toMatch(/Beta: the trial CV is \d+(\.\d)? %, above 15 %/);
    expect(beta.value!).toBeGreaterThan(15);
  });

  it('finds duplicate plot numbers, a missing plot and unequal replication', () => {
    const plots = site('Gamma', 9);
    const dropped = plots.filter((p) => !(p.block === '3' && p.rateKgHa === 150));
    const dup = {
      ...dropped[1],
      id: 'gen.xlsx|Gamma|99',
      original: {
        ...dropped[1].original,
        plot: {
          text: dropped[0].plotLabel!,
          file: 'gen.xlsx',
          sheet: 'Gamma',
          row: 99,
          col: 1,
        },
      },
      plotLabel: dropped[0].plotLabel,
      excluded: { reason: 'copied row', by: 'user' as const },
    };
    const f = checkDesign(table([...dropped, dup]));
    const d = f.find((x) => x.code === 'duplicate-plot')!;
    expect(d.refs.map((r) => r.cell)).toEqual(['A2', 'A99']);
    const m = f.find((x) => x.code === 'missing-plot')!;
    expect(m.message).toBe(
      'Gamma: block 3 has no plot of treatment 4 (150 kg N/ha); the site is unbalanced, so block-adjusted means are used.',
    );
    expect(f.find((x) => x.code === 'unequal-replication')!.message).toMatch(
      /treatment 4 \(150 kg N\/ha\) has 3 usable plots where the other rates have 4/,
    );
  });

  it('says that a rate with a single plot leaves its noise out of the interval', () => {
    // Resampling within rates (shared/economics/bootstrapDraws) draws a rate's one plot every
    // time: only replicated rates vary.
    const plots = site('Epsilon', 4).filter((p) => !(p.rateKgHa === 150 && p.block !== '1'));
    const f = checkDesign(table(plots)).find((x) => x.code === 'unequal-replication')!;
    expect(f.message).toMatch(
      /has 1 usable plot where the other rates have 4\. A rate with one plot/,
    );
    const three = site('Zeta', 4).filter((p) => !(p.rateKgHa === 150 && p.block === '1'));
    const g = checkDesign(table(three)).find((x) => x.code === 'unequal-replication')!;
    expect(g.message).not.toMatch(/A rate with one plot/);
  });

  it('names a short rate by the number typed in a lb/ac sheet beside its kg N/ha', () => {
    // 80 lb/ac is 89.7 kg/ha (1 lb/ac = 1.12085 kg/ha, NIST SP 811 conversion factors).
    const lbPerAc = 80;
    const kgHa = lbPerAc * 1.12085;
    const plots = site('Delta', 11).map((p) => ({
      ...p,
      treatment: null,
      rateKgHa: p.rateKgHa === 100 ? kgHa : p.rateKgHa,
      original: {
        ...p.original,
        rate: { ...p.original.rate!, text: p.rateKgHa === 100 ? '80' : p.original.rate!.text },
      },
    }));
    const short = plots.filter((p) => !(p.block === '2' && p.rateKgHa === kgHa));
    const f = checkDesign(table(short)).find((x) => x.code === 'unequal-replication')!;
    expect(f.message).toMatch(
      /rate “80” \(89\.7 kg N\/ha\) has 3 usable plots where the other rates have 4/,
    );
  });

  it('flags text in a numeric cell, negative and implausible values, and odd moistures', () => {
    const plots = site('Delta', 2);
    const ref = (c: string) => ({ file: 'gen.xlsx', sheet: 'Delta', ...parseAddress(c)! });
    plots[0] = {
      ...plots[0],
      yieldKgHa: null,
      original: { ...plots[0].original, yield: { text: 'lodged', ...ref('D3') } },
    };
    plots[1] = { ...plots[1], yieldKgHa: -5 };
    plots[2] = { ...plots[2], yieldKgHa: 30000 }; // above the 25 000 kg/ha corn bound (about 478 bu/ac)
    plots[3] = { ...plots[3], moisturePct: 0.18 };
    plots[4] = {
      ...plots[4],
      yieldKgHa: null,
      original: { ...plots[4].original, yield: { text: 'NA', ...ref('D6') } },
    };
    const f = checkValues(table(plots), [5, 40]);
    const codes = f.map((x) => x.code).sort();
    expect(codes).toEqual([
      'implausible-yield',
      'missing-value',
      'moisture-out-of-range',
      'negative-value',
      'not-a-number',
    ]);
    expect(f.find((x) => x.code === 'not-a-number')!.message).toBe(
      'gen.xlsx › Delta › D3 should hold the yield as a number but says "lodged"; the plot has no yield until the cell is corrected.',
    );
    expect(f.find((x) => x.code === 'not-a-number')!.severity).toBe('error');
  });

  it('refuses yields and rates no trial can have, and names the cell', () => {
    // Bounds: shared/table/plotTable.ts impossibleValue (common practice, stated there).
    const plots = site('Zeta', 1);
    plots[0] = { ...plots[0], yieldKgHa: 1e308 };
    plots[1] = { ...plots[1], rateKgHa: 50_000 };
    const t = table(plots);
    const f = checkValues(t, [5, 40]);
    expect(f.map((x) => x.code)).toEqual(['impossible-value', 'impossible-value']);
    expect(f.every((x) => x.severity === 'error')).toBe(true);
    expect(f[1].message).toMatch(/the rate is beyond any practice .* left out of the fits/);
    const used = analyzablePlots(t).map((p) => p.id);
    expect(used).not.toContain(plots[0].id);
    expect(used).not.toContain(plots[1].id);
    expect(used).toHaveLength(plots.length - 2);
  });

  it('leaves the table unchanged and refuses a bad threshold', () => {
    const t = table(site('Eps', 1));
    const before = JSON.stringify(t);
    checkQuality(t);
    expect(JSON.stringify(t)).toBe(before);
    expect(() => checkQuality(t, { cvWarnPct: 0 })).toThrow(
      /cvWarnPct must be a positive percentage; got 0/,
    );
  });

  it('says when a site is too small to fit', () => {
    const f = checkQuality(table(site('Zeta', 1).slice(0, 6)));
    expect(f.find((x) => x.code === 'model-not-fitted')?.message).toMatch(
      /Zeta: the trial CV and outliers cannot be computed/,
    );
  });
});
