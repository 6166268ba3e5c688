// A small seeded run of the validation harness (`npm run validate`, scripts/validate): the
// analysis' decisions on simulated sites whose truth is known (shared/demo/simulatedSite).
// Only the goals the full run (400 sites per truth, 50 regions) meets today are asserted here,
// each with a tolerance from the sampling error of this small sample:
// - on the flat truth the gains over each block's check are all zero, so the gain-over-check
//   test's null holds and it should reject at its 5 % level; likewise the rate effect's F test
//   (rate as a factor with blocks), whose null of no rate effect holds. A rejection count is
//   binomial(n, 0.05) under the null: its standard error is √(0.05 · 0.95 / n), and a share
//   more than 3 standard errors above 5 % fails (n = 60: above 13.4 %). The lower side is not
//   asserted: at n = 60 three standard errors below 5 % is below zero;
// - on the flat truth a site gets a rate above 0 only when its rate effect test falsely
//   rejects (the site decision gives a non-responding site no N), so the share given a rate
//   above 0 meets the goal of ≤ 5 % within the same binomial limit;
// - the regional rate's mean error against the true regional optimum should be within 5 kg/ha;
//   with few regions the mean carries a standard error s/√n (s the errors' standard deviation),
//   so the check is |mean| < 5 + 2·s/√n.
// - on the full-response truth (the whole response by 30 kg/ha, below the second-lowest rate of
//   40) a site should be recommended above 40 kg/ha at most 5 % of the time, within the same
//   binomial limit, and the interval should hold the true optimum;
// - on the linear-plateau truth the 90 % interval's coverage should reach 0.87; a covered count
//   is binomial(n, p), so the check is coverage ≥ 0.87 − 3·√(0.87 · 0.13 / n).
// The goals not met today (coverage on the other curved truths, site rate bias on them) are
// reported by `npm run validate`, not asserted.
import { beforeAll, describe, expect, it } from 'vitest';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import {
  regionFigures,
  trueRegionalOptimumKgHa,
  truthFigures,
  type RegionOutcome,
  type TruthFigures,
} from '../scripts/validate/decisionFigures';
import { simulateAndAnalyze, type SiteDecision } from '../scripts/validate/siteDecisions';
import { mulberry32 } from '../shared/demo/mulberry32';
import { TRUTH_NAMES, type TruthName } from '../shared/demo/simulatedSite';

const prices = illustrativePrices('corn').canonical;
const priceRatio = prices.nutrientPricePerKg / prices.grainPricePerKg;
const FLAT_SITES = 60;
const REGIONS = 16;
const SITES_PER_REGION = 12;
const NOMINAL = 0.05;

/** The largest rejection share a 5 % test passes on n null sites: 5 % plus 3 binomial SE. */
function typeOneLimit(n: number): number {
  return NOMINAL + 3 * Math.sqrt((NOMINAL * (1 - NOMINAL)) / n);
}

const FULL_SITES = 40;
const PLATEAU_SITES = 60;
const COVERAGE_GOAL = 0.87;

let flat: TruthFigures;
let full: TruthFigures;
let plateau: TruthFigures;
let flatDecisions: SiteDecision[];
let regions: RegionOutcome[];

beforeAll(() => {
  flatDecisions = simulateAndAnalyze(Array(FLAT_SITES).fill('flat'), 4101, prices).decisions;
  flat = truthFigures('flat', flatDecisions);
  full = truthFigures(
    'full-response',
    simulateAndAnalyze(Array(FULL_SITES).fill('full-response'), 4103, prices).decisions,
  );
  plateau = truthFigures(
    'linear-plateau',
    simulateAndAnalyze(Array(PLATEAU_SITES).fill('linear-plateau'), 4104, prices).decisions,
  );
  const pick = mulberry32(4102);
  regions = Array.from({ length: REGIONS }, (_, r) => {
    const mix: TruthName[] = Array.from(
      { length: SITES_PER_REGION },
      () => TRUTH_NAMES[pick.int(0, TRUTH_NAMES.length - 1)],
    );
    const run = simulateAndAnalyze(mix, 4200 + r, prices);
    return {
      truths: mix,
      regionalRateKgHa: run.regionalRateKgHa,
      trueRegionalOptimumKgHa: trueRegionalOptimumKgHa(mix, priceRatio),
      intervalKgHa: run.regionalIntervalKgHa,
      populationOptimumKgHa: trueRegionalOptimumKgHa(TRUTH_NAMES, priceRatio),
    };
  });
});

describe('validation by simulation: flat truth (no response, no gain at rate zero)', () => {
  it('tests the gain over the check at every site (each block has its own check)', () => {
    expect(flat.gainAtZeroFound.of).toBe(FLAT_SITES);
  });

  it('finds a gain at rate zero no more often than a 5 % test should', () => {
    expect(flat.gainAtZeroFound.share).toBeLessThanOrEqual(typeOneLimit(FLAT_SITES));
  });

  it('finds a rate effect no more often than a 5 % test should', () => {
    expect(flat.responded.share).toBeLessThanOrEqual(typeOneLimit(FLAT_SITES));
  });

  it('gives a rate above 0 no more often than the 5 % goal allows (only a site that responded)', () => {
    // siteDecision: a site whose rate effect is not significant gets no N, so a flat site gets
    // a rate only on a false rejection: the share is binomial with p ≤ 0.05.
    expect(flatDecisions.every((d) => !((d.recommendedKgHa ?? 0) > 0) || d.responded)).toBe(true);
    expect(flat.aboveZero.share).toBeLessThanOrEqual(typeOneLimit(FLAT_SITES));
  });
});

describe('validation by simulation: regional rate over regions mixing all five truths', () => {
  it('mixes truths whose true regional optima differ, so the check is not one number', () => {
    const optima = new Set(regions.map((r) => r.trueRegionalOptimumKgHa));
    expect(optima.size).toBeGreaterThan(1);
  });

  it('has a mean error against the true regional optimum within 5 kg/ha, allowing for its standard error', () => {
    const f = regionFigures(regions);
    const errors = regions.map((r) => r.regionalRateKgHa - r.trueRegionalOptimumKgHa);
    const sd = Math.sqrt(
      errors.reduce((s, e) => s + (e - f.meanBiasKgHa) ** 2, 0) / (errors.length - 1),
    );
    expect(Math.abs(f.meanBiasKgHa)).toBeLessThan(5 + (2 * sd) / Math.sqrt(REGIONS));
  });
});

describe('validation by simulation: full response by the lowest non-zero rate', () => {
  it('recommends above the second-lowest rate no more often than the 5 % goal allows', () => {
    expect(full.aboveSecondLowest.of).toBe(FULL_SITES);
    expect(full.aboveSecondLowest.share).toBeLessThanOrEqual(typeOneLimit(FULL_SITES));
  });

  it('gives an interval that holds the true optimum (the range reaches down to the lowest rate)', () => {
    expect(full.coverage.share).toBeGreaterThanOrEqual(
      COVERAGE_GOAL - 3 * Math.sqrt((COVERAGE_GOAL * (1 - COVERAGE_GOAL)) / FULL_SITES),
    );
  });
});

describe('validation by simulation: linear-plateau truth', () => {
  it('covers the true optimum with the 90 % interval at least 87 % of the time, within sampling error', () => {
    expect(plateau.coverage.of).toBe(PLATEAU_SITES);
    expect(plateau.coverage.share).toBeGreaterThanOrEqual(
      COVERAGE_GOAL - 3 * Math.sqrt((COVERAGE_GOAL * (1 - COVERAGE_GOAL)) / PLATEAU_SITES),
    );
  });
});
