// The level tests for the plateau models (shared/analysis/levelPlateauTest): one linear-plateau or
// quadratic-plateau for every timing against one per timing, the zero-rate check shared, weighted
// by 1/fitted² of the unweighted common curve, checked against R 4.2.2's nls() and anova() on the
// invented plots of tests/fixtures/levels/levels.plots.csv (levelsPlateau.R wrote
// levelsPlateau.anova.csv; R's joins come from a grid search and optim() on the profiled SSE,
// then nls() from there).
//
// Tolerances. Both sides minimise the same SSE over the joins, which has kinks at the rates, so
// each may stop a little above the true minimum; R records nls()'s RSS and its own profiled one.
// The reference is R's lower of the two (its best fit) with every join within the fertilized
// rates (nls() is unconstrained; on Teasel Rise's quadratic-plateau it puts the fall timing's
// join at 200.3 kg/ha, past the highest rate, 200). Where our SSE and R's best agree to
// 1e-9 relative (the fits agree) F, df and p must agree within 1e-7 (relative for F, absolute for
// p); where they do not, ours must be the lower (never a worse fit than R's) and the F within
// 1e-4 relative, the difference printed. Measured: see the assertion messages and DEVELOPERS.md.
import { describe, expect, it } from 'vitest';
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import type { LevelCurveTest } from '../shared/analysis/levelResponseTest';
import { importFiles } from '../shared/import/importFiles';
import { fisherFUpperP } from '../shared/stats/distributions';
import { readRCsv } from './analysis.fixtures';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.26 };

/** An R-written fixture of tests/fixtures/levels/ as header → text rows. */
const rCsv = (file: string) => readRCsv(`../levels/${file}`);

async function analysis() {
  const lines = ['Site,Block,Plot,Timing,N rate (kg N/ha),Yield (kg/ha)'];
  for (const r of rCsv('levels.plots.csv'))
    lines.push([r.site, r.block, r.plot, r.timing, r.rate, r.yield].join(','));
  const { table } = await importFiles(
    [{ name: 'timing trial.csv', bytes: new TextEncoder().encode(lines.join('\n') + '\n') }],
    { crop: 'corn', overrides: [] },
  );
  return analyzeTrial(table, analysisSettings({ prices, resamples: 0 }));
}

const reference = rCsv('levelsPlateau.anova.csv');

describe("the plateau level tests against R's nls() and anova()", async () => {
  const a = await analysis();
  for (const r of reference) {
    it(`${r.site}, ${r.model}: F, df and p as R's`, () => {
      const site = a.levels.find((l) => l.site === r.site)!;
      const t = site.test[r.model as 'linearPlateau' | 'quadraticPlateau'] as LevelCurveTest;
      if (t.result.kind !== 'f-test') throw new Error(t.sentence);
      const df1 = Number(r.df);
      const df2 = Number(r.resDf1);
      expect(t.result.df1).toBe(df1);
      expect(t.result.df2).toBe(df2);
      expect(t.common!.df).toBe(Number(r.resDf0));
      // nls() is unconstrained: a join it moves past the tested rates is another model than the
      // one both sides fit (joins within the fertilized rates), so its RSS is not the reference.
      const rates = rCsv('levels.plots.csv')
        .filter((p) => p.site === r.site && Number(p.rate) > 0)
        .map((p) => Number(p.rate));
      const [lo, hi] = [Math.min(...rates), Math.max(...rates)];
      const inside = (joins: string) =>
        joins.split(';').every((j) => Number(j) >= lo && Number(j) <= hi);
      const best = (nlsRss: string, profileRss: string, joins: string) =>
        inside(joins) ? Math.min(Number(nlsRss), Number(profileRss)) : Number(profileRss);
      const rss0 = best(r.rss0, r.profileRss0, r.join0);
      const rss1 = best(r.rss1, r.profileRss1, r.joins1);
      const rF = (rss0 - rss1) / df1 / (rss1 / df2);
      const rP = fisherFUpperP(rF, df1, df2);
      const rel = (x: number, y: number) => Math.abs(x - y) / Math.abs(y);
      const agree = rel(t.common!.sse, rss0) < 1e-9 && rel(t.perLevel!.sse, rss1) < 1e-9;
      const detail = `SSE ${t.common!.sse} / ${t.perLevel!.sse} vs R ${rss0} / ${rss1}; F ${t.result.f} vs ${rF}`;
      if (agree) {
        expect(rel(t.result.f, rF), detail).toBeLessThan(1e-7);
        expect(Math.abs(t.result.p - rP), detail).toBeLessThan(1e-7);
      } else {
        expect(t.common!.sse, detail).toBeLessThanOrEqual(rss0 * (1 + 1e-9));
        expect(t.perLevel!.sse, detail).toBeLessThanOrEqual(rss1 * (1 + 1e-9));
        expect(rel(t.result.f, rF), detail).toBeLessThan(1e-4);
        console.log(`${r.site} ${r.model}: fits differ: ${detail}`);
      }
    });
  }
});
