// The regional mixed model on a file the caps allow: 300,000 plots (4 site-years × 75,000),
// more than the arguments a spread can pass (Math.min(...rates) overflowed the stack past about
// 100,000 plots and the run ended "analysis failed: Maximum call stack size exceeded"). The
// yields are an invented exact quadratic plus uniform noise (seeded generator), so the fixed
// effects must recover its coefficients to within the noise: ± 500/2 kg/ha around each plot,
// averaged over 75,000 plots a site.
import { describe, expect, it } from 'vitest';
import { fitRegionalMixedModel } from '../shared/analysis/regionalMixedModel';
import { mulberry32 } from '../shared/demo';

describe('fitRegionalMixedModel with hundreds of thousands of plots', () => {
  it('fits 300,000 plots and recovers the quadratic it was given', () => {
    const rng = mulberry32(4);
    const rates = [0, 50, 100, 150, 200, 250];
    const sites = Array.from({ length: 4 }, (_, s) => {
      const rateKgHa: number[] = [];
      const yieldKgHa: number[] = [];
      for (let i = 0; i < 75_000; i++) {
        const x = rates[i % 6];
        rateKgHa.push(x);
        yieldKgHa.push(6000 + 40 * x - 0.08 * x * x + 300 * s + 500 * (rng.next() - 0.5));
      }
      return { site: `Larkspur Bend ${s + 1}`, rateKgHa, yieldKgHa };
    });
    const m = fitRegionalMixedModel(sites);
    if (m.model === null) throw new Error(m.reason);
    // Site offsets 0, 300, 600, 900 average 450 over the sites.
    expect(m.fixed.a).toBeCloseTo(6450, -1);
    expect(m.fixed.b).toBeCloseTo(40, 1);
    expect(m.fixed.c).toBeCloseTo(-0.08, 3);
  }, 60_000);
});
