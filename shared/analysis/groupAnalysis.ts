/**
 * The analysis per group of sites (previous crop, soil, year: one column of Plot.groups): the
 * regional rate, response share and shared-response tests within each value, and whether the
 * groups differ (linear-model tests with site levels, pooled-versus-group plateau fits). A site
 * with no single value in the column is listed with the reason.
 */
import type { SiteAnalysis } from './analyzeSite';
import type { SiteLeftOut } from './commonResponseTests';
import { groupResponseTest, type GroupResponseTest } from './groupResponseTest';
import { modelLabelInText } from '../models/curves';
import type { AcrossSiteSettings } from './planAcrossSites';
import { PLATEAU_MODELS, plateauFitters, type PlateauModel } from './plateauModels';
import { pooledCurveTest, type CurvePart, type PooledCurveTest } from './pooledCurveTest';
import { regionalAnalysis, type RegionalAnalysis } from './regionalAnalysis';
import { responseShare, type ResponseShare } from './responseShare';
import { sharedResponse, type SharedResponseTests } from './sharedResponse';
import type { SitePlots } from './sitePlots';

export interface GroupValueAnalysis {
  value: string;
  sites: string[];
  regional: RegionalAnalysis;
  response: ResponseShare;
  sharedResponse: SharedResponseTests;
}

export interface GroupAnalysis {
  key: string;
  values: GroupValueAnalysis[];
  /** Sites with no single value in this column, with the reason. */
  sitesWithoutValue: SiteLeftOut[];
  /** Do the groups differ? Linear-model tests with site levels, and pooled-vs-group plateau fits. */
  differ: {
    linear: GroupResponseTest;
    quadratic: GroupResponseTest;
    plateau: Record<PlateauModel, PooledCurveTest>;
  };
}

/**
 * The analysis of one group column.
 * @param key - the column (a Plot.groups key, or "year")
 * @param plots - the sites' plots (kg/ha), with any site's problem carried in
 * @param analyses - each site's analysis by name
 * @param o - the analysis settings
 * @param whole - the analysis of all sites, reused for a value every site shares; or null
 * @returns the analysis per value, the sites without a value and the tests of difference
 * @example
 * groupAnalysis('previous crop', plots, analyses, o, null).differ.linear.sentence
 */
export function groupAnalysis(
  key: string,
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  o: AcrossSiteSettings,
  whole: Pick<GroupValueAnalysis, 'regional' | 'response' | 'sharedResponse'> | null,
): GroupAnalysis {
  const sitesWithoutValue: SiteLeftOut[] = [];
  const byValue = new Map<string, SitePlots[]>();
  for (const p of plots) {
    const v = p.groups[key];
    if (v === undefined || v === null) {
      sitesWithoutValue.push({
        site: p.site,
        reason:
          key in p.groups ? `its plots carry different values of ${key}` : `no value of ${key}`,
      });
      continue;
    }
    const list = byValue.get(v);
    if (list) list.push(p);
    else byValue.set(v, [p]);
  }
  const values: GroupValueAnalysis[] = [...byValue.entries()].map(([value, members]) => {
    // A value that every site shares (one year, one soil) is the whole analysis again: reuse it.
    // Only its three parts are taken: a caller may pass a whole AcrossSiteAnalysis, whose own
    // `sites` (the site analyses) must not replace the names here.
    if (members.length === plots.length && whole) {
      const { regional, response, sharedResponse } = whole;
      return { value, sites: members.map((m) => m.site), regional, response, sharedResponse };
    }
    const sub = members.map((m) => analyses.get(m.site) as SiteAnalysis);
    return {
      value,
      sites: members.map((m) => m.site),
      regional: regionalAnalysis(sub, o),
      response: responseShare(sub),
      sharedResponse: sharedResponse(members, analyses, o),
    };
  });
  const grouped = [...byValue.values()].flat();
  const groupOf = new Map(grouped.map((p) => [p.site, p.groups[key] as string]));
  const usable = grouped.filter((p) => !analyses.get(p.site)?.problem);
  const plateau = {} as Record<PlateauModel, PooledCurveTest>;
  // Each group's pooled plots, the same arrays for every model (the fitters share their preparation).
  const parts: CurvePart[] = [...byValue.entries()].map(([value, members]) => {
    const ok = members.filter((m) => !analyses.get(m.site)?.problem);
    return {
      label: value,
      rateKgHa: Float64Array.from(ok.flatMap((m) => Array.from(m.rateKgHa))),
      yieldKgHa: Float64Array.from(ok.flatMap((m) => Array.from(m.yieldKgHa))),
    };
  });
  const fitters = plateauFitters();
  for (const model of PLATEAU_MODELS) {
    const label = modelLabelInText(model);
    plateau[model] = pooledCurveTest(
      usable.length > 0 ? parts : [],
      fitters[model],
      {
        comparison: `One ${label} per value of ${key} against one ${label} for all, on pooled plots`,
        significant: `the groups of ${key} respond differently`,
        notSignificant: `the groups of ${key} do not differ detectably`,
      },
      o.alpha,
    );
  }
  return {
    key,
    values,
    sitesWithoutValue,
    differ: {
      linear: groupResponseTest(grouped, groupOf, 'linear', key, o.alpha),
      quadratic: groupResponseTest(grouped, groupOf, 'quadratic', key, o.alpha),
      plateau,
    },
  };
}
