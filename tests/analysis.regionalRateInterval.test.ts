// The regional rate's interval from resampling site-years (shared/analysis/regionalRateInterval)
// against its exact distribution: with ten site-years of two kinds (five each), a resample is
// fixed by how many of the first kind it draws, k ~ Binomial(10, 1/2), so the best rate of every
// possible resample and its probability can be listed outright, and the resampled quantiles must
// agree with the exact ones up to Monte Carlo error. Invented gain curves.
//
// The interval leaves Φ(−t(0.95, n − 1)) of the resamples out on each side at 90 % (the expanded
// percentile interval); the tail is computed here with jstat's normal CDF and Student quantile,
// an implementation independent of shared/stats/distributions.
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { regionalAtPrices } from '../shared/analysis/regionalAnalysis';
import { prepareRegionalReturn } from '../shared/analysis/regionalReturn';
import { candidateRates } from '../shared/economics/shortfallRule';
import { rateGrid } from '../shared/analysis/rateGrid';
import {
  regionalRateInterval,
  resampleRegionalGains,
} from '../shared/analysis/regionalRateInterval';

const steep = (x: number) => 40 * x - 0.12 * x * x; // kg/ha
const shallow = (x: number) => 25 * x - 0.1 * x * x;
const grid = rateGrid(0, 250, 1);
const sites = Array.from({ length: 10 }, (_, i) => ({
  site: `S${i}`,
  gainKgHa: i < 5 ? steep : shallow,
}));
const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 1.4 };

/** A resample's net return at x when it drew k site-years of the first kind of n = 10. */
function resampleReturn(k: number, x: number): number {
  const n = 10;
  const stretch = Math.sqrt(n / (n - 1));
  const sample = (k * steep(x) + (n - k) * shallow(x)) / n;
  const all = (steep(x) + shallow(x)) / 2;
  const gain = all + stretch * (sample - all);
  return prices.grainPricePerKg * gain - prices.nutrientPricePerKg * x;
}

/** Binomial(10, 1/2) probabilities of k = 0 … 10. */
function binomialTen(): number[] {
  const p: number[] = [];
  let choose = 1;
  for (let k = 0; k <= 10; k++) {
    if (k > 0) choose = (choose * (10 - k + 1)) / k;
    p.push(choose / 2 ** 10);
  }
  return p;
}

/** The exact distribution of the resampled best rate: k of the first kind in 10 draws. */
function exactBestRates(): { rate: number; p: number }[] {
  return binomialTen()
    .map((p, k) => {
      let best = 0;
      let bestReturn = -Infinity;
      for (const x of grid) {
        const r = resampleReturn(k, x);
        if (r > bestReturn) {
          bestReturn = r;
          best = x;
        }
      }
      return { rate: best, p };
    })
    .sort((a, b) => a.rate - b.rate);
}

/** The rate at which the exact CDF first reaches q. */
function exactQuantile(dist: { rate: number; p: number }[], q: number): number {
  let c = 0;
  for (const d of dist) {
    c += d.p;
    if (c >= q - 1e-12) return d.rate;
  }
  return dist[dist.length - 1].rate;
}

/** The share left out on each side of a central `level` interval from n site-years (jstat). */
function expandedTail(level: number, n: number): number {
  return jStat.normal.cdf(-jStat.studentt.inv(1 - (1 - level) / 2, n - 1), 0, 1);
}

describe('regionalRateInterval', () => {
  it('agrees with the exact distribution of the resampled best rate', () => {
    const prepared = prepareRegionalReturn(sites, grid);
    const resampled = resampleRegionalGains(prepared, 4000, 7, 0.9)!;
    const interval = regionalRateInterval(resampled, prices, 5, [0, 100, 150]);
    const dist = exactBestRates();
    // The tail for 10 site-years is 3.3 %; the Monte Carlo error of that quantile from 4,000
    // draws is about ±0.6 % in probability.
    const tail = expandedTail(0.9, 10);
    expect(interval.lowKgHa).toBeGreaterThanOrEqual(exactQuantile(dist, tail - 0.007));
    expect(interval.lowKgHa).toBeLessThanOrEqual(exactQuantile(dist, tail + 0.007));
    expect(interval.highKgHa).toBeGreaterThanOrEqual(exactQuantile(dist, 1 - tail - 0.007));
    expect(interval.highKgHa).toBeLessThanOrEqual(exactQuantile(dist, 1 - tail + 0.007));
    expect(interval.highKgHa).toBeGreaterThan(interval.lowKgHa);
    expect(interval).toMatchObject({ level: 0.9, resamples: 4000, siteYears: 10 });
  });

  it('reads the same resamples along the grid: the band of the mean return and the chance of falling short', () => {
    const prepared = prepareRegionalReturn(sites, grid);
    const resampled = resampleRegionalGains(prepared, 4000, 11, 0.9)!;
    const tolerance = 5;
    const { alongGrid } = regionalRateInterval(resampled, prices, tolerance, [100]);
    const pk = binomialTen();
    const tail = expandedTail(0.9, 10);
    for (const x of [60, 100, 137, 200]) {
      const j = grid.indexOf(x);
      // Exact: the return at x is increasing in k (steep > shallow for x > 0), so its quantiles
      // are those of k; the chance of falling short sums P(k) over the k where x is short.
      const byReturn = pk.map((p, k) => ({ r: resampleReturn(k, x), p })).sort((a, b) => a.r - b.r);
      const at = (q: number) => {
        let c = 0;
        for (const d of byReturn) if ((c += d.p) >= q - 1e-12) return d.r;
        return byReturn[byReturn.length - 1].r;
      };
      expect(alongGrid.lowPerHa[j]).toBeGreaterThanOrEqual(at(tail - 0.007) - 1e-9);
      expect(alongGrid.lowPerHa[j]).toBeLessThanOrEqual(at(tail + 0.007) + 1e-9);
      expect(alongGrid.highPerHa[j]).toBeGreaterThanOrEqual(at(1 - tail - 0.007) - 1e-9);
      expect(alongGrid.highPerHa[j]).toBeLessThanOrEqual(at(1 - tail + 0.007) + 1e-9);
      let short = 0;
      pk.forEach((p, k) => {
        const best = Math.max(...Array.from(grid, (g) => resampleReturn(k, g)));
        if (resampleReturn(k, x) < best - tolerance) short += p;
      });
      // Monte Carlo SE of a share from 4,000 draws is at most 0.008; four SEs.
      expect(Math.abs(alongGrid.shortShare[j] - short)).toBeLessThan(0.032);
    }
  });

  it('leaves out Φ(−t(0.95, n − 1)) of the best rates on each side, near 5 % for many site-years', () => {
    // 1,000 resamples whose best rates are 0, 1, …, 999 kg/ha (each one's gain peaks at its own
    // grid rate), so each end is the type 7 quantile of 0 … 999 at the tail: 999 · tail.
    const wide = rateGrid(0, 999, 1);
    const meanGains = Array.from({ length: 1000 }, (_, b) => {
      const gain = new Float64Array(wide.length);
      gain[b] = 1e9;
      return gain;
    });
    for (const siteYears of [12, 1000]) {
      const interval = regionalRateInterval(
        { gridKgHa: wide, meanGains, siteYears, level: 0.9 },
        prices,
        5,
        [],
      );
      const tail = expandedTail(0.9, siteYears);
      // jstat's Student quantile and the engine's agree to about 1e-8 in the tail's probability.
      expect(interval.lowKgHa).toBeCloseTo(999 * tail, 4);
      expect(interval.highKgHa).toBeCloseTo(999 * (1 - tail), 4);
    }
    // 12 site-years: 3.6 % a side rather than 5 %.
    expect(expandedTail(0.9, 12)).toBeCloseTo(0.0363, 3);
  });

  it('collapses to the best rate when every site-year is alike, and shares 1 within tolerance', () => {
    const same = Array.from({ length: 8 }, (_, i) => ({ site: `T${i}`, gainKgHa: steep }));
    const resampled = resampleRegionalGains(prepareRegionalReturn(same, grid), 200, 3, 0.9)!;
    const interval = regionalRateInterval(resampled, prices, 5, [0, 141]);
    // Best rate of 0.2·(40x − 0.12x²) − 1.4x: x = (40 − 7)/0.24 = 137.5, on the grid 137 or 138.
    expect(interval.lowKgHa).toBe(interval.highKgHa);
    expect(Math.abs(interval.lowKgHa - 137.5)).toBeLessThanOrEqual(0.5);
    expect(interval.withinTolerance).toEqual([
      { rateKgHa: 0, share: 0 },
      { rateKgHa: 141, share: 1 },
    ]);
  });

  it('gives no resamples for a single site-year or none asked for', () => {
    const one = prepareRegionalReturn([sites[0]], grid);
    expect(resampleRegionalGains(one, 200, 1, 0.9)).toBeNull();
    expect(resampleRegionalGains(prepareRegionalReturn(sites, grid), 0, 1, 0.9)).toBeNull();
  });

  it('is made when first read at a new price, once, and is the interval of the priced rate', () => {
    // regionalAtPrices defers it (keptOnFirstRead): the one-site step re-prices without it.
    const prepared = prepareRegionalReturn(sites, grid);
    const resampled = resampleRegionalGains(prepared, 200, 5, 0.9)!;
    const priced = regionalAtPrices({ prepared, atTestedRates: prepared, resampled }, prices, 5);
    expect(Object.getOwnPropertyDescriptor(priced, 'rateInterval')!.get).toBeDefined();
    const interval = priced.rateInterval!;
    expect(priced.rateInterval).toBe(interval);
    const best = priced.regional.bestRateKgHa;
    expect(interval).toEqual(
      regionalRateInterval(resampled, prices, 5, candidateRates(Array.from(grid), best)),
    );
    expect(structuredClone(priced).rateInterval).toEqual(interval);
  });
});
