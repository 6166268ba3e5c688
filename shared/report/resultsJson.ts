/**
 * The results file: a stable JSON schema for scripts and archives. Fields are
 * only ever added, never renamed (README "Results format"). Every number is in
 * the units named in `settings.units`; money in the currency the prices were
 * given in, per acre with US rates and per hectare otherwise.
 */
import type { RateProfileInterval } from '../models/joinProfile';
import type { ModelName, FitStatus } from '../models/modelTypes';
import type {
  FTestNumbers,
  LevelMixedReport,
  MixedModelFormReport,
  MixedModelReport,
  ShortfallSummary,
  SiteLevelsReport,
  SiteReport,
  TrialReport,
} from './trialReport';
import { priceRatioQuote } from '../economics/priceQuote';
import { levelMixedSentence } from './levelSentences';
import { mixedFormParamModel, unitScale, type UnitScale } from './unitScale';

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
   * Gains over the zero-rate plot of the same block, as contrasts of the rate means of the rate +
   * block model (its error df): the slope through the origin and its interval in
   * `settings.priceRatioUnit`, the test of a gain at rate zero (the intercept of a straight line
   * through the mean gains), the test of a bend (null with two fertilized rates), what they read
   * as (`from-zero`, `gain-at-zero`, `bends`) and `biasPresent` (a gain at rate zero the bend
   * does not explain); null when not available (no blocks, a block without a zero-rate plot, too
   * few rates).
   */
  responseOverCheck: {
    slope: number;
    slopeCI: [number, number];
    interceptTest: { t: number; F: number; df1: number; df2: number; p: number };
    curvatureTest: { F: number; df1: number; df2: number; p: number } | null;
    reading: 'from-zero' | 'gain-at-zero' | 'bends';
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
  /**
   * The recommendation at the price ratio times 0.5, 0.75, 1, 1.5 and 2 (the nitrogen price
   * scaled, the grain price kept): `priceRatio` in `settings.priceRatioUnit`, `rate` and its
   * bootstrap `interval` (at `recommendation.level`) in the rate unit; [] without a leading model.
   */
  priceRatioSensitivity: {
    ratioMultiplier: number;
    priceRatio: number;
    rate: number | null;
    interval: [number, number] | null;
  }[];
  /**
   * For the tested rates and the recommended rate: the share of the bootstrap resamples in
   * which the rate returns less than that resample's own best by more than `tolerance`
   * (money per area, `toleranceUnit`); null without resamples.
   */
  shortfallRisk: {
    tolerance: number;
    toleranceUnit: string;
    resamples: number;
    rows: { rate: number; share: number; recommended: boolean }[];
  } | null;
  warnings: string[];
  /**
   * A rate × factor site (source, timing…): each level's recommendation and models as a site's,
   * from its own plots and the shared zero-rate checks (`site` names it "Site (Factor: level)",
   * `checkPlots` of its `n` plots are shared checks), priced at `nutrientPricePerKgN` (currency
   * per kg N; `ownNutrientPrice`: the level's own, else the run's), with its return at that rate
   * in money per area; [] for a rate-only site.
   */
  levels: ResultsLevel[];
  /** Whether the levels differ and which returns most (first factor); null for a rate-only site. */
  levelTest: ResultsLevelTest | null;
  /** The same for every factor at the site, in the table's factor order (levelTest is the first). */
  levelTests: ResultsLevelTest[];
}

/** One treatment level of a site in the results file. */
export interface ResultsLevel {
  factor: string;
  level: string;
  site: string;
  n: number;
  checkPlots: number;
  nutrientPricePerKgN: number;
  ownNutrientPrice: boolean;
  returnAtOptimum: number | null;
  recommendation: ResultsSite['recommendation'];
  models: ResultsModel[];
}

/**
 * The levels compared: nested F tests of one curve for every level against one per level, the
 * zero-rate check shared (`quadratic` leads, `linear` beside it; null when no test could be made,
 * with the reason in the sentence), `differ` (quadratic p below the run's alpha, 0.05), the level that returns most
 * at its own optimum (`best`), the share of the paired resamples in which it did (`bestShare`),
 * and every other level's difference from it in optimum (rate unit) and in return (`returnUnit`)
 * with percentile intervals at `level`.
 */
export interface ResultsLevelTest {
  factor: string;
  levels: string[];
  blocks: 'fixed' | 'none';
  quadratic: FTestNumbers | null;
  linear: FTestNumbers | null;
  /** The same tests with the plateau models (joins profiled; nls-style nested F test). */
  quadraticPlateau: FTestNumbers | null;
  linearPlateau: FTestNumbers | null;
  /**
   * Every other factor at the site: how its levels meet this one's (`relation`: same-treatments,
   * nested, crossed, partly-crossed; `cells`: level combinations present), what that means
   * (`message`), and when crossed this factor's quadratic test with one curve per level of the
   * other in both models (`adjusted`, with `adjustedSentence`); [] with one factor.
   */
  crossings: {
    other: string;
    relation: string;
    cells: number;
    message: string;
    adjusted: FTestNumbers | null;
    adjustedSentence: string | null;
  }[];
  differ: boolean | null;
  sentence: string;
  best: string | null;
  bestShare: number | null;
  resamplesCompared: number;
  resamplesLeftOut: number;
  level: number;
  returnUnit: string;
  differences: {
    level: string;
    optimumDifference: number | null;
    optimumDifferenceInterval: [number, number] | null;
    returnDifference: number | null;
    returnDifferenceInterval: [number, number] | null;
  }[];
}

export interface ResultsJson {
  tool: { name: string; version: string };
  settings: {
    units: { rate: string; yield: string };
    crop: string;
    /** The prices' currency (ISO 4217 code, or the user's label); money fields are in it. */
    currency: string;
    grainPrice: number;
    nutrientPrice: number;
    priceRatio: number;
    priceRatioUnit: string;
    product: { id: string; price: number } | null;
    boot: number;
    seed: number;
    blocks: string;
    /** Shortfall tolerance of the risk tables, money per area (as every money figure here). */
    shortfallTolerance: number;
    /** True when the tolerance is the default, the cost of 10 kg N/ha at these prices. */
    shortfallToleranceDefault: boolean;
  };
  sites: ResultsSite[];
  acrossSites: {
    sites: string[];
    bestRate: number;
    /**
     * The regional rate's interval from resampling site-years ([low, high], output units) at
     * `bestRateCILevel`; null without resamples or with one site-year.
     */
    bestRateCI: [number, number] | null;
    bestRateCILevel: number | null;
    profitableRange: [number, number];
    bestMeanReturn: number;
    returnUnit: string;
    siteOptima: { site: string; rate: number }[];
    /** The regional rate and profitable range at the price ratio times 0.5 … 2. */
    priceRatioSensitivity: {
      ratioMultiplier: number;
      priceRatio: number;
      rate: number | null;
      profitableRange: [number, number];
    }[];
    /**
     * For the tested rates and the regional rate: the share of the sites at which the rate
     * returns less than the site's own best by more than `tolerance` (a between-site risk).
     */
    shortfallRisk: {
      tolerance: number;
      toleranceUnit: string;
      sites: number;
      rows: { rate: number; share: number; recommended: boolean }[];
    } | null;
    /**
     * Per grouping column with two or more values (previous crop, soil, …, or the year): each
     * group's regional rate, profitable range and site-year interval (output units), and the F
     * test of whether the groups respond differently (null when it could not be made).
     */
    groups: {
      key: string;
      values: {
        value: string;
        sites: string[];
        bestRate: number | null;
        profitableRange: [number, number] | null;
        bestRateCI: [number, number] | null;
      }[];
      differ: { F: number; df1: number; df2: number; p: number; sentence: string } | null;
    }[];
    /** The regional quadratic mixed model (REML), output units; null without one. */
    mixed: ResultsMixedModel | null;
    /**
     * Per treatment factor found at some site (source, timing…): the regional quadratic with the
     * level as a fixed effect over the site-years that have the factor; empty without a factor.
     */
    levelMixed: ResultsLevelMixedModel[];
    /**
     * Every regional mixed model form fitted, by ML to the same site-years (the quadratic, the
     * quadratic-plateau, the linear-plateau), output units; forms with no fit are left out.
     */
    mixedModels: ResultsMixedModelForm[];
    /** Which form the AIC favours; '' with fewer than two converged fits. */
    mixedModelsSentence: string;
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

/**
 * The regional model by level in the results file (output units): one intercept `a` (the shared
 * zero-rate check) and per level its own `b` and `c`, random site-year effects on a, b, c as the
 * regional quadratic has (REML); each level's optimum at its own price ratio with its
 * delta-method interval at `ciLevel`; and whether the levels share one regional curve:
 * `likelihoodRatio` (ML fits, the headline; `differ` reads it at alpha 0.05) and `wald` (REML),
 * each χ² with its df. `model` null: no model, `reason` says why, the other fields null or empty.
 */
export interface ResultsLevelMixedModel {
  factor: string;
  model: 'quadratic-by-level' | null;
  reason: string | null;
  structure: string | null;
  siteYears: number | null;
  blockOffsets: boolean | null;
  levels: {
    level: string;
    siteYears: number;
    fixed: Record<'a' | 'b' | 'c', number>;
    stdErrors: Record<'a' | 'b' | 'c', number>;
    priceRatio: number;
    ownNutrientPrice: boolean;
    optimumRate: number;
    optimumCI: [number, number] | null;
  }[];
  /** The one regional curve for every level (ML), for comparison. */
  oneCurve: Record<'a' | 'b' | 'c', number> | null;
  variance: { siteYear: number[][]; residual: number } | null;
  likelihoodRatio: { chiSquare: number; df: number; p: number } | null;
  wald: { chiSquare: number; df: number; p: number } | null;
  differ: boolean | null;
  ciLevel: number | null;
  method: string | null;
  sentence: string;
}

/** The regional mixed model in the results file (rates and yields in the output units). */
export interface ResultsMixedModel {
  model: 'quadratic';
  /** "unstructured" or "diagonal": the site-year effects' covariance. */
  structure: string;
  siteYears: number;
  /** Whether block offsets were fitted (fixed, nested in site-year). */
  blockOffsets: boolean;
  /** Regional curve y = a + b·x + c·x², units as the quadratic's params. */
  fixed: Record<'a' | 'b' | 'c', number>;
  stdErrors: Record<'a' | 'b' | 'c', number>;
  /** siteYear: covariance of the site-year effects on (a, b, c); residual: plot error variance. */
  variance: { siteYear: number[][]; residual: number };
  /** The regional optimum at the file's prices, capped to the tested rates. */
  optimumRate: number;
  /** Its delta-method interval at `level` (null when the curve has no maximum). */
  optimumCI: [number, number] | null;
  level: number;
  method: string;
  /** AIC of the ML fit, on the output yield unit (as the site models' aicc). */
  aic: number;
}

/** One regional mixed model form in the results file (output units). */
export interface ResultsMixedModelForm {
  model: 'quadratic' | 'quadraticPlateau' | 'linearPlateau';
  /** "diagonal" or "unstructured": the site-year effects' covariance. */
  structure: string;
  /** Population curve: a, b, c (quadratic); P, c, x0 (quadratic-plateau); P, b, x0 (linear-plateau), ML. */
  fixed: Record<string, number>;
  stdErrors: Record<string, number>;
  /**
   * siteYear: covariance of the site-year effects on the parameters named in randomParameters;
   * residual: plot error variance.
   */
  variance: { randomParameters: string[]; siteYear: number[][]; residual: number };
  /** ML log-likelihood and AIC, on the output yield unit. */
  logLikelihood: number;
  aic: number;
  converged: boolean;
  /** Converged, or cycling with its fixed effects within 0.1 % over ten rounds. */
  settled: boolean;
  /** Why the fit did not converge; ''. */
  note: string;
  /** The form's optimum at the file's prices, capped to the tested rates. */
  optimumRate: number;
  /** Its delta-method interval at `level`; null without one. */
  optimumCI: [number, number] | null;
  level: number;
  method: string;
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
  const moneyUnit = `${settings.currency}/${u.areaName}`;
  const range = (r: [number, number]): [number, number] => [
    clean(u.rate(r[0])),
    clean(u.rate(r[1])),
  ];
  const riskRows = (rows: ShortfallSummary['rows']) =>
    rows.map((r) => ({
      rate: clean(u.rate(r.rateKgHa)),
      share: clean(r.share),
      recommended: r.recommended,
    }));
  const recommendationOf = (s: SiteReport): ResultsSite['recommendation'] => ({
    rate: cleanOrNull(
      s.recommendation.rateKgHa === null ? null : u.rate(s.recommendation.rateKgHa),
    ),
    interval: s.recommendation.ciKgHa
      ? [clean(u.rate(s.recommendation.ciKgHa[0])), clean(u.rate(s.recommendation.ciKgHa[1]))]
      : null,
    level: s.recommendation.level,
    model: s.recommendation.model,
    basis: s.recommendation.basis,
  });
  const modelsOf = (s: SiteReport): ResultsModel[] =>
    s.models.map((m) => ({
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
    }));
  const levelsOf = (site: string) => report.levels.filter((l) => l.site === site);
  return {
    tool: { ...report.tool },
    settings: {
      units: { rate: settings.units.rate, yield: settings.units.yield },
      crop: report.crop,
      currency: settings.currency,
      grainPrice: clean(settings.prices.grainPrice),
      nutrientPrice: clean(prices.nutrientPriceDisplay),
      priceRatio: clean(prices.priceRatioDisplay),
      priceRatioUnit: prices.priceRatioUnit,
      product: settings.prices.product ? { ...settings.prices.product } : null,
      boot: settings.boot,
      seed: settings.seed,
      blocks: settings.blocks,
      shortfallTolerance: clean(u.perArea(settings.shortfallTolerance.perHa)),
      shortfallToleranceDefault: settings.shortfallTolerance.isDefault,
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
            curvatureTest: s.responseOverCheck.curvature
              ? {
                  F: clean(s.responseOverCheck.curvature.F),
                  df1: s.responseOverCheck.curvature.df1,
                  df2: s.responseOverCheck.curvature.df2,
                  p: clean(s.responseOverCheck.curvature.p),
                }
              : null,
            reading: s.responseOverCheck.reading,
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
      recommendation: recommendationOf(s),
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
      models: modelsOf(s),
      priceRatioSensitivity: s.priceRatioSensitivity.map((r) => ({
        ratioMultiplier: r.ratioMultiplier,
        priceRatio: perN(r.priceRatioKgPerKg),
        rate: cleanOrNull(r.rateKgHa === null ? null : u.rate(r.rateKgHa)),
        interval: r.ciKgHa ? range(r.ciKgHa) : null,
      })),
      shortfallRisk: s.shortfallRisk
        ? {
            tolerance: clean(u.perArea(s.shortfallRisk.tolerancePerHa)),
            toleranceUnit: moneyUnit,
            resamples: s.shortfallRisk.count,
            rows: riskRows(s.shortfallRisk.rows),
          }
        : null,
      warnings: [...s.warnings],
      levels: levelsOf(s.site).flatMap((f) =>
        f.levels.map((l) => ({
          factor: f.factor,
          level: l.level,
          site: l.report.site,
          n: l.report.n,
          checkPlots: l.checkPlots,
          nutrientPricePerKgN: clean(l.nutrientPricePerKg),
          ownNutrientPrice: l.ownNutrientPrice,
          returnAtOptimum: cleanOrNull(
            l.returnAtOptimumPerHa === null ? null : u.perArea(l.returnAtOptimumPerHa),
          ),
          recommendation: recommendationOf(l.report),
          models: modelsOf(l.report),
        })),
      ),
      levelTest: levelsOf(s.site).map((f) => levelTestJson(f, u, moneyUnit))[0] ?? null,
      levelTests: levelsOf(s.site).map((f) => levelTestJson(f, u, moneyUnit)),
    })),
    acrossSites: report.acrossSites
      ? {
          sites: [...report.acrossSites.sites],
          bestRate: clean(u.rate(report.acrossSites.bestRateKgHa)),
          bestRateCI: report.acrossSites.bestRateInterval
            ? [
                clean(u.rate(report.acrossSites.bestRateInterval.lowKgHa)),
                clean(u.rate(report.acrossSites.bestRateInterval.highKgHa)),
              ]
            : null,
          bestRateCILevel: report.acrossSites.bestRateInterval?.level ?? null,
          profitableRange: [
            clean(u.rate(report.acrossSites.profitableRangeKgHa[0])),
            clean(u.rate(report.acrossSites.profitableRangeKgHa[1])),
          ],
          bestMeanReturn: clean(u.perArea(report.acrossSites.bestMeanReturnPerHa)),
          returnUnit: moneyUnit,
          siteOptima: report.acrossSites.siteOptima.map((o) => ({
            site: o.site,
            rate: clean(u.rate(o.rateKgHa)),
          })),
          priceRatioSensitivity: report.acrossSites.priceRatioSensitivity.map((r) => ({
            ratioMultiplier: r.ratioMultiplier,
            priceRatio: perN(r.priceRatioKgPerKg),
            rate: cleanOrNull(r.rateKgHa === null ? null : u.rate(r.rateKgHa)),
            profitableRange: range(r.profitableRangeKgHa!),
          })),
          shortfallRisk: report.acrossSites.shortfallRisk
            ? {
                tolerance: clean(u.perArea(report.acrossSites.shortfallRisk.tolerancePerHa)),
                toleranceUnit: moneyUnit,
                sites: report.acrossSites.shortfallRisk.count,
                rows: riskRows(report.acrossSites.shortfallRisk.rows),
              }
            : null,
          mixed: report.acrossSites.mixed ? mixedJson(report.acrossSites.mixed, u, fy2) : null,
          levelMixed: report.levelMixed.map((m) => levelMixedJson(m, u, fy2, perN)),
          mixedModels: report.acrossSites.mixedModels.map((m) => mixedFormJson(m, u, fy2)),
          mixedModelsSentence: report.acrossSites.mixedModelsSentence,
          groups: report.acrossSites.groups.map((g) => ({
            key: g.key,
            values: g.values.map((v) => ({
              value: v.value,
              sites: [...v.sites],
              bestRate: cleanOrNull(v.bestRateKgHa === null ? null : u.rate(v.bestRateKgHa)),
              profitableRange: v.profitableRangeKgHa ? range(v.profitableRangeKgHa) : null,
              bestRateCI: v.bestRateIntervalKgHa ? range(v.bestRateIntervalKgHa) : null,
            })),
            differ: g.differ
              ? {
                  ...fNumbers({
                    F: g.differ.F,
                    df1: g.differ.df1,
                    df2: g.differ.df2,
                    p: g.differ.p,
                  }),
                  sentence: g.differ.sentence,
                }
              : null,
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

/**
 * A regional quadratic's a, b, c in output units: each scales like the site quadratic's parameter.
 * @param u - display-unit converters
 * @returns the scale factors of a, b and c, and a converter of one {a, b, c}
 */
function quadraticInOutputUnits(u: UnitScale): {
  f: number[];
  per: (v: { a: number; b: number; c: number }) => Record<'a' | 'b' | 'c', number>;
} {
  const names = ['a', 'b', 'c'] as const;
  const f = names.map((k) => u.param('quadratic', k, 1));
  return {
    f,
    per: (v) =>
      Object.fromEntries(names.map((k, i) => [k, clean(v[k] * f[i])])) as Record<
        'a' | 'b' | 'c',
        number
      >,
  };
}

/** The mixed model in output units: each coefficient scales like the quadratic's parameter. */
function mixedJson(m: MixedModelReport, u: UnitScale, fy2: number): ResultsMixedModel {
  const { f, per } = quadraticInOutputUnits(u);
  const ci = m.optimum.interval;
  return {
    model: 'quadratic',
    structure: m.fit.structure,
    siteYears: m.fit.siteYears,
    blockOffsets: m.fit.blockOffsets,
    fixed: per(m.fit.fixed),
    stdErrors: per(m.fit.stdErrors),
    variance: {
      siteYear: m.fit.siteCovariance.map((row, i) => row.map((v, j) => clean(v * f[i] * f[j]))),
      residual: clean(m.fit.residualVariance * fy2),
    },
    optimumRate: clean(u.rate(m.optimum.rateKgHa)),
    optimumCI: ci ? [clean(u.rate(ci.lowKgHa)), clean(u.rate(ci.highKgHa))] : null,
    level: m.optimum.level,
    method: m.optimum.method,
    aic: clean(m.fit.aic + m.fit.observations * Math.log(fy2)),
  };
}

/** The regional model by level in output units (coefficients scale as the quadratic's). */
function levelMixedJson(
  m: LevelMixedReport,
  u: UnitScale,
  fy2: number,
  perN: (kgPerKg: number) => number,
): ResultsLevelMixedModel {
  const { f, per } = quadraticInOutputUnits(u);
  const chi = (t: { statistic: number; df: number; p: number }) => ({
    chiSquare: clean(t.statistic),
    df: t.df,
    p: clean(t.p),
  });
  const fit = m.fit;
  const sentence = levelMixedSentence(m, {
    rate: (r) => `${Math.round(u.rate(r))} ${u.units.rate}`,
  });
  return {
    factor: m.factor,
    model: fit ? fit.model : null,
    reason: m.reason,
    structure: fit?.structure ?? null,
    siteYears: fit?.siteYears ?? null,
    blockOffsets: fit?.blockOffsets ?? null,
    levels: fit
      ? fit.levels.map((c, k) => {
          const o = m.levels[k]?.optimum;
          return {
            level: c.level,
            siteYears: c.siteYears,
            fixed: per(c.fixed),
            stdErrors: per(c.stdErrors),
            priceRatio: perN(m.levels[k]?.priceRatio ?? NaN),
            ownNutrientPrice: m.levels[k]?.ownNutrientPrice ?? false,
            optimumRate: clean(u.rate(o?.rateKgHa ?? NaN)),
            optimumCI: o?.interval
              ? [clean(u.rate(o.interval.lowKgHa)), clean(u.rate(o.interval.highKgHa))]
              : null,
          };
        })
      : [],
    oneCurve: fit ? per(fit.oneCurve) : null,
    variance: fit
      ? {
          siteYear: fit.siteCovariance.map((row, i) => row.map((v, j) => clean(v * f[i] * f[j]))),
          residual: clean(fit.residualVariance * fy2),
        }
      : null,
    likelihoodRatio: fit ? chi(fit.likelihoodRatio) : null,
    wald: fit ? chi(fit.wald) : null,
    differ: fit ? fit.likelihoodRatio.p < m.alpha : null,
    ciLevel: m.levels[0]?.optimum.level ?? null,
    method: m.levels[0]?.optimum.method ?? null,
    sentence,
  };
}

/** One mixed model form in output units: each parameter scales like its site model's. */
function mixedFormJson(m: MixedModelFormReport, u: UnitScale, fy2: number): ResultsMixedModelForm {
  const factor = (name: string) => u.param(mixedFormParamModel(m.model, name), name, 1);
  const per = (v: Record<string, number>) =>
    Object.fromEntries(Object.entries(v).map(([k, x]) => [k, clean(x * factor(k))]));
  const f = m.randomParameters.map(factor);
  const ci = m.optimum.interval;
  // ℓ in yield units y·s: ℓ − n·ln s; the AIC gains n·ln s² (as the quadratic's aic above).
  return {
    model: m.model,
    structure: m.structure,
    fixed: per(m.fixed),
    stdErrors: per(m.stdErrors),
    variance: {
      randomParameters: [...m.randomParameters],
      siteYear: m.siteCovariance.map((row, i) => row.map((v, j) => clean(v * f[i] * f[j]))),
      residual: clean(m.residualVariance * fy2),
    },
    logLikelihood: clean(m.logLikelihoodMl - (m.observations * Math.log(fy2)) / 2),
    aic: clean(m.aic + m.observations * Math.log(fy2)),
    converged: m.converged,
    settled: m.settled,
    note: m.note,
    optimumRate: clean(u.rate(m.optimum.rateKgHa)),
    optimumCI: ci ? [clean(u.rate(ci.lowKgHa)), clean(u.rate(ci.highKgHa))] : null,
    level: m.optimum.level,
    method: m.optimum.method,
  };
}

function fNumbers(t: FTestNumbers): FTestNumbers {
  return { F: clean(t.F), df1: t.df1, df2: t.df2, p: clean(t.p) };
}

/**
 * The results file's text, as the command line writes it and the workspace exports it: two-space
 * indented JSON with a final newline, so the same analysis gives the same bytes from both.
 * @param report - the assembled report
 * @returns the text of the .json file
 * @example
 * resultsJsonText(report).endsWith('}\n') // true
 */
export function resultsJsonText(report: TrialReport): string {
  return [...resultsJsonPieces(report)].join('');
}

/**
 * The results file's text in pieces, in order: together exactly `JSON.stringify(results, null,
 * 2)` and a newline, with each element of a top-level list (each site) its own piece, so a run of
 * thousands of sites writes the file without ever making it one string (at 10,000 sites that
 * string is 72 M characters, and turning it into bytes cost 0.7 s).
 * @param report - the assembled report
 * @returns a generator of text pieces
 * @example
 * [...resultsJsonPieces(report)].join('') === resultsJsonText(report) // true
 */
export function* resultsJsonPieces(report: TrialReport): Generator<string> {
  const doc = resultsJson(report) as unknown as Record<string, unknown>;
  // JSON.stringify leaves out keys whose value is undefined (or a function); so does this.
  const keys = Object.keys(doc).filter((k) => JSON.stringify(doc[k]) !== undefined);
  yield '{\n';
  for (const [i, key] of keys.entries()) {
    const comma = i < keys.length - 1 ? ',' : '';
    const value = doc[key];
    if (Array.isArray(value) && value.length > 0) {
      yield `  ${JSON.stringify(key)}: [\n`;
      for (const [j, item] of value.entries()) {
        // An array element JSON.stringify cannot write (undefined, a function) is written null.
        const text = JSON.stringify(item, null, 2) ?? 'null';
        yield `    ${nested(text, '    ')}${j < value.length - 1 ? ',' : ''}\n`;
      }
      yield `  ]${comma}\n`;
    } else {
      yield `  ${JSON.stringify(key)}: ${nested(JSON.stringify(value, null, 2), '  ')}${comma}\n`;
    }
  }
  yield '}\n';
}

/** JSON text moved right by an indent, as it is when nested that deep. */
function nested(text: string, indent: string): string {
  return text.replaceAll('\n', `\n${indent}`);
}

/** A site's level tests and comparison in the output units. */
function levelTestJson(f: SiteLevelsReport, u: UnitScale, moneyUnit: string): ResultsLevelTest {
  const numbers = (r: SiteLevelsReport['test']['quadratic']['result']): FTestNumbers | null =>
    r.kind === 'f-test' ? fNumbers({ F: r.f, df1: r.df1, df2: r.df2, p: r.p }) : null;
  const q = f.test.quadratic.result;
  const pair = (r: [number, number] | null, scale: (v: number) => number) =>
    r ? ([clean(scale(r[0])), clean(scale(r[1]))] as [number, number]) : null;
  // A difference of rates scales like a rate (kg/ha → lb/ac is a factor, no offset).
  return {
    factor: f.factor,
    levels: [...f.test.levels],
    blocks: f.test.blocks,
    quadratic: numbers(q),
    linear: numbers(f.test.linear.result),
    // Saved analyses from before the plateau tests have none: null, as for no test.
    quadraticPlateau: f.test.quadraticPlateau ? numbers(f.test.quadraticPlateau.result) : null,
    linearPlateau: f.test.linearPlateau ? numbers(f.test.linearPlateau.result) : null,
    crossings: (f.test.crossings ?? []).map((c) => ({
      other: c.other,
      relation: c.relation,
      cells: c.cells,
      message: c.message,
      adjusted: c.adjusted ? numbers(c.adjusted.result) : null,
      adjustedSentence: c.adjusted?.sentence ?? null,
    })),
    differ: q.kind === 'f-test' ? q.p < f.test.alpha : null,
    sentence: f.test.quadratic.sentence,
    best: f.comparison.best,
    bestShare: f.comparison.bestShare === null ? null : clean(f.comparison.bestShare),
    resamplesCompared: f.comparison.resamplesCompared,
    resamplesLeftOut: f.comparison.resamplesLeftOut,
    level: f.comparison.level,
    returnUnit: moneyUnit,
    differences: f.comparison.differences.map((d) => ({
      level: d.level,
      optimumDifference: cleanOrNull(
        d.optimumDifferenceKgHa === null ? null : u.rate(d.optimumDifferenceKgHa),
      ),
      optimumDifferenceInterval: pair(d.optimumDifferenceIntervalKgHa, u.rate),
      returnDifference: cleanOrNull(
        d.returnDifferencePerHa === null ? null : u.perArea(d.returnDifferencePerHa),
      ),
      returnDifferenceInterval: pair(d.returnDifferenceIntervalPerHa, u.perArea),
    })),
  };
}
