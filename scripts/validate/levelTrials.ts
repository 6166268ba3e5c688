// Rate × timing trials of known truth (shared/demo/simulatedLevels: 4 blocks, 6 rates, one
// zero-rate check per block shared by both timings, plot CV 6.5 %, block SD 250 kg/ha) through
// the public API (analyzeTrial, then priceTrial for the paired-resample figures). Measured:
// - how often the level test (one quadratic per level against one for both, the check shared,
//   at 5 %) declares two timings with the same true response different (its Type I error), on a
//   quadratic-plateau truth and on a flat one;
//   and, beside it with no goal, the same for the plateau level tests (levelPlateauTest);
// - how often it finds a real 20 kg N/ha difference in the optimum: when the later timing's
//   optimum is 20 kg/ha lower and its plateau 1,000 kg/ha higher (the goal's case), and, beside
//   it with no goal, when only the optimum moves and the plateau stays (how far the data reach);
// - on fewer trials with the bootstrap, how often the paired-resample interval of the difference
//   in optimum excludes 0 and holds the true difference, and, on equal timings, how often the
//   interval of the difference in return excludes 0 and the best timing wins ≥ 95 % of resamples.
import { analysisSettings, analyzeTrial, priceTrial } from '../../shared/analysis';
import {
  joinForOptimum,
  levelTrial,
  levelTrueOptimum,
  type LevelSiteSpec,
} from '../../shared/demo/simulatedLevels';
import type { Prices } from '../../shared/economics/priceRatio';
import { share, type Share } from './decisionFigures';

export interface LevelScenarioFigures {
  scenario: string;
  description: string;
  /** True optimum of each level at the run's prices, kg/ha. */
  trueOptimaKgHa: number[];
  /** Share of trials whose quadratic level test had p < 0.05. */
  declaredDifferent: Share;
  /** The same for the plateau level tests (levelPlateauTest; no goal: measured beside it). */
  declaredDifferentPlateau: { quadraticPlateau: Share; linearPlateau: Share };
}

export interface LevelFigures {
  trials: number;
  priceRatio: number;
  scenarios: LevelScenarioFigures[];
  /** The bootstrap figures on the goal's difference case. */
  interval: {
    trials: number;
    level: number;
    /** Share of trials whose interval of (later − earlier) optimum lies wholly below 0. */
    excludesZero: Share;
    /** Share of trials whose interval holds the true difference (−20 kg/ha). */
    holdsTruth: Share;
    trueDifferenceKgHa: number;
    /**
     * On the same number of trials of equal timings (one quadratic-plateau): share whose
     * interval of the difference in return at the optimum excludes 0 (ought to be about
     * 1 − level), and whose best timing returned the most in at least 95 % of the resamples.
     */
    equalReturnExcludesZero: Share;
    equalBestShareAbove95: Share;
  };
}

const CHECK = 8000;
const EARLY = { plateau: 12500, optimum: 147.5 };

/** The scenarios: two timings each, "At planting" first. */
function scenarios(pr: number): { name: string; description: string; site: LevelSiteSpec }[] {
  const early = {
    level: 'At planting',
    plateauKgHa: EARLY.plateau,
    joinKgHa: joinForOptimum(CHECK, EARLY.plateau, EARLY.optimum, pr),
  };
  const later = (plateau: number, optimum: number) => ({
    level: 'Split',
    plateauKgHa: plateau,
    joinKgHa: joinForOptimum(CHECK, plateau, optimum, pr),
  });
  return [
    {
      name: 'equal quadratic-plateau',
      description: 'both timings one quadratic-plateau (check 8,000, plateau 12,500 kg/ha)',
      site: { site: 'Equal', checkKgHa: CHECK, levels: [early, { ...early, level: 'Split' }] },
    },
    {
      name: 'equal flat',
      description: 'no response to N in either timing (8,000 kg/ha)',
      site: {
        site: 'Flat',
        checkKgHa: CHECK,
        // A plateau a hair above the check: flat in every figure that matters.
        levels: [
          { level: 'At planting', plateauKgHa: CHECK + 1e-6, joinKgHa: 100 },
          { level: 'Split', plateauKgHa: CHECK + 1e-6, joinKgHa: 100 },
        ],
      },
    },
    {
      name: '20 kg/ha lower optimum, plateau +1,000',
      description: 'split: optimum 20 kg N/ha lower, plateau 13,500 kg/ha',
      site: {
        site: 'Differ',
        checkKgHa: CHECK,
        levels: [early, later(EARLY.plateau + 1000, EARLY.optimum - 20)],
      },
    },
    {
      name: '20 kg/ha lower optimum, same plateau',
      description: 'split: optimum 20 kg N/ha lower, same plateau 12,500 kg/ha (no goal)',
      site: {
        site: 'Shift',
        checkKgHa: CHECK,
        levels: [early, later(EARLY.plateau, EARLY.optimum - 20)],
      },
    },
  ];
}

/**
 * Simulates rate × timing trials and measures the level decisions.
 * @param trials - trials per scenario for the level test
 * @param bootTrials - trials of the goal's difference case analyzed with resamples
 * @param seed - trial t of scenario s uses seed + 10000·s + t
 * @param prices - canonical prices, no application cost
 * @returns the figures of every scenario and of the difference's interval
 */
export function levelTrials(
  trials: number,
  bootTrials: number,
  seed: number,
  prices: Prices,
): LevelFigures {
  const pr = prices.nutrientPricePerKg / prices.grainPricePerKg;
  const list = scenarios(pr);
  const out: LevelScenarioFigures[] = list.map((sc, s) => {
    let rejected = 0;
    let qp = 0;
    let lp = 0;
    const rejects = (r: { kind: string; p?: number } | undefined) =>
      r?.kind === 'f-test' && (r.p ?? 1) < 0.05;
    for (let t = 0; t < trials; t++) {
      const table = levelTrial({ sites: [sc.site], seed: seed + 10000 * s + t });
      const a = analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
      const test = a.levels[0]?.test;
      if (rejects(test?.quadratic.result)) rejected++;
      if (rejects(test?.quadraticPlateau.result)) qp++;
      if (rejects(test?.linearPlateau.result)) lp++;
    }
    return {
      scenario: sc.name,
      description: sc.description,
      trueOptimaKgHa: sc.site.levels.map((l) => levelTrueOptimum(CHECK, l, pr)),
      declaredDifferent: share(rejected, trials),
      declaredDifferentPlateau: {
        quadraticPlateau: share(qp, trials),
        linearPlateau: share(lp, trials),
      },
    };
  });
  const goal = list[2];
  const truth =
    levelTrueOptimum(CHECK, goal.site.levels[1], pr) -
    levelTrueOptimum(CHECK, goal.site.levels[0], pr);
  let excludes = 0;
  let holds = 0;
  let level = NaN;
  for (let t = 0; t < bootTrials; t++) {
    const table = levelTrial({ sites: [goal.site], seed: seed + 90000 + t });
    const a = analyzeTrial(table, analysisSettings({ prices, seed: seed + t }));
    const c = priceTrial(a, prices, {}).levels[0].comparison;
    level = c.level;
    // The comparison reads each level against the one that returns most: turn it into
    // split − at planting, whichever is best.
    const d = c.differences[0];
    const ci = d?.optimumDifferenceIntervalKgHa;
    if (!ci) continue;
    const [lo, hi] = c.best === 'Split' ? [-ci[1], -ci[0]] : ci;
    if (hi < 0) excludes++;
    if (lo <= truth && truth <= hi) holds++;
  }
  let eqExcludes = 0;
  let eqSure = 0;
  for (let t = 0; t < bootTrials; t++) {
    const table = levelTrial({ sites: [list[0].site], seed: seed + 95000 + t });
    const a = analyzeTrial(table, analysisSettings({ prices, seed: seed + t }));
    const c = priceTrial(a, prices, {}).levels[0].comparison;
    const ri = c.differences[0]?.returnDifferenceIntervalPerHa;
    if (ri && (ri[1] < 0 || ri[0] > 0)) eqExcludes++;
    if (c.bestShare !== null && c.bestShare >= 0.95) eqSure++;
  }
  return {
    trials,
    priceRatio: pr,
    scenarios: out,
    interval: {
      trials: bootTrials,
      level,
      excludesZero: share(excludes, bootTrials),
      holdsTruth: share(holds, bootTrials),
      trueDifferenceKgHa: truth,
      equalReturnExcludesZero: share(eqExcludes, bootTrials),
      equalBestShareAbove95: share(eqSure, bootTrials),
    },
  };
}
