// The closed-form join search (stationaryJoinPoints with polynomialRoots) against
// the plain definition: the profiled SSE evaluated on a fine grid of joins and by
// Brent's method in every interval. The closed form may only match or beat both.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { polynomialRoots } from '../shared/optimize/polynomialRoots';
import { prepareSite, type PreparedSite } from '../shared/models/prepareSite';
import { profileSolver } from '../shared/models/solve/profileSolver';
import { relaxedJoinBounds } from '../shared/models/solve/relaxedJoinBounds';
import { searchJoinPoint } from '../shared/models/solve/searchJoinPoint';
import { stationaryJoinPoints } from '../shared/models/solve/stationaryJoinPoints';
import { fitLinearPlateau } from '../shared/models/linearPlateau';
import { fitQuadraticPlateau } from '../shared/models/quadraticPlateau';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { simulatedTrial } from '../shared/demo/simulatedSite';
import { mulberry32 } from '../shared/demo/mulberry32';
import type { Plot } from '../shared/table/plotTable';

describe('polynomialRoots', () => {
  it('polynomialRoots finds every simple root inside the interval and none outside', () => {
    // (x − 0.2)(x − 0.5)(x − 0.9)(x + 1), expanded one factor at a time.
    let c = [1];
    for (const root of [0.2, 0.5, 0.9, -1]) {
      c = [...c, 0].map((ck, k) => (k > 0 ? c[k - 1] : 0) - root * ck);
    }
    const out = new Float64Array(4);
    const n = polynomialRoots(c, 4, 0, 1, out);
    expect(n).toBe(3);
    expect(out[0]).toBeCloseTo(0.2, 14);
    expect(out[1]).toBeCloseTo(0.5, 14);
    expect(out[2]).toBeCloseTo(0.9, 14);
  });

  it('polynomialRoots returns nothing for the zero polynomial or a root-free quadratic', () => {
    const out = new Float64Array(4);
    expect(polynomialRoots(new Float64Array(5), 4, 0, 1, out)).toBe(0);
    expect(polynomialRoots(Float64Array.of(1, 0, 1), 2, -5, 5, out)).toBe(0);
  });
});

/** Exact SSE at a join, g from the model's regressor. */
function sseAt(site: PreparedSite, degree: 1 | 2): (x0: number) => number {
  const solver = profileSolver(site, {
    intercept: true,
    sign: degree === 1 ? 'positive' : 'negative',
  });
  const g = new Float64Array(site.rates.length);
  return (x0) => {
    site.rates.forEach((r, j) => {
      g[j] = degree === 1 ? Math.min(r, x0) : r < x0 ? (r - x0) ** 2 : 0;
    });
    return solver.sse(g);
  };
}

const siteArb = fc.record({
  rates: fc.uniqueArray(fc.integer({ min: 0, max: 300 }), { minLength: 3, maxLength: 8 }),
  reps: fc.integer({ min: 1, max: 4 }),
  noise: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 32, maxLength: 32 }),
  join: fc.double({ min: 0, max: 320, noNaN: true }),
  degree: fc.constantFrom<1 | 2>(1, 2),
});

describe('searchJoinPoint with stationaryJoinPoints', () => {
  it('searchJoinPoint in closed form is never beaten by a grid of joins or by Brent', () => {
    fc.assert(
      fc.property(siteArb, ({ rates, reps, noise, join, degree }) => {
        const sorted = [...rates].sort((a, b) => a - b);
        const rateKgHa: number[] = [];
        const yieldKgHa: number[] = [];
        let k = 0;
        for (let b = 0; b < reps; b++) {
          for (const r of sorted) {
            rateKgHa.push(r);
            const d = Math.min(r - join, 0);
            const curve = degree === 1 ? 6000 + 20 * Math.min(r, join) : 9000 - 0.1 * d * d;
            yieldKgHa.push(curve + 400 * noise[k++ % noise.length]);
          }
        }
        const site = prepareSite({ rateKgHa, yieldKgHa }, 'none');
        const f = sseAt(site, degree);
        const closed = searchJoinPoint(
          site.rates,
          f,
          1e-10,
          relaxedJoinBounds(site, degree),
          stationaryJoinPoints(site, degree),
        );
        const brent = searchJoinPoint(site.rates, f, 1e-10);
        const scale = Math.max(closed.sse, 1e-6);
        expect(closed.sse).toBeLessThanOrEqual(brent.sse + 1e-12 * scale);
        const lo = site.rates[0];
        const hi = site.rates[site.rates.length - 1];
        for (let i = 0; i <= 400; i++) {
          expect(closed.sse).toBeLessThanOrEqual(f(lo + ((hi - lo) * i) / 400) + 1e-12 * scale);
        }
      }),
      { numRuns: 300, seed: 20261202 },
    );
  });
});

// The constrained global minimum of the plateau fits, checked by brute force: the profiled SSE
// of every join on a 1 kg/ha grid over the tested range, each an ordinary least-squares fit
// (shared/stats fitLeastSquares, a Householder QR checked against NIST StRD elsewhere) of the
// join's regressor and one dummy per block but the first; a regressor coefficient of the wrong
// sign (the curve must rise) leaves the flat fit, blocks only. The reported fit may not lose to
// any grid join. Sites: the simulation's flat truth (shared/demo/simulatedSite, seeded), whose
// noise alone makes the joins; the same with the first plot dropped, so blocks and rates no
// longer balance and the full-design search is used; and convex sites, rising faster at high
// rates, made here with the repo's seeded generator. Before the quadratic-plateau searched only
// its own domain, 2.1 % of flat sites were reported at the highest rate while a join inside the
// range fitted better (2.4 % with a plot missing); this check fails on such a fit.
describe('fitLinearPlateau and fitQuadraticPlateau find the constrained global minimum', () => {
  const GRID_STEP_KG_HA = 1;
  const FLAT_SITES = 200;

  /** Least SSE over the grid of joins, from plain least squares with block dummies. */
  function gridMinimum(
    data: { rateKgHa: number[]; yieldKgHa: number[]; block: string[] },
    regressor: (rateKgHa: number, joinKgHa: number) => number,
    sign: 1 | -1,
  ): number {
    const labels = [...new Set(data.block)];
    const dummies = labels
      .slice(1)
      .map((b) => Float64Array.from(data.block, (label) => (label === b ? 1 : 0)));
    const flat = fitLeastSquares({ columns: dummies, y: data.yieldKgHa, intercept: true }).sse;
    const lo = Math.min(...data.rateKgHa);
    const hi = Math.max(...data.rateKgHa);
    let best = flat;
    for (let x0 = lo; x0 <= hi + 1e-9; x0 += GRID_STEP_KG_HA) {
      const g = Float64Array.from(data.rateKgHa, (r) => regressor(r, x0));
      if (Math.max(...g) - Math.min(...g) < 1e-9) continue;
      const fit = fitLeastSquares({ columns: [g, ...dummies], y: data.yieldKgHa, intercept: true });
      if (sign * fit.coefficients[1].estimate > 0) best = Math.min(best, fit.sse);
    }
    return best;
  }

  const MODELS = [
    { fit: fitLinearPlateau, regressor: (r: number, x0: number) => Math.min(r, x0), sign: 1 },
    {
      fit: fitQuadraticPlateau,
      regressor: (r: number, x0: number) => Math.min(r - x0, 0) ** 2,
      sign: -1,
    },
  ] as const;

  function sitesOf(plots: readonly Plot[]) {
    const by = new Map<string, { rateKgHa: number[]; yieldKgHa: number[]; block: string[] }>();
    for (const p of plots) {
      const s = by.get(p.site) ?? { rateKgHa: [], yieldKgHa: [], block: [] };
      s.rateKgHa.push(p.rateKgHa!);
      s.yieldKgHa.push(p.yieldKgHa!);
      s.block.push(p.block!);
      by.set(p.site, s);
    }
    return [...by.values()];
  }

  const flatSites = sitesOf(
    simulatedTrial({ truths: Array(FLAT_SITES).fill('flat'), seed: 20261203 }).table.plots,
  );
  const convexSites = Array.from({ length: 60 }, (_, s) => {
    const rng = mulberry32(7100 + s);
    const data = { rateKgHa: [] as number[], yieldKgHa: [] as number[], block: [] as string[] };
    for (let b = 1; b <= 4; b++) {
      const offset = 250 * rng.normal();
      for (const r of [0, 40, 80, 120, 160, 200]) {
        data.rateKgHa.push(r);
        data.yieldKgHa.push((8000 + 0.06 * r * r + offset) * (1 + 0.065 * rng.normal()));
        data.block.push(String(b));
      }
    }
    return data;
  });
  const cases = [
    { name: 'flat sites', sites: flatSites, drop: false },
    { name: 'flat sites with one plot missing', sites: flatSites, drop: true },
    { name: 'convex sites', sites: convexSites, drop: false },
  ];
  for (const { name, sites, drop } of cases) {
    for (const m of MODELS) {
      it(`${m.fit.name} is never beaten by a grid of joins on ${name}`, () => {
        const misses: string[] = [];
        for (const site of sites) {
          const data = drop
            ? {
                rateKgHa: site.rateKgHa.slice(1),
                yieldKgHa: site.yieldKgHa.slice(1),
                block: site.block.slice(1),
              }
            : site;
          const fit = m.fit(data, { blocks: 'fixed' });
          const grid = gridMinimum(data, m.regressor, m.sign);
          if (fit.sse > grid * (1 + 1e-9)) misses.push(`${fit.status}: ${fit.sse} > ${grid}`);
        }
        expect(misses).toEqual([]);
      });
    }
  }
});
