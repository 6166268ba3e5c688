/**
 * Per-site checks from the treatment × block model: the trial CV % (warned
 * above a threshold) and plots whose externally studentized residual exceeds
 * a bound (Belsley, Kuh & Welsch, Regression Diagnostics, 1980, §2.1). Flagged
 * plots are not excluded: the user decides.
 */
import { originalRef } from '../table/originalCell';
import type { RateBlockModel, RateBlockProblem } from '../stats/rateBlockModel';
import { analyzablePlots, type Plot, type PlotTable } from '../table/plotTable';
import { describeRef, type QualityFinding } from '../table/qualityFinding';
import { siteYearsOf } from '../table/siteYear';
import { fitTreatmentBlock } from './treatmentBlockModel';

/**
 * Fits each site and reports CV % and outliers.
 * @param table - the plot table
 * @param cvWarnPct - CV above which a site is warned, % (15 is common practice for yield trials)
 * @param outlierAbsResidual - |studentized residual| above which a plot is flagged (3)
 * @param fitted - site-year name → its rate + block model already fitted on its analyzable
 *   plots in table order (the analysis' one fit per site); sites absent are fitted here
 * @returns one "trial-cv" or "high-cv" finding per site, and "outlier" findings
 * @example
 * checkResiduals(table, 15, 3).filter((f) => f.code === 'outlier')
 */
export function checkResiduals(
  table: PlotTable,
  cvWarnPct: number,
  outlierAbsResidual: number,
  fitted?: ReadonlyMap<string, RateBlockModel | RateBlockProblem>,
): QualityFinding[] {
  const out: QualityFinding[] = [];
  const bySite = new Map<string, Plot[]>();
  const { nameOf } = siteYearsOf(table);
  for (const p of analyzablePlots(table)) {
    const site = nameOf(p);
    if (!bySite.has(site)) bySite.set(site, []);
    bySite.get(site)!.push(p);
  }
  for (const [site, plots] of bySite) {
    const m = fitTreatmentBlock(plots, fitted?.get(site));
    if ('reason' in m) {
      out.push({
        code: 'model-not-fitted',
        severity: 'info',
        message: `${site}: the trial CV and outliers cannot be computed (${m.reason}).`,
        refs: [],
        site,
      });
      continue;
    }
    const cv = Math.round(m.cvPct * 10) / 10;
    out.push(
      m.cvPct > cvWarnPct
        ? {
            code: 'high-cv',
            severity: 'warning',
            message: `${site}: the trial CV is ${cv} %, above ${cvWarnPct} %; plot-to-plot noise is large, so rate effects will be uncertain. Check for damaged plots or a yield-unit mix-up.`,
            refs: [],
            site,
            value: m.cvPct,
          }
        : {
            code: 'trial-cv',
            severity: 'info',
            message: `${site}: the trial CV is ${cv} % (${m.rates} rates × ${m.blocks} block${m.blocks > 1 ? 's' : ''}, ${plots.length} plots).`,
            refs: [],
            site,
            value: m.cvPct,
          },
    );
    m.fit.studentizedResiduals.forEach((r, i) => {
      if (!(Math.abs(r) > outlierAbsResidual)) return;
      const p = m.plots[i];
      const o = p.original.yield ?? p.original.plotWeight;
      const ref = o ? originalRef(o) : null;
      out.push({
        code: 'outlier',
        severity: 'warning',
        message: `${ref ? describeRef(ref) : site}: plot ${p.plotLabel ?? p.id} of ${site} is ${r > 0 ? 'far above' : 'far below'} what its rate and block predict (studentized residual ${r.toFixed(1)}, beyond ±${outlierAbsResidual}). Check the plot's notes; exclude it only with a reason.`,
        refs: ref ? [ref] : [],
        site,
        plotIds: [p.id],
        value: r,
      });
    });
  }
  return out;
}
