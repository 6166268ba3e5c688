/**
 * A rate × factor site at prices: each level priced as a site (priceSite: its decision, optimum,
 * interval, sensitivity and risk) at its own nitrogen price where the level has one (urea, UAN
 * and a stabilised product cost differently per kg N), and the levels compared on their
 * resamples: which level returns the most at its own optimum, how often it does so, and the
 * difference of every other level's optimum and return from it, each with a percentile interval
 * (Efron & Tibshirani, An Introduction to the Bootstrap, 1993, §13.3) over the paired resamples
 * (analyzeLevels' header: every level of a site draws the same check plots in resample b).
 *
 * In each resample a level's optimum is its deciding model's (decidingModels: the rule's winner
 * in that resample, or the analyst's pick throughout), counted as the level's interval counts it
 * (countedOptimum), and its return is that curve's net return at that rate at the level's
 * prices. A resample in which a level has no curve to price a return on (no usable fit, or a
 * full response whose curve has no value past the check) is left out of the return comparisons
 * and counted.
 */
import { countedOptimum } from '../economics/countedOptimum';
import { drawSummaries } from '../economics/bootstrapDraws';
import { decidingModels } from '../economics/drawChoices';
import { netReturn } from '../economics/economicOptimum';
import { assertPrices, type Prices } from '../economics/priceRatio';
import type { ModelName } from '../models/modelTypes';
import type { SiteLevelsAnalysis } from './analyzeLevels';
import type { LevelResponseTests } from './levelResponseTest';
import { priceSite, type PricedSite } from './priceSite';
import { siteModelRows, type SiteModelRow } from './siteModelRows';

/** One level at its prices. */
export interface PricedLevel {
  level: string;
  /** The prices it was priced at: the run's, with the level's own N price where given. */
  prices: Prices;
  /** True when the level has its own N price. */
  ownNutrientPrice: boolean;
  /** The level priced as a site (its decision, optimum, interval, sensitivity, risk). */
  priced: PricedSite;
  /** Net return at its recommended optimum, currency/ha; null without one. */
  returnAtOptimumPerHa: number | null;
  /** Its model rows at its prices (siteModelRows), as the across-site rows are for a site. */
  rows: SiteModelRow[];
}

/** Another level set against the one that returns most. */
export interface LevelDifference {
  level: string;
  /** This level's optimum minus the best level's, kg/ha (point estimates); null without both. */
  optimumDifferenceKgHa: number | null;
  /** Its percentile interval over the paired resamples, kg/ha; null without resamples. */
  optimumDifferenceIntervalKgHa: [number, number] | null;
  /** This level's return at its optimum minus the best level's, currency/ha (≤ 0). */
  returnDifferencePerHa: number | null;
  returnDifferenceIntervalPerHa: [number, number] | null;
  /** Resamples in which both levels had a return to compare. */
  resamplesCompared: number;
}

/** Which level returns most, and by how much, with the resamples' uncertainty. */
export interface LevelComparison {
  /** The level with the highest return at its own optimum (point estimates); null without any. */
  best: string | null;
  /** Share of the resamples compared in which the best level returned the most; null without resamples. */
  bestShare: number | null;
  /** Resamples in which every level had a return (the denominator of bestShare). */
  resamplesCompared: number;
  /** Resamples left out because some level had no curve to price (see the file header). */
  resamplesLeftOut: number;
  level: number;
  differences: LevelDifference[];
}

/** A rate × factor site at prices. */
export interface PricedSiteLevels {
  site: string;
  factor: string;
  levels: PricedLevel[];
  /** The nested tests of whether the levels respond differently (price-free). */
  test: LevelResponseTests;
  comparison: LevelComparison;
}

/** Each resample's counted optimum and return for one level; NaN where it has no return. */
function resampleReturns(
  l: SiteLevelsAnalysis['levels'][number],
  p: PricedLevel,
): { rate: Float64Array; ret: Float64Array } | null {
  const draws = l.analysis.draws;
  const model = p.priced.lead.model;
  if (!draws || !model) return null;
  const choices = decidingModels(
    draws,
    model,
    p.priced.lead.picked ? 'fixed-model' : 'model-reselected',
  );
  if (!choices) return null;
  const readers = choices.models.map((m) => drawSummaries(draws, m)!);
  const rate = new Float64Array(draws.resamples);
  const ret = new Float64Array(draws.resamples).fill(NaN);
  for (let b = 0; b < draws.resamples; b++) {
    const k = choices.decisive[b];
    if (k < 0) continue;
    const summary = readers[k](b);
    const counted = countedOptimum(summary, p.prices);
    rate[b] = counted.rateKgHa;
    ret[b] = netReturn(summary, p.prices, counted.rateKgHa);
  }
  return { rate, ret };
}

function percentileInterval(values: number[], level: number): [number, number] | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  // Type-7 quantiles (linear between order statistics), as R's quantile() default.
  const q = (t: number) => {
    const h = (s.length - 1) * t;
    const lo = Math.floor(h);
    return s[lo] + (h - lo) * ((s[Math.min(lo + 1, s.length - 1)] ?? s[lo]) - s[lo]);
  };
  const tail = (1 - level) / 2;
  return [q(tail), q(1 - tail)];
}

/**
 * The levels of one site at prices, and their comparison.
 * @param s - the site's levels (analyzeLevels)
 * @param prices - the run's canonical prices
 * @param levelNutrientPricePerKg - level name → its own N price, currency per kg N
 * @param choices - site name → the analyst's model (a level's name is "Site (Factor: level)")
 * @param level - interval level, e.g. 0.9
 * @param tolerancePerHa - shortfall tolerance, currency/ha (default as priceSite)
 * @returns every level priced, the level tests and the comparison
 * @throws {StatsInputError} "bad-argument" for a level's N price that is not positive
 * @example
 * priceSiteLevels(analysis.levels[0], prices, { UAN: 1.35 }, {}, 0.9).comparison.best // 'Split'
 */
export function priceSiteLevels(
  s: SiteLevelsAnalysis,
  prices: Prices,
  levelNutrientPricePerKg: Readonly<Record<string, number>>,
  choices: Readonly<Record<string, ModelName>>,
  level: number,
  tolerancePerHa?: number,
): PricedSiteLevels {
  const levels = s.levels.map((l): PricedLevel => {
    const own = Object.hasOwn(levelNutrientPricePerKg, l.level);
    const at: Prices = own
      ? { ...prices, nutrientPricePerKg: levelNutrientPricePerKg[l.level] }
      : { ...prices };
    assertPrices(at);
    const priced = priceSite(l.analysis, at, choices, level, tolerancePerHa);
    return {
      level: l.level,
      prices: at,
      ownNutrientPrice: own,
      priced,
      returnAtOptimumPerHa: priced.optimum?.netReturnPerHa ?? null,
      rows: siteModelRows(l.analysis, at),
    };
  });
  return {
    site: s.site,
    factor: s.factor,
    levels,
    test: s.test,
    comparison: compareLevels(s, levels, level),
  };
}

function compareLevels(
  s: SiteLevelsAnalysis,
  levels: PricedLevel[],
  level: number,
): LevelComparison {
  let best = -1;
  levels.forEach((l, i) => {
    const r = l.returnAtOptimumPerHa;
    if (r !== null && (best < 0 || r > levels[best].returnAtOptimumPerHa!)) best = i;
  });
  const drawn = s.levels.map((l, i) => resampleReturns(l, levels[i]));
  const count = drawn.every((d) => d !== null) ? Math.min(...drawn.map((d) => d!.rate.length)) : 0;
  let compared = 0;
  let bestWins = 0;
  for (let b = 0; b < count && best >= 0; b++) {
    const rets = drawn.map((d) => d!.ret[b]);
    if (!rets.every(Number.isFinite)) continue;
    compared++;
    if (rets[best] >= Math.max(...rets)) bestWins++;
  }
  const optimumOf = (l: PricedLevel) => {
    const o = l.priced.optimum;
    if (!o) return null;
    return o.status === 'join-in-first-interval' && o.rangeKgHa ? o.rangeKgHa[1] : o.rateKgHa;
  };
  const differences: LevelDifference[] =
    best < 0
      ? []
      : levels
          .map((l, i) => ({ l, i }))
          .filter(({ i }) => i !== best)
          .map(({ l, i }) => {
            const dr: number[] = [];
            const dm: number[] = [];
            for (let b = 0; b < count; b++) {
              const a = drawn[i]!;
              const z = drawn[best]!;
              dr.push(a.rate[b] - z.rate[b]);
              if (Number.isFinite(a.ret[b]) && Number.isFinite(z.ret[b]))
                dm.push(a.ret[b] - z.ret[b]);
            }
            const mine = optimumOf(l);
            const theirs = optimumOf(levels[best]);
            return {
              level: l.level,
              optimumDifferenceKgHa: mine !== null && theirs !== null ? mine - theirs : null,
              optimumDifferenceIntervalKgHa: percentileInterval(dr, level),
              returnDifferencePerHa:
                l.returnAtOptimumPerHa !== null
                  ? l.returnAtOptimumPerHa - levels[best].returnAtOptimumPerHa!
                  : null,
              returnDifferenceIntervalPerHa: percentileInterval(dm, level),
              resamplesCompared: dm.length,
            };
          });
  return {
    best: best < 0 ? null : levels[best].level,
    bestShare: compared > 0 ? bestWins / compared : null,
    resamplesCompared: compared,
    resamplesLeftOut: count - compared,
    level,
    differences,
  };
}

/**
 * Every rate × factor site of an analysis at one set of prices, picks and level prices; priceTrial
 * calls it for PricedTrial.levels. No refit and no new resample: a pass over each level's draws.
 * @param levels - the analysis' levels (TrialAnalysis.levels)
 * @param o - prices, level N prices, picks, interval level and tolerance (null: default)
 * @returns one entry per site and factor, in the analysis' order
 * @example
 * priceTrialLevels(analysis.levels, { prices, levelNutrientPricePerKg: {}, choices: {}, level: 0.9,
 *   tolerancePerHa: null })[0].comparison.best // 'Split'
 */
export function priceTrialLevels(
  levels: readonly SiteLevelsAnalysis[],
  o: {
    prices: Prices;
    levelNutrientPricePerKg: Readonly<Record<string, number>>;
    choices: Readonly<Record<string, ModelName>>;
    level: number;
    tolerancePerHa: number | null;
  },
): PricedSiteLevels[] {
  return levels.map((s) =>
    priceSiteLevels(
      s,
      o.prices,
      o.levelNutrientPricePerKg,
      o.choices,
      o.level,
      o.tolerancePerHa ?? undefined,
    ),
  );
}
