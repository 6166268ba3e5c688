// The level test's decisions by simulation, a small seeded version of `npm run validate`'s
// rate × timing figures (scripts/validate/levelTrials.ts): trials from the project's generator
// (shared/demo/simulatedLevels: 4 blocks × 6 rates, one check per block shared by both timings,
// 6.5 % plot CV) through analyzeTrial. The bounds are binomial: with a true rate of 5 % the count
// of 300 trials lies in [5, 26] with probability above 0.996 (computed below from the binomial
// distribution), so a test that rejects far more or far less often than its level fails here.
import { describe, expect, it } from 'vitest';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import { joinForOptimum, levelTrial, type LevelTruth } from '../shared/demo/simulatedLevels';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.26 }; // price ratio 7
const pr = 7;

function declaredDifferent(levels: LevelTruth[], trials: number, seed: number): number {
  let count = 0;
  for (let t = 0; t < trials; t++) {
    const table = levelTrial({
      sites: [{ site: 'Vetch Corner', checkKgHa: 8000, levels }],
      seed: seed + t,
    });
    const r = analyzeTrial(table, analysisSettings({ prices, resamples: 0 })).levels[0].test
      .quadratic.result;
    if (r.kind === 'f-test' && r.p < 0.05) count++;
  }
  return count;
}

/** P(X ≤ k) for X ~ Binomial(n, p), by summing the terms (exact for these sizes). */
function binomialCdf(k: number, n: number, p: number): number {
  let term = (1 - p) ** n;
  let sum = term;
  for (let i = 1; i <= k; i++) {
    term *= ((n - i + 1) / i) * (p / (1 - p));
    sum += term;
  }
  return sum;
}

describe('the level test on simulated rate × timing trials', () => {
  it('the bounds [5, 26] of 300 hold a 5 % rate with probability above 0.996', () => {
    expect(binomialCdf(4, 300, 0.05) + (1 - binomialCdf(26, 300, 0.05))).toBeLessThan(0.004);
  });

  it('declares two timings with one true quadratic-plateau different about 5 % of the time', () => {
    const same = { plateauKgHa: 12500, joinKgHa: 170 };
    const n = declaredDifferent(
      [
        { level: 'At planting', ...same },
        { level: 'Split', ...same },
      ],
      300,
      71000,
    );
    expect(n).toBeGreaterThanOrEqual(5);
    expect(n).toBeLessThanOrEqual(26);
  });

  it('finds a 20 kg N/ha lower optimum with a 1,000 kg/ha higher plateau in at least 80 of 100 trials', () => {
    const n = declaredDifferent(
      [
        {
          level: 'At planting',
          plateauKgHa: 12500,
          joinKgHa: joinForOptimum(8000, 12500, 147.5, pr),
        },
        { level: 'Split', plateauKgHa: 13500, joinKgHa: joinForOptimum(8000, 13500, 127.5, pr) },
      ],
      100,
      72000,
    );
    expect(n).toBeGreaterThanOrEqual(80);
  });
});
