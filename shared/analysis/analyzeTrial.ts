/**
 * The one analysis run: a plot table and its settings in, every site × model,
 * the site-level tests, the bootstrap draws behind the intervals, the quality
 * findings and the across-site results out. The command line and the
 * workspace both call this (the workspace step by step, to report progress and
 * to stop between sites), so the same file gives the same numbers in both.
 * Prices enter only through priceTrial: a new price or a user's model pick is
 * a re-pricing of this result, never a refit.
 */
import { checkQuality } from '../quality/checkQuality';
import { fitRateBlockModel } from '../stats/rateBlockModel';
import type { QualityFinding } from '../table/qualityFinding';
import type { CropId, PlotTable } from '../table/plotTable';
import {
  acrossSitesPreview,
  regionalModelsAcross,
  type AcrossRegionalModels,
  type AcrossSiteAnalysis,
} from './acrossSites';
import { CURVE_POINTS, type AnalysisSettings } from './analysisSettings';
import {
  analyzeSite,
  drawSite,
  siteDrawJob,
  type SiteAnalysis,
  type SiteDrawJob,
} from './analyzeSite';
import type { BootstrapDraws } from '../economics/bootstrapDraws';
import { trialLevels, type SiteLevelsAnalysis } from './analyzeLevels';
import { levelMixedAcrossSites } from './levelMixedAcrossSites';
import { planAcrossSites } from './planAcrossSites';
import type { NoRegionalLevelMixedModel, RegionalLevelMixedModel } from './regionalLevelMixedModel';
import type { SitePlots } from './sitePlots';

/** Everything the analysis found, price-free except for its first pricing at `settings.prices`. */
export interface TrialAnalysis {
  settings: AnalysisSettings;
  crop: CropId;
  /** The table analyzed (plots with their cells and exclusions, sources). */
  table: PlotTable;
  /** Each site's plots used in the fits, in the table's site order. */
  plots: SitePlots[];
  /** Data findings of the quality checks (shared/quality), most severe first. */
  findings: QualityFinding[];
  /** Fits, tests and draws per site; rows, pooling tests and regional rate at the first prices. */
  across: AcrossSiteAnalysis;
  /**
   * Rate × factor sites (PlotTable.factorKeys): each level analyzed as a site of its own (its
   * plots and the shared checks) and the tests of whether the levels differ; [] without a factor.
   */
  levels: SiteLevelsAnalysis[];
  /**
   * Per treatment factor found at some site: the regional quadratic over its site-years with the
   * level as a fixed effect and the tests of one curve for every level (levelMixedAcrossSites),
   * or why there is none; [] without a factor.
   */
  levelMixed: (RegionalLevelMixedModel | NoRegionalLevelMixedModel)[];
}

/** Each site's bootstrap draws, in the table's site order (null where a site has none). */
export type SiteResamples = (BootstrapDraws | null)[];

/**
 * A step of the analysis, in this order: a site fitted (once per site); the preview of the whole
 * result, every site's draws and the regional mixed models and group comparisons still to make
 * (once); with resamples, the draws wanted (once: a caller may draw the jobs elsewhere and pass
 * the draws to the generator's next()), then, when drawn here, a site resampled (once per site);
 * every site's draws (once, with resamples).
 */
export type TrialAnalysisStep =
  | { kind: 'site'; done: number; total: number; site: string }
  | { kind: 'preview'; analysis: TrialAnalysis }
  | { kind: 'draws-wanted'; jobs: (SiteDrawJob | null)[] }
  | { kind: 'resampling'; done: number; total: number; site: string }
  | { kind: 'resampled'; draws: SiteResamples };

/**
 * The analysis as steps: yields each site's name after it is fitted, then a preview of the
 * result (acrossSitesPreview: every site's own result, the regional rate; the sites' bootstrap
 * draws, the regional mixed models and group comparisons pending), then the draws wanted (each
 * site's job; a caller that passes the draws to next() has drawn them elsewhere), else each
 * site's name after it is resampled here, then the draws, and returns the whole result. A caller that must report
 * progress, stop between sites or show the sites first (the workspace's worker) drives it;
 * analyzeTrial runs it to the end. The preview costs nothing extra: the whole result is built
 * from it (withDraws, withRegionalModels). The draws come after every site's fits because they
 * are most of a site's time (200 resamples of every model) and only the intervals and risks read
 * them: measured on the demo in chromium, its first optimum came 0.4–0.8 s sooner (medians of
 * 1.72–1.80 against 2.20–2.58 s).
 * @param table - the plot table (canonical kg/ha)
 * @param settings - complete analysis settings (analysisSettings fills the defaults)
 * @returns a generator of steps whose return value is the TrialAnalysis
 * @throws as analyzeTrial
 * @example
 * const steps = analyzeTrialSteps(table, settings);
 * for (let s = steps.next(); !s.done; s = steps.next()) report(s.value);
 */
export function* analyzeTrialSteps(
  table: PlotTable,
  settings: AnalysisSettings,
): Generator<TrialAnalysisStep, TrialAnalysis, SiteResamples | undefined> {
  const plan = planAcrossSites(table, {
    prices: settings.prices,
    blocks: settings.blocks,
    siteModels: settings.siteModels,
    curvePoints: CURVE_POINTS,
    resamples: settings.resamples,
    seed: settings.seed,
    intervalLevel: settings.intervalLevel,
    factorKeys: table.factorKeys,
  });
  // Each site's rate + block model, fitted once: the quality checks (CV, outliers) and the
  // site's analysis (rate effect, ANOVA, gain over the check) read the same fit.
  const rateBlock = plan.plots.map((p) =>
    fitRateBlockModel({ rateKgHa: p.rateKgHa, yieldKgHa: p.yieldKgHa, block: p.block }),
  );
  const findings = checkQuality(table, {
    rateBlockModels: new Map(plan.plots.map((p, i) => [p.site, rateBlock[i]])),
  });
  const sites: SiteAnalysis[] = [];
  const total = plan.plots.length;
  // The fits first, the draws after the preview (siteDrawJob, seeded by the site's index: the same
  // draws as analyzeSite's in one go).
  const fitsOnly = { ...plan.options, resamples: 0 };
  for (const [i, p] of plan.plots.entries()) {
    sites.push(analyzeSite(p, fitsOnly, i, rateBlock[i]));
    yield { kind: 'site', done: i + 1, total, site: p.site };
  }
  const preview: TrialAnalysis = {
    settings,
    crop: table.crop,
    table,
    plots: [...plan.plots],
    findings,
    across: acrossSitesPreview(plan, sites),
    levels: trialLevels(table, plan.plots, plan.options),
    levelMixed: [],
  };
  yield { kind: 'preview', analysis: preview };
  let whole = preview;
  if (plan.options.resamples > 0) {
    const jobs = plan.plots.map((p, i) => siteDrawJob(p, sites[i], plan.options, i));
    // Each job is seeded by its site's index, so draws made on other threads are these draws.
    const given = yield { kind: 'draws-wanted', jobs };
    let draws: SiteResamples = [];
    if (given !== undefined) {
      if (given.length !== jobs.length) {
        throw new Error(`${given.length} sites' draws for ${jobs.length} sites`);
      }
      draws = given;
    } else {
      for (const [i, job] of jobs.entries()) {
        draws.push(job && drawSite(job));
        yield { kind: 'resampling', done: i + 1, total, site: plan.plots[i].site };
      }
    }
    yield { kind: 'resampled', draws };
    whole = withDraws(preview, draws);
  }
  return withRegionalModels(whole, {
    across: regionalModelsAcross(plan, whole.across),
    levelMixed: levelMixedAcrossSites(table, plan.plots, whole.levels),
  });
}

/**
 * The analysis with its sites' bootstrap draws laid in: how analyzeTrialSteps completes its
 * preview, and how a window that holds the preview completes it without receiving the sites
 * again. Each site is a new object (the preview's are not changed).
 * @param analysis - the preview (or any analysis of the same sites)
 * @param draws - each site's draws in the analysis' site order (the 'resampled' step)
 * @returns the analysis with every site's draws
 * @throws {Error} when the draws are not one per site
 */
export function withDraws(analysis: TrialAnalysis, draws: SiteResamples): TrialAnalysis {
  const { sites } = analysis.across;
  if (draws.length !== sites.length) {
    throw new Error(`${draws.length} sites' draws for an analysis of ${sites.length} sites`);
  }
  return {
    ...analysis,
    across: { ...analysis.across, sites: sites.map((s, i) => ({ ...s, draws: draws[i] })) },
  };
}

/** What the whole analysis adds to its preview: the regional mixed models, group comparisons and level mixed models. */
export interface TrialRegionalModels {
  across: AcrossRegionalModels;
  levelMixed: TrialAnalysis['levelMixed'];
}

/**
 * The whole analysis from its preview and the parts the preview left pending: how
 * analyzeTrialSteps ends, and how a window that already holds the preview completes it without
 * receiving the sites again.
 * @param preview - the analysis' preview
 * @param models - the parts it left pending (regionalModelsOf the whole analysis)
 * @returns the whole analysis
 */
export function withRegionalModels(
  preview: TrialAnalysis,
  models: TrialRegionalModels,
): TrialAnalysis {
  return {
    ...preview,
    across: { ...preview.across, ...models.across },
    levelMixed: models.levelMixed,
  };
}

/**
 * The parts of a whole analysis its preview leaves pending.
 * @param analysis - the whole analysis
 * @returns its regional mixed models, group comparisons and level mixed models
 */
export function regionalModelsOf(analysis: TrialAnalysis): TrialRegionalModels {
  const { mixed, plateauMixed, groups } = analysis.across;
  return { across: { mixed, plateauMixed, groups }, levelMixed: analysis.levelMixed };
}

/**
 * Analyzes a trial: every site fitted with every model, its tests and bootstrap draws, the
 * quality checks, and the across-site tests and regional rate.
 * @param table - the plot table (canonical kg/ha)
 * @param settings - complete analysis settings (analysisSettings fills the defaults)
 * @param onSite - called after each site is fitted and after it is resampled, with (done, total,
 *   stage), for progress on long runs
 * @returns the TrialAnalysis every view prices and reads
 * @throws {StatsInputError} "bad-argument" for a price that is not positive
 * @example
 * const analysis = analyzeTrial(table, analysisSettings({ prices }));
 * priceTrial(analysis, prices, {}).sites[0].optimum?.rateKgHa // e.g. 168
 */
export function analyzeTrial(
  table: PlotTable,
  settings: AnalysisSettings,
  onSite?: (done: number, total: number, stage: 'fitted' | 'resampled') => void,
): TrialAnalysis {
  const steps = analyzeTrialSteps(table, settings);
  for (;;) {
    const step = steps.next();
    if (step.done) return step.value;
    const s = step.value;
    if (s.kind === 'site') onSite?.(s.done, s.total, 'fitted');
    else if (s.kind === 'resampling') onSite?.(s.done, s.total, 'resampled');
  }
}

/**
 * Draws many sites' bootstrap jobs somewhere else (the command line's worker threads).
 * @param jobs - one per site, in the table's site order; null where a site has no draws
 * @param onDrawn - called with how many sites are drawn, as they finish
 * @returns the draws, one per job in the same order (null for a null job)
 */
export type DrawSites = (
  jobs: readonly (SiteDrawJob | null)[],
  onDrawn: (done: number) => void,
) => Promise<SiteResamples>;

/**
 * analyzeTrial with the sites' bootstrap drawn by `drawSites`: the same steps and the same
 * result, since each site's draws are seeded by its index (siteDrawJob).
 * @param table - the plot table (canonical kg/ha)
 * @param settings - complete analysis settings (analysisSettings fills the defaults)
 * @param drawSites - draws the jobs, e.g. on a pool of threads
 * @param onSite - as analyzeTrial's
 * @returns the TrialAnalysis
 * @throws as analyzeTrial, and whatever drawSites rejects with
 * @example
 * const analysis = await analyzeTrialDrawnBy(table, settings, drawOnThreads(2));
 */
export async function analyzeTrialDrawnBy(
  table: PlotTable,
  settings: AnalysisSettings,
  drawSites: DrawSites,
  onSite?: (done: number, total: number, stage: 'fitted' | 'resampled') => void,
): Promise<TrialAnalysis> {
  const steps = analyzeTrialSteps(table, settings);
  let given: SiteResamples | undefined;
  for (;;) {
    const step = steps.next(given);
    given = undefined;
    if (step.done) return step.value;
    const s = step.value;
    if (s.kind === 'site') onSite?.(s.done, s.total, 'fitted');
    else if (s.kind === 'draws-wanted') {
      const total = s.jobs.length;
      given = await drawSites(s.jobs, (done) => onSite?.(done, total, 'resampled'));
    }
  }
}
