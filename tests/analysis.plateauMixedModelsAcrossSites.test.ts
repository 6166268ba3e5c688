// The analysis' plateau mixed models: fitted to the site-years the quadratic's mixed model reads
// (mixedModelSites), and not fitted at all above PLATEAU_MIXED_MAX_SITE_YEARS, saying why
// (a test of "no fit ran": the entries carry a reason, not a model, and no time is asserted).
// The fits themselves are checked against R's nlme in
// tests/analysis.regionalPlateauMixedModel.reference.test.ts.
import { describe, expect, it } from 'vitest';
import type { SiteAnalysis } from '../shared/analysis/analyzeSite';
import {
  PLATEAU_MIXED_MAX_SITE_YEARS,
  plateauMixedModelsAcrossSites,
} from '../shared/analysis/plateauMixedModelsAcrossSites';
import { fitRegionalPlateauMixedModel } from '../shared/analysis/regionalPlateauMixedModel';
import type { SitePlots } from '../shared/analysis/sitePlots';
import { simulatedRegion } from '../shared/demo/simulatedRegion';

/** The simulated region as planned plots and (the parts read here of) site analyses. */
function planned(siteYears: number): { plots: SitePlots[]; sites: SiteAnalysis[] } {
  const region = simulatedRegion(siteYears, 7);
  const plots = region.map(
    (s) =>
      ({
        site: s.site,
        rateKgHa: Float64Array.from(s.rateKgHa),
        yieldKgHa: Float64Array.from(s.yieldKgHa),
        block: s.block,
      }) as unknown as SitePlots,
  );
  const sites = region.map((s) => ({ site: s.site, blocks: 'fixed' }) as unknown as SiteAnalysis);
  return { plots, sites };
}

describe('plateauMixedModelsAcrossSites', () => {
  it('fits both plateau forms to the site-years with their block offsets, as the fitter does', () => {
    const { plots, sites } = planned(8);
    const [qp, lp] = plateauMixedModelsAcrossSites(plots, sites);
    expect(qp.model).toBe('quadraticPlateau');
    expect(lp.model).toBe('linearPlateau');
    const direct = fitRegionalPlateauMixedModel(simulatedRegion(8, 7), 'quadraticPlateau');
    if (qp.model === null || direct.model === null) throw new Error('no fit');
    expect(qp.blockOffsets).toBe(true);
    expect(qp.fixed).toEqual(direct.fixed);
  });

  it(`fits no plateau form above ${PLATEAU_MIXED_MAX_SITE_YEARS} site-years, and says why`, () => {
    const { plots, sites } = planned(PLATEAU_MIXED_MAX_SITE_YEARS + 1);
    const out = plateauMixedModelsAcrossSites(plots, sites);
    expect(out.map((m) => m.model)).toEqual([null, null]);
    for (const m of out) {
      if (m.model !== null) throw new Error('fitted');
      expect(m.reason).toContain(`${PLATEAU_MIXED_MAX_SITE_YEARS + 1} site-years`);
    }
  });
});
