/**
 * Everything the report writers (workbook, grower page, PDF, JSON) read: one
 * value assembled from the engine's results by analyzeTrials. Numbers are in
 * canonical units (rates and yields kg/ha, money per ha) with the unit in the
 * field name; each writer converts to the display units in `settings.units`.
 * Keeping the writers on this one summary means a change inside an engine
 * stage touches only assembleReport, not every writer.
 */
import type { LevelResponseTests } from '../analysis/levelResponseTest';
import type { LevelComparison } from '../analysis/priceLevels';
import type { ModelName, FitStatus } from '../models/modelTypes';
import type { RecommendationBasis } from '../analysis/siteDecision';
import type { ResponseOverCheckOutcome } from '../analysis/siteResponseOverCheck';
import type { IntervalBasis } from '../economics/drawChoices';
import type { OptimumShares } from '../economics/optimumInterval';
import type { OptimumProfileInterval } from '../economics/optimumProfile';
import type { MixedModelOptimum } from '../economics/mixedModelOptimum';
import type { RegionalMixedModel } from '../analysis/regionalMixedModel';
import type { RegionalLevelMixedModel } from '../analysis/regionalLevelMixedModel';
import type { PricedLevelMixedCurve } from '../analysis/priceLevelMixedModel';
import type { RateProfileInterval } from '../models/joinProfile';
import type { MappingEntry } from '../import/mappingEntries';
import type { Plot, SourceFile, CropId } from '../table/plotTable';

export type { MappingEntry } from '../import/mappingEntries';
import type { PriceTerms } from '../economics/priceQuote';
import type { ReportSettings } from './reportSettings';
import type { RegionalChartData } from './regionalReturnChart';

/** One model's fit at one site, as the model table and the JSON show it. */
export interface ModelRow {
  model: ModelName;
  /** Human name, e.g. "Quadratic-plateau". */
  label: string;
  status: FitStatus;
  /** One sentence on the status. */
  message: string;
  /** Curve parameters by name, canonical units (kg/ha, kg grain per kg N, ha/kg). */
  params: Record<string, number>;
  stdErrors: Record<string, number>;
  /** Residual sum of squares, (kg/ha)². */
  sse: number;
  dfResidual: number;
  aicc: number;
  r2: number;
  /** Economic optimum rate, kg/ha; null when the model gives none. */
  optimumRateKgHa: number | null;
  /** Interval of the optimum, kg/ha (bootstrap for the chosen model, else null). */
  optimumCiKgHa: [number, number] | null;
  /**
   * Profile interval of the join x0 at the analysis' interval level, kg/ha, with its open ends
   * (shared/models/joinProfile); null unless the model has a join and reports one ("ok").
   */
  joinProfile: RateProfileInterval | null;
  /**
   * Profile interval of the optimum at these prices, kg/ha, beside the bootstrap one (the
   * chosen model only, where optimumProfileInterval gives one: the linear-plateau, the quadratic).
   */
  optimumProfile: OptimumProfileInterval | null;
  /** Predicted yield at the optimum, kg/ha. */
  yieldAtOptimumKgHa: number | null;
  /** Why there is no optimum or it is capped, e.g. "corner: highest tested rate". */
  optimumNote: string;
  /** The fitted curve on a grid, kg/ha, for charts. */
  curve: { rateKgHa: number[]; yieldKgHa: number[] };
}

/** The intercept test in the units-free form the report shows. */
export interface InterceptSummary {
  t: number;
  F: number;
  df1: number;
  df2: number;
  p: number;
  interceptKgHa: number;
  interceptSeKgHa: number;
  interceptNeeded: boolean;
  verdict: string;
}

/**
 * The gain over the check (shared/sites siteResponseOverCheck): slope in kg grain per kg N,
 * yields in kg/ha, or why it is not available.
 */
export type ResponseOverCheckSummary =
  ({ available: true } & ResponseOverCheckOutcome) | { available: false; message: string };

/** Lack-of-fit of the chosen model against pure error, or why it is not available. */
export type LackOfFitSummary =
  | { available: true; model: ModelName; F: number; df1: number; df2: number; p: number }
  | { available: false; model: ModelName | null; message: string };

export type { AnovaRow, AnovaSummary, TreatmentMeanRow } from '../analysis/siteAnova';
import type { AnovaSummary, TreatmentMeanRow } from '../analysis/siteAnova';

/** The bootstrap interval of the site's optimum (shared/economics/optimumInterval). */
export interface BootstrapSummary {
  /** Resamples drawn; every one is counted in the interval. */
  count: number;
  seed: number;
  level: number;
  /** Percentile interval over all resamples, kg/ha. */
  ciKgHa: [number, number] | null;
  /** "model-reselected": the model chosen again in each resample; "fixed-model": the analyst's pick throughout. */
  basis: IntervalBasis;
  /** Share of resamples counted as a curve's optimum, no plateau, full response, no response. */
  shares: OptimumShares;
  /** Share of resamples each model decided. */
  modelShares: Partial<Record<ModelName, number>>;
}

/** The recommendation at one multiple of the price ratio (shared/economics/priceRatioSensitivity). */
export interface SensitivitySummaryRow {
  /** The multiple of the user's price ratio, e.g. 1.5 (the nitrogen price scaled, grain kept). */
  ratioMultiplier: number;
  /** The price ratio of the row, kg grain per kg N. */
  priceRatioKgPerKg: number;
  /** The recommended rate (site) or regional rate at this ratio, kg/ha; null without one. */
  rateKgHa: number | null;
  /** Site: the bootstrap interval at this ratio, kg/ha; null without one (and for the region). */
  ciKgHa: [number, number] | null;
  /** Region: the profitable range at this ratio, kg/ha; null for a site. */
  profitableRangeKgHa: [number, number] | null;
}

/** The shortfall risk of candidate rates (shared/economics/shortfallRisk, regionalShortfallRisk). */
export interface ShortfallSummary {
  /** Shortfall beyond which a rate counts as falling short, currency/ha. */
  tolerancePerHa: number;
  /** What the shares are of: a site's resamples, or the sites of a region. */
  of: 'resamples' | 'sites';
  /** How many resamples or sites. */
  count: number;
  rows: {
    rateKgHa: number;
    /** Share of the resamples (site) or sites (region) in which the rate falls short, 0–1. */
    share: number;
    /** True on the recommended (site) or regional (region) rate. */
    recommended: boolean;
  }[];
}

export interface SiteReport {
  /** The site-year's display name (shared/table/siteYear): "Alder Flats 2024" or the site's name. */
  site: string;
  /** The harvest year, or null when the plots carry none. */
  year: number | null;
  /** Plots used in the fits. */
  n: number;
  /** Every plot of the site, excluded ones too (with reasons). */
  plots: Plot[];
  interceptTest: InterceptSummary | null;
  /** Gains over the zero-rate plot of the same block, fitted through the origin. */
  responseOverCheck: ResponseOverCheckSummary;
  lackOfFit: LackOfFitSummary;
  anova: AnovaSummary | null;
  treatmentMeans: TreatmentMeanRow[];
  models: ModelRow[];
  /** Model the recommendation uses; null when none gives a usable optimum. */
  bestModel: ModelName | null;
  /** Why it was chosen, a phrase without a final stop ("lowest AICc of the models fitted, …"). */
  bestModelReason: string;
  /** True when the analyst picked bestModel over the recommendation model (the reason says which). */
  bestModelPicked: boolean;
  bootstrap: BootstrapSummary | null;
  /** The site's recommendation as its decision makes it (shared/analysis/siteDecision). */
  recommendation: SiteRecommendation;
  /**
   * Rates whose return over the check, from the chosen curve, is within
   * `bandPerHa` of the best, kg/ha; null without a chosen model.
   */
  profitableRangeKgHa: [number, number] | null;
  /**
   * Lowest and highest optimum of the ranked curves (optimumAcrossModels), kg/ha; null with
   * fewer than two curves that give one. A wide spread means the choice of model matters.
   */
  optimumSpreadKgHa: [number, number] | null;
  /** Net return over the check at the optimum, currency/ha; null without one. */
  returnAtOptimumPerHa: number | null;
  /** The recommendation at 0.5, 0.75, 1, 1.5 and 2 times the price ratio; [] without one. */
  priceRatioSensitivity: SensitivitySummaryRow[];
  /** The risk that each tested rate and the recommended rate fall short; null without resamples. */
  shortfallRisk: ShortfallSummary | null;
  /** The site's treatment design in words for the reader, e.g. "4 blocks × 6 rates". */
  designText: string;
  /** Residuals of the chosen model, one per plot used (kg/ha), for the residual panel. */
  residuals: { rateKgHa: number; residualKgHa: number; block: string | null }[];
  /** Tested rates, kg/ha, ascending. */
  ratesKgHa: number[];
  /** Findings a reader must see next to the numbers. */
  warnings: string[];
}

/** A site's recommendation: rate, interval and what it rests on. */
export interface SiteRecommendation {
  /**
   * The recommended rate, kg/ha: the optimum; for a full response that pays, the top of its
   * range (the optimum lies at or below it); 0 for no response; null without a leading model.
   */
  rateKgHa: number | null;
  /** For a full response that pays: the rates the optimum lies between, kg/ha; else null. */
  rangeKgHa: [number, number] | null;
  /** The bootstrap interval of the optimum, kg/ha; null without one. */
  ciKgHa: [number, number] | null;
  /** The interval's level, e.g. 0.9. */
  level: number;
  model: ModelName | null;
  /** What it rests on; null without a leading model. */
  basis: RecommendationBasis | null;
  /**
   * The plain sentence that goes with no response (noResponseSentence); "" otherwise (a full
   * response's sentence needs the display units: fullResponseSentence).
   */
  sentence: string;
}

export interface AcrossSitesReport {
  sites: string[];
  /** Rate with the highest mean return over the sites, kg/ha. */
  bestRateKgHa: number;
  /** Rates whose mean return is within the band of the best, kg/ha. */
  profitableRangeKgHa: [number, number];
  /** Band below the best mean return that defines the range, currency/ha. */
  bandPerHa: number;
  bestMeanReturnPerHa: number;
  meanYieldGainAtBestKgHa: number;
  /** The regional chart's curve, ribbon and risk (shared/report/regionalReturnChart). */
  chart: RegionalChartData;
  siteOptima: { site: string; rateKgHa: number; returnPerHa: number }[];
  /** The regional rate and profitable range at 0.5, 0.75, 1, 1.5 and 2 times the price ratio. */
  priceRatioSensitivity: SensitivitySummaryRow[];
  /** The share of sites each tested rate and the regional rate leave short (between sites). */
  shortfallRisk: ShortfallSummary | null;
  /**
   * The regional rate's interval from resampling site-years, kg/ha, with its level and the
   * number of resamples (shared/analysis/regionalRateInterval); null without resamples.
   */
  bestRateInterval: { lowKgHa: number; highKgHa: number; level: number; resamples: number } | null;
  /** Pooling F-tests: does one response describe every site? */
  tests: { question: string; F: number; df1: number; df2: number; p: number; verdict: string }[];
  notes: string[];
  /** The regional quadratic mixed model (kg/ha) and its optimum at these prices; null without one. */
  mixed: MixedModelReport | null;
  /**
   * Every regional mixed model form tried (the quadratic, then the plateau forms), fitted by ML
   * to the same site-years, with its optimum at these prices; forms with no fit are left out.
   */
  mixedModels: MixedModelFormReport[];
  /** Which form the AIC favours (mixedModelFormsSentence); '' with fewer than two fits. */
  mixedModelsSentence: string;
  /** Per grouping column with two or more values: each group's regional rate and the test between them. */
  groups: GroupReport[];
}

/** One grouping column (previous crop, soil, …, or the year) across the sites. */
export interface GroupReport {
  key: string;
  values: {
    value: string;
    sites: string[];
    /** The group's regional rate, kg/ha; null when none of its sites has a curve to pool. */
    bestRateKgHa: number | null;
    profitableRangeKgHa: [number, number] | null;
    /** The group's rate interval from resampling its site-years, kg/ha; null without one. */
    bestRateIntervalKgHa: [number, number] | null;
    /** The group's regional return chart (as the region's), for its grower page; null without a rate. */
    chart: RegionalChartData | null;
  }[];
  /** Do the groups respond differently? The quadratic test with site levels. */
  differ: { F: number; df1: number; df2: number; p: number; sentence: string } | null;
}

/** The regional mixed model as the report shows it: the fit (kg/ha) and the priced optimum. */
export interface MixedModelReport {
  fit: Omit<RegionalMixedModel, 'siteCurves'>;
  /** Each site-year's own curve (regional curve plus its conditional modes), kg/ha. */
  siteCurves: RegionalMixedModel['siteCurves'];
  optimum: MixedModelOptimum;
}

/** One regional mixed model form as the report lists it, kg/ha. */
export interface MixedModelFormReport {
  model: 'quadratic' | 'quadraticPlateau' | 'linearPlateau';
  /** "diagonal" or "unstructured": the site-year effects' covariance. */
  structure: string;
  /**
   * Population curve by parameter name, in the model's own units (a, b, c for the quadratic;
   * P, c, x0 for the quadratic-plateau; P, b, x0 for the linear-plateau).
   */
  fixed: Record<string, number>;
  stdErrors: Record<string, number>;
  /** The parameters with a site-year effect, in the order of siteCovariance's rows. */
  randomParameters: string[];
  siteCovariance: number[][];
  /** σ², (kg/ha)². */
  residualVariance: number;
  logLikelihoodMl: number;
  /** AIC of the ML fit, kg/ha. */
  aic: number;
  observations: number;
  converged: boolean;
  /** Converged, or cycling within 0.1 % (the plateau forms); ranked by the AIC sentence. */
  settled: boolean;
  /** Why the fit did not converge; ''. */
  note: string;
  optimum: MixedModelOptimum;
  /**
   * Each site-year's own plateau and join (the population curve plus its conditional modes),
   * kg/ha; the plateau forms only (the quadratic's curves are in `mixed.siteCurves`).
   */
  siteCurves: { site: string; plateauKgHa: number; joinKgHa: number }[];
}

/** An F test's numbers as the report prints them. */
export interface FTestNumbers {
  F: number;
  df1: number;
  df2: number;
  p: number;
}

/** The years of one site compared (shared/analysis/yearsCompared). */
export interface YearComparisonReport {
  /** The site's own name. */
  site: string;
  /** Its site-years' display names, in table order. */
  siteYears: string[];
  /** Their years, same order (null: plots without a year). */
  years: (number | null)[];
  /** One quadratic per year against one response shared by the years, each year its own level; null: no test. */
  response: FTestNumbers | null;
  /** One yield level per year against one for all; null: no test. */
  level: FTestNumbers | null;
  /** Whether the response differs at the analysis' level; null without a test. */
  responseDiffers: boolean | null;
  /** Both results in plain words. */
  sentence: string;
}

export interface TrialReport {
  tool: { name: string; version: string };
  /** When the analysis ran, ISO 8601 (given by the caller so tests can fix it). */
  createdAt: string;
  crop: CropId;
  /** The run's settings, with the shortfall tolerance the priced view used. */
  settings: ReportSettings & Required<Pick<ReportSettings, 'shortfallTolerance'>>;
  prices: PriceTerms;
  sources: SourceFile[];
  mapping: MappingEntry[];
  sites: SiteReport[];
  acrossSites: AcrossSitesReport | null;
  /** Each site seen in several years, its years compared; empty when there is none. */
  yearsCompared: YearComparisonReport[];
  /** Findings about the whole run (defaulted prices, skipped sites). */
  warnings: string[];
  /** Rate × factor sites (source, timing…): each level reported as a site; empty without a factor. */
  levels: SiteLevelsReport[];
  /**
   * Per treatment factor found at some site: the regional quadratic by level over its site-years
   * and each level's regional optimum at its own price; empty without a factor.
   */
  levelMixed: LevelMixedReport[];
}

/** A factor's regional model by level (kg/ha), or why there is none, and its levels priced. */
export interface LevelMixedReport {
  factor: string;
  fit: RegionalLevelMixedModel | null;
  /** Why there is no model; null with one. */
  reason: string | null;
  /** Each level's population optimum at its own price ratio (kg N/ha); [] without a model. */
  levels: PricedLevelMixedCurve[];
  /** The significance level the sentence reads the tests at. */
  alpha: number;
}

/** One treatment level of a rate × factor site, reported as a site of its own. */
export interface LevelReport {
  level: string;
  /** The level's plots (its own and the shared checks) as a site: "Hollins Gap (Timing: Split)". */
  report: SiteReport;
  /** Shared check plots among them. */
  checkPlots: number;
  /** The N price it was priced at, currency per kg N, and whether it is the level's own. */
  nutrientPricePerKg: number;
  ownNutrientPrice: boolean;
  /** Net return at its recommended rate, currency/ha; null without one. */
  returnAtOptimumPerHa: number | null;
}

/** A rate × factor site: its levels, whether they differ, which returns most. */
export interface SiteLevelsReport {
  site: string;
  /** The factor's column header. */
  factor: string;
  levels: LevelReport[];
  test: LevelResponseTests;
  comparison: LevelComparison;
}
