// Each site's response over the check, as the one pipeline (analyzeAcrossSites → analyzeSite)
// carries it: the gains over each block's check read as contrasts of the rate means of the rate
// + block model, against R 4.2.2 (tests/fixtures/stats-r/make-gain-contrast-reference.R:
// lm(y ~ factor(rate) + factor(block)) with each contrast as a coefficient vector, and anova()
// of the model whose gains are a straight line for the curvature), on invented trials.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeAcrossSites, type SiteAnalysis } from '../shared/analysis/analyzeAcrossSites';
import type { ResponseOverCheckOutcome } from '../shared/analysis/siteResponseOverCheck';
import { fitRateBlockModel, type RateBlockModel } from '../shared/stats/rateBlockModel';
import { rateContrast, rateContrastsF } from '../shared/stats/rateContrast';
import { StatsInputError } from '../shared/stats/errors';
import type { Plot, PlotTable } from '../shared/table/plotTable';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };

/** Invented plots of one site: [block, rate kg/ha, yield kg/ha]. */
function table(rows: [string | null, number, number][], site = 'Hazel Ford'): PlotTable {
  const plots: Plot[] = rows.map(([block, rateKgHa, yieldKgHa], i) => ({
    id: `invented||${i + 2}`,
    site,
    year: null,
    block,
    plotLabel: null,
    treatment: null,
    rateKgHa,
    yieldKgHa,
    moisturePct: null,
    testWeight: null,
    notes: null,
    groups: {},
    excluded: null,
    original: {},
  }));
  return { crop: 'corn', standardMoisturePct: 15.5, plots, sources: [] };
}

function siteOf(rows: [string | null, number, number][]): SiteAnalysis {
  return analyzeAcrossSites(table(rows), { prices }).sites[0];
}

function outcome(s: SiteAnalysis): ResponseOverCheckOutcome {
  if ('problem' in s.responseOverCheck) throw new Error(s.responseOverCheck.problem);
  return s.responseOverCheck;
}

interface RCase {
  name: string;
  rate: number[];
  block: string[];
  y: number[];
  slope: { estimate: [number]; se: [number]; ci: [number, number]; df: number };
  gainAtZero: { estimate: [number]; se: [number]; t: [number]; df: number; p: [number] };
  curvature: { F: [number]; df1: number; df2: number; p: [number] };
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/stats-r/gain-contrast-reference.json', import.meta.url), 'utf8'),
) as { rVersion: string; cases: RCase[] };

function close(actual: number, expected: number, relative = 1e-9): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(relative * Math.abs(expected));
}

describe('the gain over the check against R 4.2.2 (make-gain-contrast-reference.R)', () => {
  it('records R 4.2.2', () => expect(reference.rVersion).toMatch(/^R version 4\.2\.2/));

  // What each invented trial should read as: a response that levels off bends, a straight
  // response with every fertilized plot lifted by 800 kg/ha has a gain at rate zero.
  const readings: Record<string, ResponseOverCheckOutcome['reading']> = {
    'Lark Hill': 'bends',
    'Lark Hill, one plot lost': 'bends',
    'Otter Bank': 'gain-at-zero',
    'Quarry Lane': 'bends',
  };
  for (const c of reference.cases) {
    it(`siteResponseOverCheck on ${c.name}: slope, gain at rate zero and curvature as R's contrasts`, () => {
      const r = outcome(siteOf(c.rate.map((x, i) => [c.block[i], x, c.y[i]])));
      close(r.slopeKgPerKg, c.slope.estimate[0]);
      close(r.slopeSeKgPerKg, c.slope.se[0]);
      close(r.slopeCiKgPerKg[0], c.slope.ci[0]);
      close(r.slopeCiKgPerKg[1], c.slope.ci[1]);
      close(r.gainAtZeroKgHa, c.gainAtZero.estimate[0]);
      close(r.gainAtZeroSeKgHa, c.gainAtZero.se[0]);
      close(r.t, c.gainAtZero.t[0]);
      expect([r.df1, r.df2]).toEqual([1, c.gainAtZero.df]);
      close(r.p, c.gainAtZero.p[0], 1e-6);
      close(r.F, c.gainAtZero.t[0] ** 2);
      expect(r.curvature).not.toBeNull();
      close(r.curvature!.F, c.curvature.F[0]);
      expect([r.curvature!.df1, r.curvature!.df2]).toEqual([c.curvature.df1, c.curvature.df2]);
      close(r.curvature!.p, c.curvature.p[0], 1e-6);
      expect(r.reading).toBe(readings[c.name]);
      expect(r.biasPresent).toBe(r.reading === 'gain-at-zero');
      expect(r.gains).toBe(c.rate.filter((x) => x > 0).length);
    });
  }

  it('survives structuredClone with the rest of the site', () => {
    const c = reference.cases[0];
    const s = siteOf(c.rate.map((x, i) => [c.block[i], x, c.y[i]]));
    expect(structuredClone(s).responseOverCheck).toEqual(s.responseOverCheck);
  });
});

describe('rateContrast and rateContrastsF', () => {
  const c = reference.cases[0];
  const model = fitRateBlockModel({ rateKgHa: c.rate, yieldKgHa: c.y, block: c.block });
  if ('problem' in model) throw new Error(model.problem);
  const m: RateBlockModel = model;

  it('a difference of two rate means has the RCBD standard error √(2·MSE / blocks)', () => {
    // Steel, Torrie & Dickey §9.3: the SE of a difference of two treatment means of a complete
    // block design with r blocks is √(2 s² / r).
    const d = rateContrast(m, [0, 0, 0, -1, 1, 0]);
    close(d.estimate, m.rateMeans[4].meanKgHa - m.rateMeans[3].meanKgHa);
    close(d.stdError, Math.sqrt((2 * m.residual.ms) / 4));
    expect(d.df).toBe(m.residual.df);
  });

  it('one contrast tested alone by rateContrastsF gives F = t²', () => {
    const k = [-1, 0.2, 0.2, 0.2, 0.2, 0.2];
    close(rateContrastsF(m, [k]).F, rateContrast(m, k).t ** 2);
  });

  it('refuses coefficients that are not a contrast, naming the rule', () => {
    expect(() => rateContrast(m, [1, 0, 0, 0, 0, 0])).toThrow(StatsInputError);
    expect(() => rateContrast(m, [1, 0, 0, 0, 0, 0])).toThrow(/sum to 0/);
    expect(() => rateContrast(m, [-1, 1])).toThrow(/one per rate/);
    expect(() =>
      rateContrastsF(m, [
        [-1, 1, 0, 0, 0, 0],
        [-2, 2, 0, 0, 0, 0],
      ]),
    ).toThrow(/not linearly independent/);
  });
});

// Two blocks, each with its own zero-rate plot (kg/ha).
const invented: [string, number, number][] = [
  ['1', 0, 5000],
  ['1', 50, 5600],
  ['1', 100, 6300],
  ['1', 150, 6700],
  ['2', 0, 5400],
  ['2', 50, 5900],
  ['2', 100, 6500],
  ['2', 150, 7300],
];

describe('a site with no response over the check says why', () => {
  it('without blocks', () => {
    const s = siteOf(invented.map(([, x0, y]) => [null, x0, y]));
    expect(s.responseOverCheck).toEqual({ problem: expect.stringMatching(/block/) });
  });

  it('when a block has no zero-rate plot, naming it', () => {
    const s = siteOf([...invented.slice(0, 4), ...invented.slice(5)]);
    expect(s.responseOverCheck).toEqual({
      problem: expect.stringMatching(/No zero-rate plot in block 2\b/),
    });
  });

  it('with too few gains (one fertilized rate)', () => {
    const s = siteOf(invented.filter(([, x0]) => x0 === 0 || x0 === 100));
    expect(s.responseOverCheck).toEqual({
      problem: expect.stringMatching(/two different non-zero rates/),
    });
  });
});
