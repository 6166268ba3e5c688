/**
 * Do groups of sites (previous crop, soil, year) respond differently? For the
 * straight line and the quadratic, a nested linear comparison on the pooled
 * plots that keeps each site's own level:
 *
 *   reduced: y = level(site) + g(x)            one response to rate for all groups
 *   full:    y = level(site) + g_group(x)      one response per group
 *
 * with g(x) = b·x or b·x + c·x². F uses the full model's residual mean square
 * (Draper & Smith, 3rd ed., §6.1); checked against R's
 * anova(lm(y ~ site + x), lm(y ~ site + group:x)) in tests/sites.commonResponseTests.test.ts.
 * Site levels are absorbed by centring within sites (as in commonResponseTests).
 * Sites with too few rates for the model are left out and listed.
 */
import { modelLabelInText } from '../models/curves';
import { designSse } from './designSse';
import { extraSumOfSquaresTest } from './extraSumOfSquaresTest';
import { describeFTest } from './describeFTest';
import { rateTerms, type PoolingTest, type SiteLeftOut } from './commonResponseTests';
import type { SitePlots } from './sitePlots';

export interface GroupResponseTest extends PoolingTest {
  model: 'linear' | 'quadratic';
  groupKey: string;
  groupsUsed: string[];
  sitesLeftOut: SiteLeftOut[];
}

/**
 * Test of a common response against group-specific responses, sites keeping their levels.
 * @param sites - sites with a value for the group key (kg/ha plots)
 * @param groupOf - each site's group value, by site name
 * @param model - "linear" or "quadratic"
 * @param groupKey - the group column's name, for the sentence
 * @param alpha - significance level, e.g. 0.05
 * @returns the F-test with a sentence
 * @example
 * groupResponseTest(sites, new Map([['North', 'corn'], ['South', 'soybean']]), 'quadratic', 'previous crop', 0.05)
 */
export function groupResponseTest(
  sites: readonly SitePlots[],
  groupOf: ReadonlyMap<string, string>,
  model: 'linear' | 'quadratic',
  groupKey: string,
  alpha: number,
): GroupResponseTest {
  const need = model === 'quadratic' ? 3 : 2;
  const sitesLeftOut: SiteLeftOut[] = [];
  const used: SitePlots[] = [];
  for (const s of sites) {
    const k = new Set(Array.from(s.rateKgHa)).size;
    if (s.problem) sitesLeftOut.push({ site: s.site, reason: s.problem });
    else if (!groupOf.has(s.site))
      sitesLeftOut.push({ site: s.site, reason: `no single value of ${groupKey}` });
    else if (k < need)
      sitesLeftOut.push({
        site: s.site,
        reason: `${k} distinct rates; the ${model} needs ${need}`,
      });
    else used.push(s);
  }
  const groups = [...new Set(used.map((s) => groupOf.get(s.site) as string))];
  const readings = {
    comparison: `Responses to rate by ${groupKey} (${groups.join(', ')}) against one common ${modelLabelInText(model)}, each site keeping its own level`,
    significant: `the groups of ${groupKey} respond differently`,
    notSignificant: `the groups of ${groupKey} do not differ detectably in their response`,
  };
  const base = { question: 'groups' as const, model, groupKey, groupsUsed: groups, sitesLeftOut };
  if (groups.length < 2) {
    const result = {
      kind: 'no-test' as const,
      reason: 'fewer than two groups have sites that can be fitted',
    };
    return { ...base, result, sentence: describeFTest(result, readings, alpha) };
  }
  const n = used.reduce((a, s) => a + s.yieldKgHa.length, 0);
  const y = new Float64Array(n);
  const common = rateTerms(model, new Float64Array(n)).map(() => new Float64Array(n));
  const byGroup = groups.map(() => common.map(() => new Float64Array(n)));
  let offset = 0;
  for (const s of used) {
    const g = groups.indexOf(groupOf.get(s.site) as string);
    const terms = rateTerms(model, s.rateKgHa);
    const m = s.yieldKgHa.length;
    // Center within the site: absorbs the site level (Frisch–Waugh–Lovell).
    const center = (src: ArrayLike<number>, dst: Float64Array) => {
      let mean = 0;
      for (let i = 0; i < m; i++) mean += src[i];
      mean /= m;
      for (let i = 0; i < m; i++) dst[offset + i] = src[i] - mean;
    };
    center(s.yieldKgHa, y);
    terms.forEach((t, j) => {
      center(t, common[j]);
      center(t, byGroup[g][j]);
    });
    offset += m;
  }
  const q = common.length;
  const reduced = designSse(common, y);
  const fullCols = byGroup.flat();
  const full = designSse(fullCols, y);
  const result =
    reduced.rank < q || full.rank < fullCols.length
      ? {
          kind: 'no-test' as const,
          reason: 'the rates do not support the model within every group',
        }
      : extraSumOfSquaresTest(
          { sse: reduced.sse, df: n - used.length - q },
          { sse: full.sse, df: n - used.length - fullCols.length },
        );
  return { ...base, result, sentence: describeFTest(result, readings, alpha) };
}
