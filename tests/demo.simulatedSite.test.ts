// The simulation's truths and plots (shared/demo/simulatedSite): each closed-form optimum
// against a brute-force search of the same curve's net return (an independent computation on a
// 0.01 kg/ha grid, not the formula), the layout of every site, the seed, and the plot noise
// against the CV the generator is given (sample standard deviation with its standard error
// σ/√(2n), the usual large-sample approximation).
import { describe, expect, it } from 'vitest';
import {
  SIMULATED_BLOCKS,
  SIMULATED_RATES_KG_HA,
  STRAIGHT_GAIN_TRUTHS,
  TRUTH_NAMES,
  simulatedTrial,
  simulatedTruth,
} from '../shared/demo/simulatedSite';

/** The rate of the highest y(x) − PR·x on a 0.01 kg/ha grid from 0 to 400 kg/ha. */
function searchedOptimum(y: (x: number) => number, pr: number): number {
  let best = -Infinity;
  let at = 0;
  for (let i = 0; i <= 40000; i++) {
    const x = i / 100;
    const r = y(x) - pr * x;
    if (r > best) {
      best = r;
      at = x;
    }
  }
  return at;
}

describe('simulatedTruth', () => {
  it.each(TRUTH_NAMES)('gives the %s optimum the search finds, at several price ratios', (name) => {
    const truth = simulatedTruth(name);
    // 3 to 12 kg grain per kg N spans cheap to dear N (7.03 is the illustrative corn ratio);
    // at 80 only the full response still pays, so the other optima fall to 0.
    for (const pr of [3, 5, 7.03, 9, 12, 80]) {
      expect(truth.optimumKgHa(pr)).toBeCloseTo(searchedOptimum(truth.yieldKgHa, pr), 1);
    }
  });

  it('puts the flat optimum at 0 and the full response at or below the lowest non-zero rate', () => {
    expect(simulatedTruth('flat').optimumKgHa(7.03)).toBe(0);
    const full = simulatedTruth('full-response');
    expect(full.optimumKgHa(7.03)).toBeGreaterThan(0);
    expect(full.optimumKgHa(7.03)).toBeLessThanOrEqual(SIMULATED_RATES_KG_HA[1]);
    // The whole gain is in by then.
    expect(full.yieldKgHa(SIMULATED_RATES_KG_HA[1])).toBe(full.yieldKgHa(200));
  });
});

describe('the straight-line truth (for the gain-over-check tests)', () => {
  const line = simulatedTruth('straight-line');
  it('has gains over the check on a straight line through the origin', () => {
    const gain = (x: number) => line.yieldKgHa(x) - line.yieldKgHa(0);
    for (const x of SIMULATED_RATES_KG_HA) expect(gain(x)).toBeCloseTo((gain(200) * x) / 200, 9);
    expect(STRAIGHT_GAIN_TRUTHS).toEqual(['flat', 'straight-line']);
    expect(TRUTH_NAMES).not.toContain('straight-line');
  });
  it('has no finite optimum while its slope pays, and 0 once it does not (the search runs to its end)', () => {
    expect(line.optimumKgHa(7.03)).toBe(Infinity);
    expect(searchedOptimum(line.yieldKgHa, 7.03)).toBe(400);
    expect(line.optimumKgHa(25)).toBe(0);
    expect(searchedOptimum(line.yieldKgHa, 25)).toBe(0);
  });
});

describe('simulatedTrial', () => {
  it('lays out every site as 4 blocks × 6 rates, each rate once per block', () => {
    const { table, sites } = simulatedTrial({ truths: TRUTH_NAMES, seed: 3 });
    expect(sites.map((s) => s.truth)).toEqual(TRUTH_NAMES);
    expect(table.plots).toHaveLength(TRUTH_NAMES.length * SIMULATED_BLOCKS * 6);
    for (const { site } of sites) {
      for (let b = 1; b <= SIMULATED_BLOCKS; b++) {
        const rates = table.plots
          .filter((p) => p.site === site && p.block === String(b))
          .map((p) => p.rateKgHa)
          .sort((x, y) => x! - y!);
        expect(rates).toEqual(SIMULATED_RATES_KG_HA);
      }
    }
    expect(new Set(table.plots.map((p) => p.id)).size).toBe(table.plots.length);
  });

  it('gives the same plots for the same seed and other plots for another', () => {
    const a = simulatedTrial({ truths: ['exponential'], seed: 11 }).table.plots;
    const b = simulatedTrial({ truths: ['exponential'], seed: 11 }).table.plots;
    const c = simulatedTrial({ truths: ['exponential'], seed: 12 }).table.plots;
    expect(b.map((p) => p.yieldKgHa)).toEqual(a.map((p) => p.yieldKgHa));
    expect(c.map((p) => p.yieldKgHa)).not.toEqual(a.map((p) => p.yieldKgHa));
  });

  it('makes plot errors with the CV it is given and block offsets with the SD it is given', () => {
    const n = 150;
    const flat = simulatedTruth('flat').yieldKgHa(0);
    const noBlocks = simulatedTrial({ truths: Array(n).fill('flat'), seed: 5, blockSdKgHa: 0 });
    const rel = noBlocks.table.plots.map((p) => p.yieldKgHa! / flat - 1);
    const sd = Math.sqrt(rel.reduce((s, e) => s + e * e, 0) / rel.length);
    // 3 600 errors: the SD's standard error is about 0.065/√7200 ≈ 0.0008; allow 4 of them.
    expect(Math.abs(sd - 0.065)).toBeLessThan(4 * (0.065 / Math.sqrt(2 * rel.length)));

    // Block means with no plot error are the truth plus the block's offset.
    const noPlotError = simulatedTrial({ truths: Array(n).fill('flat'), seed: 6, cv: 0 });
    const offsets = noPlotError.table.plots
      .filter((p) => p.plotLabel!.endsWith('01'))
      .map((p) => p.yieldKgHa! - flat);
    const blockSd = Math.sqrt(offsets.reduce((s, e) => s + e * e, 0) / offsets.length);
    // 600 offsets: standard error about 250/√1200 ≈ 7 kg/ha; allow 4 of them.
    expect(Math.abs(blockSd - 250)).toBeLessThan(4 * (250 / Math.sqrt(2 * offsets.length)));
  });
});
