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
