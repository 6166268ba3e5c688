/**
 * The report summary (TrialReport) every writer reads, assembled from one
 * analysis (analyzeTrial) at one set of prices and picks (priceTrial). It fits
 * nothing and resamples nothing: the fits, tests, ANOVA, draws and the across-site
 * results come from the analysis, the optima, intervals and regional rate from the
 * priced view. It adds the notes in words without numbers, so that each writer can
 * show the rates in its own display units. Pure: no I/O, the caller passes the tool
 * version, the time and the mapping it used.
 */
import { namesListed } from './namesListed';
import type { TrialAnalysis } from '../analysis/analyzeTrial';
import type { AcrossSiteAnalysis, FitData, SiteAnalysis } from '../analysis/analyzeAcrossSites';
import type { PricedSite, PricedTrial } from '../analysis/priceTrial';
import type { RegionalAnalysis } from '../analysis/regionalAnalysis';
import { recommendedRateKgHa } from '../economics/economicOptimum';
import { sameRate, type ShortfallRisk } from '../economics/shortfallRule';
import type { SiteModelRow } from '../analysis/siteModelRows';
import type { SitePlots } from '../analysis/sitePlots';
import type { MappingEntry } from '../import/mappingEntries';
import type { OptimumProfileInterval } from '../economics/optimumProfile';
import type { MixedModelOptimum } from '../economics/mixedModelOptimum';
import { mixedModelFormsSentence } from '../economics/mixedModelFormsSentence';
import type { RateProfileInterval } from '../models/joinProfile';
import type { ModelName } from '../models/modelTypes';
import { describeRef, type QualityFinding } from '../table/qualityFinding';
import type { OriginalCell, Plot, PlotTable } from '../table/plotTable';
import { siteYearsOf } from '../table/siteYear';
import { yearsComparedReport } from './yearsComparedReport';
import { intervalSharesWarning } from './intervalShares';
import { fitMessage, optimumNote } from './modelNotes';
import { priceTerms } from '../economics/priceQuote';
import type { DisplaySettings } from './reportSettings';
import { regionalChartData } from './regionalReturnChart';
import { isBlockLabel } from '../stats/hasBlocks';
import { toNumberArray } from '../stats/toNumberArray';
import { atHighestTestedRate } from './highestTestedRate';
import type {
  AcrossSitesReport,
  GroupReport,
  LevelReport,
  MixedModelFormReport,
  MixedModelReport,
  InterceptSummary,
  LackOfFitSummary,
  ModelRow,
  SensitivitySummaryRow,
  ShortfallSummary,
  SiteLevelsReport,
  LevelMixedReport,
  SiteReport,
  TrialReport,
} from './trialReport';

export interface ReportMeta {
  tool: { name: string; version: string };
  /** ISO 8601 time stamp to print. */
  createdAt: string;
  mapping: MappingEntry[];
  /** Run-level findings from import (e.g. defaulted prices) to carry into the report. */
  warnings?: string[];
  /** Findings of the import (the analysis adds its quality checks); warnings and errors are shown by their site. */
  findings?: readonly QualityFinding[];
}

/** The intercept test as the report shows it; null with too few plots or rates to test. */
function interceptSummary(
  s: SiteAnalysis,
  plots: SitePlots,
  distinctRates: number,
  warnings: string[],
): InterceptSummary | null {
  if (plots.rateKgHa.length < 3 || distinctRates < 2) return null;
  const t = s.intercept;
  if ('problem' in t) {
    warnings.push(`Intercept test not possible: ${t.problem}`);
    return null;
  }
  return {
    t: t.t,
    F: t.F,
    df1: t.df1,
    df2: t.df2,
    p: t.p,
    interceptKgHa: t.interceptKgHa,
    interceptSeKgHa: t.interceptSeKgHa,
    interceptNeeded: t.needed,
    verdict: t.verdict,
  };
}

function lackOfFitOf(fit: FitData | null): LackOfFitSummary {
  if (!fit) return { available: false, model: null, message: 'No chosen model.' };
  const l = fit.lackOfFit;
  if (!l) {
    return {
      available: false,
      model: fit.model,
      message:
        'not available: no rate is replicated, or the model has as many parameters as there are rates.',
    };
  }
  return {
    available: true,
    model: fit.model,
    F: l.f,
    df1: l.dfLackOfFit,
    df2: l.dfPureError,
    p: l.p,
  };
}

/** Quality findings of warning or error severity as lines, by site and for the whole run. */
function findingLines(findings: readonly QualityFinding[]): {
  bySite: Map<string, string[]>;
  run: string[];
} {
  const bySite = new Map<string, string[]>();
  const run: string[] = [];
  for (const f of findings) {
    if (f.severity === 'info') continue;
    const ref = f.refs.length ? describeRef(f.refs[0]) : '';
    const text = ref && !f.message.includes(f.refs[0].cell) ? `${f.message} (${ref})` : f.message;
    if (f.site === undefined) run.push(text);
    else {
      const list = bySite.get(f.site);
      if (list) list.push(text);
      else bySite.set(f.site, [text]);
    }
  }
  return { bySite, run };
}

/**
 * One model's row of the report, from the analysis' fit, its priced row, its join's profile
 * interval and, for the chosen model, the optimum's two intervals.
 */
function modelRow(
  f: FitData,
  row: SiteModelRow,
  joinProfile: RateProfileInterval | null,
  chosen: { ciKgHa: [number, number] | null; profile: OptimumProfileInterval | null } | null,
): ModelRow {
  return {
    model: f.model,
    label: f.label,
    status: f.status,
    message: fitMessage(f),
    params: { ...f.params },
    stdErrors: { ...f.stdErrors },
    sse: f.sse,
    dfResidual: f.dfResidual,
    aicc: f.aicc,
    r2: f.r2,
    optimumRateKgHa: row.optimumRateKgHa,
    optimumCiKgHa: chosen?.ciKgHa ?? null,
    joinProfile,
    optimumProfile: chosen?.profile ?? null,
    yieldAtOptimumKgHa: row.yieldAtOptimumKgHa,
    optimumNote:
      row.optimumStatus === 'not-fitted' ? '' : optimumNote({ status: row.optimumStatus }),
    curve: {
      rateKgHa: toNumberArray(f.curve.rateKgHa),
      yieldKgHa: toNumberArray(f.curve.yieldKgHa),
    },
  };
}

/**
 * Assembles the report summary from an analysis and its priced view.
 * @param analysis - from analyzeTrial
 * @param priced - from priceTrial (the prices and picks the report speaks of)
 * @param display - display units and the prices as the user quoted them
 * @param meta - tool name/version, time stamp, mapping, import findings and run notes
 * @returns the TrialReport every writer reads
 * @throws {RangeError} for quoted prices that are missing or not positive
 * @example
 * const report = assembleReport(analysis, priceTrial(analysis, prices, {}), display, meta);
 * report.sites[0].bestModel // 'quadraticPlateau'
 */
export function assembleReport(
  analysis: TrialAnalysis,
  priced: PricedTrial,
  display: DisplaySettings,
  meta: ReportMeta,
): TrialReport {
  const { table, settings: a } = analysis;
  const terms = priceTerms({ ...display, crop: table.crop });
  const tablePlots = new Map<string, Plot[]>(analysis.plots.map((p) => [p.site, []]));
  const { nameOf } = siteYearsOf(table);
  for (const p of table.plots) tablePlots.get(nameOf(p))?.push(p);
  const rowsOf = new Map<string, Map<ModelName, SiteModelRow>>();
  for (const r of priced.across.rows) {
    const m = rowsOf.get(r.site) ?? new Map<ModelName, SiteModelRow>();
    m.set(r.model, r);
    rowsOf.set(r.site, m);
  }
  const found = findingLines([...(meta.findings ?? []), ...analysis.findings]);
  const sites: SiteReport[] = priced.across.sites.map((s, index) =>
    siteReport(s, analysis.plots[index], tablePlots.get(s.site) ?? [], {
      rows: rowsOf.get(s.site)!,
      findings: found.bySite.get(s.site) ?? [],
      priced: priced.sites[index],
      blocksAsked: a.blocks,
      intervalLevel: a.intervalLevel,
    }),
  );
  const runWarnings = [...(meta.warnings ?? []), ...found.run.slice(0, 10)];
  if (display.prices.defaulted)
    runWarnings.push(
      'No prices were given: illustrative prices were used. Give your own grain and nitrogen prices before acting on any rate.',
    );
  const used = filesWithPlots(table);
  return {
    tool: meta.tool,
    createdAt: meta.createdAt,
    crop: table.crop,
    settings: {
      ...display,
      crop: table.crop,
      boot: a.resamples,
      seed: a.seed,
      blocks: a.blocks === 'auto' ? 'fixed' : 'none',
      intervalLevel: a.intervalLevel,
      siteModels: { ...priced.choices },
      shortfallTolerance: { ...priced.shortfallTolerance },
    },
    prices: terms,
    // Provenance names what the analysis read: files that gave plots, and their mapping only
    // (a file opened and closed again, or one with no plot rows, is not behind any number here).
    sources: table.sources.filter((s) => used.has(s.name)),
    mapping: meta.mapping.filter((m) => used.has(m.file)),
    sites,
    acrossSites: acrossSitesOf(priced.across, priced.mixedOptimum, priced.plateauMixedOptima),
    yearsCompared: yearsComparedReport(priced.across),
    warnings: runWarnings,
    levels: levelsOf(analysis, priced, a.blocks, a.intervalLevel),
    levelMixed: (analysis.levelMixed ?? []).map((m): LevelMixedReport => {
      const at = (priced.levelMixed ?? []).find((p) => p.factor === m.factor);
      return {
        factor: m.factor,
        fit: m.model === null ? null : m,
        reason: m.model === null ? m.reason : null,
        levels: at?.levels ?? [],
        alpha: analysis.across.options.alpha,
      };
    }),
  };
}

/**
 * Each rate × factor site's levels as the report shows them: every level through siteReport,
 * with its own model rows and priced view (PricedTrial.levels), so a level reads as a site does.
 */
function levelsOf(
  analysis: TrialAnalysis,
  priced: PricedTrial,
  blocksAsked: 'auto' | 'none',
  intervalLevel: number,
): SiteLevelsReport[] {
  const byId = new Map(analysis.table.plots.map((p) => [p.id, p]));
  return (priced.levels ?? []).map((pl, i) => {
    const s = analysis.levels[i];
    return {
      site: pl.site,
      factor: pl.factor,
      test: pl.test,
      comparison: pl.comparison,
      levels: pl.levels.map((l, k): LevelReport => {
        const la = s.levels[k];
        return {
          level: l.level,
          checkPlots: la.checkPlots,
          nutrientPricePerKg: l.prices.nutrientPricePerKg,
          ownNutrientPrice: l.ownNutrientPrice,
          returnAtOptimumPerHa: l.returnAtOptimumPerHa,
          report: siteReport(
            la.analysis,
            la.plots,
            la.plots.plotIds.flatMap((id) => byId.get(id) ?? []),
            {
              rows: new Map(l.rows.map((r) => [r.model, r])),
              findings: [],
              priced: l.priced,
              blocksAsked,
              intervalLevel,
            },
          ),
        };
      }),
    };
  });
}

/** A shortfall risk as the report keeps it, with the recommended rate marked. */
function shortfallSummary(
  risk: ShortfallRisk | null,
  of: ShortfallSummary['of'],
  recommendedKgHa: number | null,
): ShortfallSummary | null {
  if (!risk) return null;
  return {
    tolerancePerHa: risk.tolerancePerHa,
    of,
    count: risk.count,
    rows: risk.rows.map((r) => ({
      rateKgHa: r.rateKgHa,
      share: r.share,
      recommended: sameRate(r.rateKgHa, recommendedKgHa),
    })),
  };
}

/** One site's part of the report, from its analysis and its priced view. */
function siteReport(
  s: SiteAnalysis,
  used: SitePlots,
  plots: Plot[],
  c: {
    rows: ReadonlyMap<ModelName, SiteModelRow>;
    findings: string[];
    priced: PricedSite;
    blocksAsked: 'auto' | 'none';
    intervalLevel: number;
  },
): SiteReport {
  const rates = toNumberArray(used.rateKgHa);
  const blocks = used.block;
  // A long list hides the important lines; the rest are in the quality report on screen.
  const warnings: string[] =
    c.findings.length > 6
      ? [
          ...c.findings.slice(0, 5),
          `… and ${c.findings.length - 5} more findings about this site's data.`,
        ]
      : [...c.findings];
  const distinct = [...new Set(rates)].sort((a, b) => a - b);
  const blockCount = new Set(blocks.filter((b) => b !== null)).size;
  const designText = `${blockCount > 0 ? `${blockCount} block${blockCount === 1 ? '' : 's'} × ` : ''}${distinct.length} rate${distinct.length === 1 ? '' : 's'}`;
  if (c.blocksAsked === 'auto' && !blocks.every(isBlockLabel))
    warnings.push('Some plots have no block label, so the curves were fitted without block terms.');
  const interceptTest = interceptSummary(s, used, distinct.length, warnings);
  // A site with fewer than two rates has no curve to show, whatever the models returned.
  const all = distinct.length >= 2 ? s.fits : null;
  if (distinct.length < 2)
    warnings.push(
      `Only ${distinct.length} distinct rate${distinct.length === 1 ? '' : 's'} with usable plots: no response curve can be fitted.`,
    );
  else if (!all) warnings.push(`The curves could not be fitted: ${s.problem ?? 'not fitted'}`);
  // Curves fitted but none leads (no replication, no usable optimum): the reason is the site's
  // word on why it has no rate.
  else if (!c.priced.lead.model) warnings.push(`No rate is recommended: ${c.priced.lead.reason}.`);
  const choice = all
    ? c.priced.lead
    : { model: null, reason: 'no model could be fitted', picked: false };
  const bestFit = all && choice.model ? all.fits[choice.model] : null;
  const interval = bestFit ? c.priced.interval : null;
  const bootstrap: SiteReport['bootstrap'] = interval
    ? {
        count: interval.count,
        seed: interval.seed,
        level: interval.level,
        ciKgHa: interval.ciKgHa,
        basis: interval.basis,
        shares: { ...interval.shares },
        modelShares: { ...interval.modelShares },
      }
    : null;
  const opt = bestFit ? c.priced.optimum : null;
  const basis = bestFit ? (c.priced.lead.basis ?? null) : null;
  const fullRange = opt?.status === 'join-in-first-interval' ? opt.rangeKgHa : null;
  const recommendation: SiteReport['recommendation'] = {
    rateKgHa: recommendedRateKgHa(opt),
    rangeKgHa: fullRange ? [fullRange[0], fullRange[1]] : null,
    ciKgHa: interval?.ciKgHa ?? null,
    level: interval?.level ?? c.intervalLevel,
    model: bestFit ? choice.model : null,
    basis,
    sentence: basis === 'no-response' && opt ? opt.explanation : '',
  };
  const sharesWarning = bootstrap ? intervalSharesWarning(bootstrap) : null;
  if (sharesWarning) warnings.push(sharesWarning);
  const models: ModelRow[] = all
    ? all.ranking.map(({ model }) =>
        modelRow(
          all.fits[model],
          c.rows.get(model)!,
          s.joinProfiles[model] ?? null,
          model === choice.model
            ? { ciKgHa: bootstrap?.ciKgHa ?? null, profile: c.priced.optimumProfile }
            : null,
        ),
      )
    : [];
  const spread = all ? c.priced.acrossModels : null;
  const optimumSpreadKgHa: [number, number] | null =
    spread && spread.candidates.length > 1 ? [spread.lowestRateKgHa, spread.highestRateKgHa] : null;
  if (spread?.warning)
    warnings.push(
      'The curves that fit this site put the optimum far apart (see the optimum of each model): the choice of model matters here, so weigh the interval and the other curves before acting on one rate.',
    );
  const bestRow = bestFit ? c.rows.get(bestFit.model)! : null;
  // A rate at the highest tested one says only that the trial stopped too low: a capped
  // optimum, or a straight line or unlevelled curve whose rise still pays there.
  const atHighest =
    basis === 'no-plateau' && atHighestTestedRate(recommendation.rateKgHa, distinct.at(-1));
  if ((bestRow?.optimumStatus === 'capped-at-highest' && basis !== 'no-response') || atHighest)
    warnings.push(
      'The optimum lies at or beyond the highest tested rate; the trial did not test high enough to find it.',
    );
  return {
    site: s.site,
    year: s.year,
    n: used.rateKgHa.length,
    plots,
    interceptTest,
    responseOverCheck:
      'problem' in s.responseOverCheck
        ? { available: false, message: s.responseOverCheck.problem || 'not fitted.' }
        : { available: true, ...s.responseOverCheck },
    lackOfFit: lackOfFitOf(bestFit),
    anova: s.anova,
    treatmentMeans: s.treatmentMeans,
    models,
    bestModel: choice.model,
    bestModelReason: choice.reason,
    bestModelPicked: choice.picked,
    bootstrap,
    recommendation,
    profitableRangeKgHa: bestFit ? c.priced.profitableRangeKgHa : null,
    optimumSpreadKgHa,
    returnAtOptimumPerHa: basis === 'no-response' ? 0 : (bestRow?.gainOverCheckPerHa ?? null),
    priceRatioSensitivity: bestFit
      ? (c.priced.priceRatioSensitivity ?? []).map((r) => ({
          ratioMultiplier: r.ratioMultiplier,
          priceRatioKgPerKg: r.priceRatio,
          rateKgHa: r.rateKgHa,
          ciKgHa: r.intervalKgHa,
          profitableRangeKgHa: null,
        }))
      : [],
    shortfallRisk: bestFit
      ? shortfallSummary(c.priced.shortfallRisk, 'resamples', recommendation.rateKgHa)
      : null,
    designText,
    residuals: bestFit
      ? rates.map((rateKgHa, i) => ({
          rateKgHa,
          residualKgHa: bestFit.residuals[i],
          block: blocks[i],
        }))
      : [],
    ratesKgHa: distinct,
    warnings,
  };
}

/**
 * The across-site part of the report from the analysis' regional return (each
 * site's recommendation model) and its quadratic pooling tests, with notes in
 * words only (the analysis' grid note speaks kg/ha).
 */
function acrossSitesOf(
  analysis: AcrossSiteAnalysis,
  mixedOptimum: MixedModelOptimum | null,
  plateauOptima: readonly (MixedModelOptimum | null)[],
): AcrossSitesReport | null {
  const { regional, sitesUsed, sitesLeftOut } = analysis.regional;
  if (sitesUsed.length < 2) return null;
  const bySite = new Map(analysis.sites.map((s) => [s.site, s]));
  const highest = sitesUsed.map(
    (u) => bySite.get(u.site)!.fits!.fits[u.model].testedRates.highestKgHa,
  );
  const notes: string[] = [];
  if (new Set(highest).size > 1) {
    notes.push(
      'Sites tested different highest rates; the regional curve stops at the lowest of them.',
    );
  }
  if (!regional.profitableRange.contiguous)
    notes.push('The profitable range has gaps: the mean return curve is not single-peaked.');
  if (sitesLeftOut.length > 0)
    notes.push(
      `Not in the regional mean (no rate recommended there; see each site's notes): ${namesListed(sitesLeftOut.map((s) => s.site))}.`,
    );
  const tests: AcrossSitesReport['tests'] = [];
  for (const x of analysis.sharedResponse.quadratic.tests) {
    if (x.result.kind !== 'f-test') continue;
    tests.push({
      question: x.question,
      F: x.result.f,
      df1: x.result.df1,
      df2: x.result.df2,
      p: x.result.p,
      verdict: x.sentence,
    });
  }
  return {
    sites: sitesUsed.map((u) => u.site),
    bestRateKgHa: regional.bestRateKgHa,
    profitableRangeKgHa: [regional.profitableRange.lowKgHa, regional.profitableRange.highKgHa],
    bandPerHa: regional.profitableRange.bandPerHa,
    bestMeanReturnPerHa: regional.bestMeanReturnPerHa,
    meanYieldGainAtBestKgHa: regional.meanYieldGainAtBestKgHa,
    chart: regionalChartData(regional, analysis.regional.rateInterval),
    siteOptima: regional.siteOptima.map((o) => ({
      site: o.site,
      rateKgHa: o.rateKgHa,
      returnPerHa: o.returnPerHa,
    })),
    priceRatioSensitivity: regionalSensitivity(analysis.regional),
    shortfallRisk: shortfallSummary(
      analysis.regional.shortfallRisk,
      'sites',
      regional.bestRateKgHa,
    ),
    bestRateInterval: analysis.regional.rateInterval
      ? {
          lowKgHa: analysis.regional.rateInterval.lowKgHa,
          highKgHa: analysis.regional.rateInterval.highKgHa,
          level: analysis.regional.rateInterval.level,
          resamples: analysis.regional.rateInterval.resamples,
        }
      : null,
    tests,
    notes,
    mixed: mixedModelReport(analysis.mixed, mixedOptimum),
    ...mixedModelsReport(analysis, mixedOptimum, plateauOptima),
    groups: groupsReport(analysis),
  };
}

/** The regional rate at each multiple of the price ratio, as the report keeps it. */
function regionalSensitivity(r: RegionalAnalysis): SensitivitySummaryRow[] {
  return r.priceRatioSensitivity.map((row) => ({
    ratioMultiplier: row.ratioMultiplier,
    priceRatioKgPerKg: row.priceRatio,
    rateKgHa: row.rateKgHa,
    ciKgHa: null,
    profitableRangeKgHa: row.profitableRangeKgHa,
  }));
}

/** The mixed model's part: the fit without its site curves, the curves, the priced optimum. */
function mixedModelReport(
  mixed: AcrossSiteAnalysis['mixed'],
  optimum: MixedModelOptimum | null,
): MixedModelReport | null {
  if (mixed.model === null || optimum === null) return null;
  const { siteCurves, ...fit } = mixed;
  return { fit, siteCurves, optimum };
}

/** Every fitted regional mixed model form with its priced optimum, and which the AIC favours. */
function mixedModelsReport(
  analysis: AcrossSiteAnalysis,
  mixedOptimum: MixedModelOptimum | null,
  plateauOptima: readonly (MixedModelOptimum | null)[],
): Pick<AcrossSitesReport, 'mixedModels' | 'mixedModelsSentence'> {
  const forms: MixedModelFormReport[] = [];
  const q = analysis.mixed;
  if (q.model !== null && mixedOptimum !== null) {
    forms.push({
      model: 'quadratic',
      structure: q.structure,
      fixed: { ...q.fixed },
      stdErrors: { ...q.stdErrors },
      randomParameters: ['a', 'b', 'c'],
      siteCovariance: q.siteCovariance,
      residualVariance: q.residualVariance,
      logLikelihoodMl: q.logLikelihoodMl,
      aic: q.aic,
      observations: q.observations,
      converged: q.converged,
      settled: q.converged,
      note: q.converged ? '' : 'The likelihood search stopped at its evaluation limit.',
      optimum: mixedOptimum,
      siteCurves: [],
    });
  }
  analysis.plateauMixed.forEach((m, i) => {
    const optimum = plateauOptima[i];
    if (m.model === null || !optimum) return;
    // Named as the site fits name them: curvature c, slope b (regionalPlateauMixedModel).
    const shape = m.model === 'quadraticPlateau' ? 'c' : 'b';
    forms.push({
      model: m.model,
      structure: m.structure,
      fixed: { P: m.fixed.P, [shape]: m.fixed.shape, x0: m.fixed.x0 },
      stdErrors: { P: m.stdErrors.P, [shape]: m.stdErrors.shape, x0: m.stdErrors.x0 },
      randomParameters: ['P', 'x0'],
      siteCovariance: m.siteCovariance,
      residualVariance: m.residualVariance,
      logLikelihoodMl: m.logLikelihoodMl,
      aic: m.aic,
      observations: m.observations,
      converged: m.converged,
      settled: m.settled,
      note: m.note,
      optimum,
      siteCurves: m.siteCurves,
    });
  });
  return { mixedModels: forms, mixedModelsSentence: mixedModelFormsSentence(forms) };
}

/** Names of the files at least one plot of the table was read from. */
function filesWithPlots(table: PlotTable): Set<string> {
  const files = new Set<string>();
  for (const plot of table.plots)
    for (const cell of Object.values(plot.original) as (OriginalCell | undefined)[])
      if (cell) files.add(cell.file);
  return files;
}

/** Each grouping column with two or more values, as the report keeps it (kg/ha). */
function groupsReport(analysis: AcrossSiteAnalysis): GroupReport[] {
  return analysis.groups
    .filter((g) => g.values.length > 1)
    .map((g) => {
      const t = g.differ.quadratic;
      return {
        key: g.key,
        values: g.values.map((v) => {
          const r = v.regional.regional;
          const has = Number.isFinite(r.bestRateKgHa);
          const ci = v.regional.rateInterval;
          return {
            value: v.value,
            sites: [...v.sites],
            bestRateKgHa: has ? r.bestRateKgHa : null,
            profitableRangeKgHa: has
              ? ([r.profitableRange.lowKgHa, r.profitableRange.highKgHa] as [number, number])
              : null,
            bestRateIntervalKgHa: ci ? ([ci.lowKgHa, ci.highKgHa] as [number, number]) : null,
            chart: has ? regionalChartData(r, ci) : null,
          };
        }),
        differ:
          t.result.kind === 'f-test'
            ? {
                F: t.result.f,
                df1: t.result.df1,
                df2: t.result.df2,
                p: t.result.p,
                sentence: t.sentence,
              }
            : null,
      };
    });
}
