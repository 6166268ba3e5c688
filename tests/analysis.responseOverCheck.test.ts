// Each site's response over the check, as the one pipeline (analyzeAcrossSites → analyzeSite)
// carries it, on a small invented site, against the arithmetic worked here by hand and an
// independent fitLeastSquares on the same gains built by hand.
import { describe, expect, it } from 'vitest';
import { analyzeAcrossSites, type SiteAnalysis } from '../shared/analysis/analyzeAcrossSites';
import type { ResponseOverCheckOutcome } from '../shared/analysis/siteResponseOverCheck';
import { fitLeastSquares } from '../shared/stats/leastSquares';
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

// Two blocks, each with its own zero-rate plot (kg/ha):
//   block 1: 0 → 5000, 50 → 5600, 100 → 6300, 150 → 6700   gains 600, 1300, 1700
//   block 2: 0 → 5400, 50 → 5900, 100 → 6500, 150 → 7300   gains 500, 1100, 1900
// Line through the origin on the gains: b = Σxg / Σx² = 835 000 / 70 000 = 11.928571 kg/kg N;
//   SSE₀ = Σg² − b·Σxg = 10 010 000 − 9 960 357.14 = 49 642.86 on 5 df,
//   SE(b) = √(9 928.57 / 70 000) = 0.376612; 95 % interval b ± 2.570582·SE (t₀.₉₇₅,₅, NIST/SEMATECH
//   t table) = 10.9605 to 12.8967.
// Straight line on the gains: slope 125 000 / 10 000 = 12.5, intercept 7 100/6 − 1 250 = −66.667 kg/ha;
//   SSE₁ = 45 833.33 on 4 df, SE(intercept) = √(11 458.33·(1/6 + 100²/10 000)) = 115.620,
//   t = −0.57660, F = (SSE₀ − SSE₁) / (SSE₁ / 4) = 0.33247 = t²: no gain at rate zero.
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

describe("analyzeSite's response over the check", () => {
  const s = siteOf(invented);
  const r = outcome(s);
  const x = [50, 100, 150, 50, 100, 150];
  const g = [600, 1300, 1700, 500, 1100, 1900];
  const origin = fitLeastSquares({ columns: [x], y: g, intercept: false });
  const line = fitLeastSquares({ columns: [x], y: g, intercept: true });

  it('gives the slope over the check and its 95 % interval worked by hand', () => {
    expect(r.gains).toBe(6);
    expect(r.slopeKgPerKg).toBeCloseTo(835000 / 70000, 10);
    expect(r.slopeSeKgPerKg).toBeCloseTo(0.376612, 6);
    expect(r.slopeCiKgPerKg[0]).toBeCloseTo(10.9605, 4);
    expect(r.slopeCiKgPerKg[1]).toBeCloseTo(12.8967, 4);
    expect(r.confidenceLevel).toBe(0.95);
  });

  it('equals an independent fitLeastSquares on the hand-built gains', () => {
    const b = origin.coefficients[0];
    expect(r.slopeKgPerKg).toBeCloseTo(b.estimate, 9);
    expect(r.slopeSeKgPerKg).toBeCloseTo(b.stdError, 9);
    expect(r.slopeCiKgPerKg[0]).toBeCloseTo(b.ciLow, 9);
    expect(r.slopeCiKgPerKg[1]).toBeCloseTo(b.ciHigh, 9);
    const a = line.coefficients[0];
    expect(r.gainAtZeroKgHa).toBeCloseTo(a.estimate, 8);
    expect(r.gainAtZeroSeKgHa).toBeCloseTo(a.stdError, 8);
    expect(r.t).toBeCloseTo(a.t, 9);
    expect(r.p).toBeCloseTo(a.p, 9);
    expect(r.F).toBeCloseTo((origin.sse - line.sse) / (line.sse / line.dfResidual), 9);
  });

  it('tests the gain at rate zero as worked by hand: t = −0.577, F = t², no bias', () => {
    expect(r.gainAtZeroKgHa).toBeCloseTo(-66.6667, 3);
    expect(r.gainAtZeroSeKgHa).toBeCloseTo(115.62, 2);
    expect(r.t).toBeCloseTo(-0.5766, 4);
    expect(r.F).toBeCloseTo(0.33247, 5);
    expect(r.F).toBeCloseTo(r.t * r.t, 10);
    expect([r.df1, r.df2]).toEqual([1, 4]);
    expect(r.p).toBeGreaterThan(0.5);
    expect(r.biasPresent).toBe(false);
  });

  it('says a gain at rate zero is present when every fertilized plot gains 800 kg/ha more', () => {
    // Gains 1400, 2100, 2500, 1300, 1900, 2700: the straight line's intercept is 733.3 kg/ha.
    const lifted = invented.map(([b, x0, y]): [string, number, number] => [
      b,
      x0,
      x0 > 0 ? y + 800 : y,
    ]);
    const t = outcome(siteOf(lifted));
    const a = fitLeastSquares({ columns: [x], y: g.map((v) => v + 800), intercept: true })
      .coefficients[0];
    expect(t.gainAtZeroKgHa).toBeCloseTo(733.333, 3);
    expect(t.t).toBeCloseTo(a.t, 9);
    expect(t.p).toBeLessThan(0.05);
    expect(t.biasPresent).toBe(true);
  });

  it('survives structuredClone with the rest of the site', () => {
    expect(structuredClone(s).responseOverCheck).toEqual(s.responseOverCheck);
  });
});

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
