/**
 * The results file: a stable JSON schema for scripts and archives. Fields are
 * only ever added, never renamed (README "Results format"). Every number is in
 * the units named in `settings.units`; money in the currency the prices were
 * given in, per acre with US rates and per hectare otherwise.
 */
import type { RateProfileInterval } from '../models/joinProfile';
import type { ModelName, FitStatus } from '../models/modelTypes';
import type { FTestNumbers, TrialReport } from './trialReport';
import { priceRatioQuote } from '../economics/priceQuote';
import { unitScale } from './unitScale';

export interface ResultsModel {
  model: ModelName;
  status: FitStatus;
  params: Record<string, number>;
  stdErrors: Record<string, number>;
  /** Residual sum of squares in (yield unit)². */
  sse: number;
  dfResidual: number;
  aicc: number;
  optimumRate: number | null;
  optimumCI: [number, number] | null;
  yieldAtOptimum: number | null;
  /**
   * The F-based profile interval of the join x0 (linear-plateau and quadratic-plateau when
   * they report a join) at `level`; `lowOpen`/`highOpen`: the data do not close it there and
   * it runs to the lowest/highest tested rate. Null for the other models and statuses.
   */
  joinProfileInterval: ProfileIntervalJson | null;
  /**
   * The profile interval of `optimumRate` beside the bootstrap `optimumCI` (the best model only):
   * `basis` "join" (the linear-plateau's optimum is its join) or "linear-constraint" (the
   * quadratic's, in closed form). Null for the other models, whose profile would need refits.
   */
  optimumProfileInterval: (ProfileIntervalJson & { basis: 'join' | 'linear-constraint' }) | null;
}

/** A profile interval in the output rate unit. */
export interface ProfileIntervalJson {
  interval: [number, number];
  lowOpen: boolean;
  highOpen: boolean;
  level: number;
}

export interface ResultsSite {
  /** The site-year's name: "Alder Flats 2024" when the site has several years, else the site's. */
  site: string;
  /** The harvest year, or null when the plots carry none. */
  year: number | null;
  n: number;
  interceptTest: { t: number; F: number; df1: number; df2: number; p: number } | null;
  /**
   * Gains over the zero-rate plot of the same block fitted through the origin: slope and its
   * interval in `settings.priceRatioUnit`, the intercept test on the gains, and whether a gain
   * at rate zero is present; null when not available (no blocks, a block without a zero-rate
   * plot, too few gains).
   */
  responseOverCheck: {
    slope: number;
    slopeCI: [number, number];
    interceptTest: { t: number; F: number; df1: number; df2: number; p: number };
    biasPresent: boolean;
  } | null;
  lackOfFit: { model: ModelName; F: number; df1: number; df2: number; p: number } | null;
  bestModel: ModelName | null;
  /**
   * The site's recommendation in the output units (shared/analysis/siteDecision): `rate` is the
   * optimum; for "full-response" the second-lowest tested rate, at or below which the optimum
   * lies (0 when even that does not pay); for "no-response" 0. `interval` is the bootstrap
   * interval at `level` (for "no-response" it reaches down to 0). `basis`: "curve" (a curve's
   * optimum), "full-response" (full response by the lowest non-zero rate), "no-response" (the
   * rate effect was not significant), "no-plateau" (no curve levelled off; a straight line's
   * corner). Null rate, model and basis when the site has no leading model.
   */
  recommendation: {
    rate: number | null;
    interval: [number, number] | null;
    level: number;
    model: ModelName | null;
    basis: 'curve' | 'full-response' | 'no-response' | 'no-plateau' | null;
  };
  /** Lowest and highest optimum rate of the ranked curves; null with fewer than two. */
  optimumSpread: [number, number] | null;
  /**
   * How the chosen model's `optimumCI` was made: resamples (all counted), level, seed, basis
   * ("model-reselected": the model chosen again in each resample; "fixed-model": the
   * analyst's pick), the share of resamples of each kind and the share each model decided;
   * null without an interval.
   */
  optimumCIBootstrap: {
    resamples: number;
    level: number;
    seed: number;
    basis: 'model-reselected' | 'fixed-model';
    shares: { curve: number; noPlateau: number; fullResponse: number; noResponse: number };
    modelShares: Partial<Record<ModelName, number>>;
  } | null;
  models: ResultsModel[];
  warnings: string[];
}

export interface ResultsJson {
  tool: { name: string; version: string };
  settings: {
    units: { rate: string; yield: string };
    crop: string;
    grainPrice: number;
    nutrientPrice: number;
    priceRatio: number;
    priceRatioUnit: string;
    product: { id: string; price: number } | null;
    boot: number;
    seed: number;
    blocks: string;
  };
  sites: ResultsSite[];
  acrossSites: {
    sites: string[];
    bestRate: number;
    profitableRange: [number, number];
    bestMeanReturn: number;
    returnUnit: string;
    siteOptima: { site: string; rate: number }[];
  } | null;
  /**
   * Each site seen in several years, its years compared (F statistics have no unit); empty
   * when no site has several years.
   */
  yearsCompared: {
    site: string;
    siteYears: string[];
    years: (number | null)[];
    response: FTestNumbers | null;
    level: FTestNumbers | null;
    responseDiffers: boolean | null;
    sentence: string;
  }[];
}

/** Rounds away binary noise (12 significant digits) so the file diffs cleanly. */
function clean(v: number): number {
  return Number.isFinite(v) ? Number(v.toPrecision(12)) : v;
}

function cleanOrNull(v: number | null): number | null {
  return v === null || !Number.isFinite(v) ? null : clean(v);
}

function profileJson(p: RateProfileInterval, rate: (kgHa: number) => number): ProfileIntervalJson {
  return {
    interval: [clean(rate(p.lowKgHa)), clean(rate(p.highKgHa))],
    lowOpen: p.lowOpen,
    highOpen: p.highOpen,
    level: p.level,
  };
}

/**
 * Builds the results JSON value from a report.
 * @param report - the assembled analysis (canonical units)
 * @returns the schema value in the report's display units; `JSON.stringify` it to write
 * @example
 * resultsJson(report).settings.units // { rate: 'lb/ac', yield: 'bu/ac' }
 */
export function resultsJson(report: TrialReport): ResultsJson {
  const u = unitScale(report.settings.units, report.crop);
  const fy2 = u.yield(1) ** 2;
  const { prices, settings } = report;
  // Grain per unit of N in the unit the price ratio is quoted in (a scale factor).
  const perN = (kgPerKg: number) =>
    clean(priceRatioQuote(kgPerKg, settings.units, report.crop).value);
  return {
    tool: { ...report.tool },
    settings: {
      units: { rate: settings.units.rate, yield: settings.units.yield },
      crop: report.crop,
      grainPrice: clean(settings.prices.grainPrice),
      nutrientPrice: clean(prices.nutrientPriceDisplay),
      priceRatio: clean(prices.priceRatioDisplay),
      priceRatioUnit: prices.priceRatioUnit,
      product: settings.prices.product ? { ...settings.prices.product } : null,
      boot: settings.boot,
      seed: settings.seed,
      blocks: settings.blocks,
    },
    sites: report.sites.map((s) => ({
      site: s.site,
      year: s.year,
      n: s.n,
      interceptTest: s.interceptTest
        ? {
            t: clean(s.interceptTest.t),
            F: clean(s.interceptTest.F),
            df1: s.interceptTest.df1,
            df2: s.interceptTest.df2,
            p: clean(s.interceptTest.p),
          }
        : null,
      responseOverCheck: s.responseOverCheck.available
        ? {
            slope: perN(s.responseOverCheck.slopeKgPerKg),
            slopeCI: [
              perN(s.responseOverCheck.slopeCiKgPerKg[0]),
              perN(s.responseOverCheck.slopeCiKgPerKg[1]),
            ],
            interceptTest: {
              t: clean(s.responseOverCheck.t),
              F: clean(s.responseOverCheck.F),
              df1: s.responseOverCheck.df1,
              df2: s.responseOverCheck.df2,
              p: clean(s.responseOverCheck.p),
            },
            biasPresent: s.responseOverCheck.biasPresent,
          }
        : null,
      lackOfFit: s.lackOfFit.available
        ? {
            model: s.lackOfFit.model,
            F: clean(s.lackOfFit.F),
            df1: s.lackOfFit.df1,
            df2: s.lackOfFit.df2,
            p: clean(s.lackOfFit.p),
          }
        : null,
      bestModel: s.bestModel,
      recommendation: {
        rate: cleanOrNull(
          s.recommendation.rateKgHa === null ? null : u.rate(s.recommendation.rateKgHa),
        ),
        interval: s.recommendation.ciKgHa
          ? [clean(u.rate(s.recommendation.ciKgHa[0])), clean(u.rate(s.recommendation.ciKgHa[1]))]
          : null,
        level: s.recommendation.level,
        model: s.recommendation.model,
        basis: s.recommendation.basis,
      },
      optimumSpread: s.optimumSpreadKgHa
        ? [clean(u.rate(s.optimumSpreadKgHa[0])), clean(u.rate(s.optimumSpreadKgHa[1]))]
        : null,
      optimumCIBootstrap: s.bootstrap
        ? {
            resamples: s.bootstrap.count,
            level: s.bootstrap.level,
            seed: s.bootstrap.seed,
            basis: s.bootstrap.basis,
            shares: {
              curve: clean(s.bootstrap.shares.curve),
              noPlateau: clean(s.bootstrap.shares.noPlateau),
              fullResponse: clean(s.bootstrap.shares.fullResponse),
              noResponse: clean(s.bootstrap.shares.noResponse),
            },
            modelShares: Object.fromEntries(
              Object.entries(s.bootstrap.modelShares).map(([k, v]) => [k, clean(v)]),
            ),
          }
        : null,
      models: s.models.map((m) => ({
        model: m.model,
        status: m.status,
        params: Object.fromEntries(
          Object.entries(m.params).map(([k, v]) => [k, clean(u.param(m.model, k, v))]),
        ),
        stdErrors: Object.fromEntries(
          Object.entries(m.stdErrors).map(([k, v]) => [k, clean(u.param(m.model, k, v))]),
        ),
        sse: clean(m.sse * fy2),
        dfResidual: m.dfResidual,
        // AICc changes by a constant with the unit (n·ln of the squared factor); keep it comparable within the file.
        aicc: clean(m.aicc + s.n * Math.log(fy2)),
        optimumRate: cleanOrNull(m.optimumRateKgHa === null ? null : u.rate(m.optimumRateKgHa)),
        optimumCI: m.optimumCiKgHa
          ? [clean(u.rate(m.optimumCiKgHa[0])), clean(u.rate(m.optimumCiKgHa[1]))]
          : null,
        yieldAtOptimum: cleanOrNull(
          m.yieldAtOptimumKgHa === null ? null : u.yield(m.yieldAtOptimumKgHa),
        ),
        joinProfileInterval: m.joinProfile ? profileJson(m.joinProfile, u.rate) : null,
        optimumProfileInterval: m.optimumProfile
          ? { ...profileJson(m.optimumProfile, u.rate), basis: m.optimumProfile.basis }
          : null,
      })),
      warnings: [...s.warnings],
    })),
    acrossSites: report.acrossSites
      ? {
          sites: [...report.acrossSites.sites],
          bestRate: clean(u.rate(report.acrossSites.bestRateKgHa)),
          profitableRange: [
            clean(u.rate(report.acrossSites.profitableRangeKgHa[0])),
            clean(u.rate(report.acrossSites.profitableRangeKgHa[1])),
          ],
          bestMeanReturn: clean(u.perArea(report.acrossSites.bestMeanReturnPerHa)),
          returnUnit: `currency/${u.areaName}`,
          siteOptima: report.acrossSites.siteOptima.map((o) => ({
            site: o.site,
            rate: clean(u.rate(o.rateKgHa)),
          })),
        }
      : null,
    yearsCompared: report.yearsCompared.map((c) => ({
      site: c.site,
      siteYears: [...c.siteYears],
      years: [...c.years],
      response: c.response ? fNumbers(c.response) : null,
      level: c.level ? fNumbers(c.level) : null,
      responseDiffers: c.responseDiffers,
      sentence: c.sentence,
    })),
  };
}

function fNumbers(t: FTestNumbers): FTestNumbers {
  return { F: clean(t.F), df1: t.df1, df2: t.df2, p: clean(t.p) };
}
