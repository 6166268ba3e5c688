/**
 * Do the sites share one response? The linear models by F tests on the sites' plots
 * (testCommonResponse), the plateau models by one curve per site against one curve for the
 * pooled plots (pooledCurveTest). A site that could not be fitted is listed as left out of
 * every plateau test with its reason.
 */
import type { SiteAnalysis } from './analyzeSite';
import { testCommonResponse, type CommonResponseTests } from './commonResponseTests';
import { modelLabelInText } from '../models/curves';
import type { AcrossSiteSettings } from './planAcrossSites';
import {
  curveFitOutcome,
  PLATEAU_MODELS,
  plateauFitters,
  type PlateauModel,
} from './plateauModels';
import { pooledCurveTest, type CurvePart, type PooledCurveTest } from './pooledCurveTest';
import type { SitePlots } from './sitePlots';

/** The tests of whether sites (or groups) share one response. */
export interface SharedResponseTests {
  linear: CommonResponseTests;
  proportional: CommonResponseTests;
  quadratic: CommonResponseTests;
  plateau: Record<PlateauModel, PooledCurveTest>;
}

/** Each site's plots as one part of a pooled test, with the site's own fit when it can stand in. */
function plateauParts(
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  model: PlateauModel,
): CurvePart[] {
  return plots.map((p) => {
    const a = analyses.get(p.site);
    // Reuse the site's own fit when it was made without block terms (the pooled fit has none).
    const fit = a?.fits && a.blocks === 'none' ? a.fits.fits[model] : undefined;
    return {
      label: p.site,
      rateKgHa: p.rateKgHa,
      yieldKgHa: p.yieldKgHa,
      known: fit ? curveFitOutcome(fit) : undefined,
    };
  });
}

/**
 * The tests of whether a set of sites shares one response.
 * @param plots - the sites' plots (kg/ha); a site with a problem is left out with its reason
 * @param analyses - each site's analysis by name, for its problem and its own unblocked fits
 * @param o - the analysis settings (alpha, level terms)
 * @returns the linear, proportional and quadratic F tests and the pooled plateau tests
 * @example
 * sharedResponse(plan.plots, analyses, plan.options).plateau.linearPlateau.sentence
 */
export function sharedResponse(
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  o: AcrossSiteSettings,
): SharedResponseTests {
  const usable = plots.filter((p) => !analyses.get(p.site)?.problem);
  const plateau = {} as Record<PlateauModel, PooledCurveTest>;
  const fitters = plateauFitters();
  for (const model of PLATEAU_MODELS) {
    const label = modelLabelInText(model);
    plateau[model] = pooledCurveTest(
      plateauParts(usable, analyses, model),
      fitters[model],
      {
        comparison: `One ${label} per site against one ${label} fitted to the pooled plots`,
        significant: 'the sites do not share one curve',
        notSignificant: 'one common curve describes the sites as well',
      },
      o.alpha,
    );
    for (const p of plots) {
      const problem = analyses.get(p.site)?.problem;
      if (problem) plateau[model].partsLeftOut.push({ site: p.site, reason: problem });
    }
  }
  return {
    linear: testCommonResponse(plots, 'linear', { levels: o.levels, alpha: o.alpha }),
    proportional: testCommonResponse(plots, 'proportional', { levels: o.levels, alpha: o.alpha }),
    quadratic: testCommonResponse(plots, 'quadratic', { levels: o.levels, alpha: o.alpha }),
    plateau,
  };
}
