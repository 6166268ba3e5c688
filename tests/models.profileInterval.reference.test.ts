// Profile intervals checked against R 4.2.2 by brute force (tests/fixtures/models/
// profileIntervals.R, its output profileIntervals.json recording R's version): S(θ) by lm.fit
// on a 0.01 kg/ha grid with θ held fixed, then uniroot() on the F criterion from the first
// grid crossing outward. The sites are invented (tests/fixtures/models/makeProfileSites.ts:
// the project's seeded generator, one site with a plot dropped, one whose join is exactly a
// tested rate, one whose join is near the second-lowest rate).
// - the join x0 of the linear-plateau and the quadratic-plateau: joinProfileInterval
//   (shared/models/joinProfile);
// - the quadratic's economic optimum at two price ratios: optimumProfileInterval
//   (shared/economics/optimumProfile, Fieller's interval in closed form).
// Ends agree to 1e-6 relative (R's roots are to 1e-12, its grid only brackets them), open
// ends exactly.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { optimumProfileInterval } from '../shared/economics/optimumProfile';
import { fitAllModelsPrepared } from '../shared/models/fitAllModels';
import { joinProfileInterval, type RateProfileInterval } from '../shared/models/joinProfile';
import type { BlockTerms } from '../shared/models/modelTypes';
import { prepareSite } from '../shared/models/prepareSite';

interface REnds {
  low: number;
  high: number;
  lowOpen: boolean;
  highOpen: boolean;
}
type RProfile = { estimate: number; sseMin: number; df: number } & Record<string, REnds>;
interface RSite {
  blocks: BlockTerms;
  rateKgHa: number[];
  yieldKgHa: number[];
  block: string[];
  join: Record<'linearPlateau' | 'quadraticPlateau', RProfile | null>;
  quadraticOptimum: Record<string, RProfile | null>;
}
const reference = JSON.parse(
  readFileSync(new URL('./fixtures/models/profileIntervals.json', import.meta.url), 'utf8'),
) as { rVersion: string; levels: number[]; priceRatios: number[]; sites: Record<string, RSite> };

const TOLERANCE = 1e-6;
function close(actual: number, expected: number): boolean {
  return Math.abs(actual - expected) <= TOLERANCE * Math.max(Math.abs(expected), 1);
}
function expectEnds(ours: RateProfileInterval | null, r: REnds): void {
  expect(ours).not.toBeNull();
  const got = ours!;
  expect({ lowOpen: got.lowOpen, highOpen: got.highOpen }).toEqual({
    lowOpen: r.lowOpen,
    highOpen: r.highOpen,
  });
  expect(close(got.lowKgHa, r.low), `low ${got.lowKgHa} vs R ${r.low}`).toBe(true);
  expect(close(got.highKgHa, r.high), `high ${got.highKgHa} vs R ${r.high}`).toBe(true);
}

describe('profile interval references come from R', () => {
  it('records R 4.2.2', () => expect(reference.rVersion).toMatch(/^R version 4\.2\.2/));

  it('cover a join exactly at a tested rate, open ends both ways and the full block design', () => {
    const sites = Object.values(reference.sites);
    const joins = sites.flatMap((s) => [s.join.linearPlateau, s.join.quadraticPlateau]);
    const ends = joins.flatMap((j) => (j ? reference.levels.map((l) => j[String(l)]) : []));
    expect(reference.sites['join-at-rate'].join.linearPlateau?.estimate).toBe(120);
    expect(ends.some((e) => e.lowOpen)).toBe(true);
    expect(ends.some((e) => e.highOpen)).toBe(true);
    expect(prepareSite(reference.sites['lp-unbalanced'], 'fixed').design).toBe('full');
  });
});

for (const [name, r] of Object.entries(reference.sites)) {
  describe(`profile intervals on ${name} (R 4.2.2 brute force)`, () => {
    const site = prepareSite(r, r.blocks);
    const fits = fitAllModelsPrepared(site, {
      models: ['linearPlateau', 'quadraticPlateau', 'quadratic'],
    }).fits;

    for (const model of ['linearPlateau', 'quadraticPlateau'] as const) {
      const expected = r.join[model];
      it(`joinProfileInterval of the ${model} matches R at levels ${reference.levels.join(', ')}`, () => {
        const fit = fits[model];
        if (expected === null) {
          // R found no join strictly inside the rates: Plotrate reports a status, not a join.
          expect(fit.status).not.toBe('ok');
          expect(joinProfileInterval(site, fit, 0.9)).toBeNull();
          return;
        }
        expect(fit.status).toBe('ok');
        expect(close(fit.params.x0, expected.estimate)).toBe(true);
        expect(close(fit.sse, expected.sseMin)).toBe(true);
        expect(fit.dfResidual).toBe(expected.df);
        for (const level of reference.levels) {
          expectEnds(joinProfileInterval(site, fit, level), expected[String(level)]);
        }
      });
    }

    for (const pr of reference.priceRatios) {
      const expected = r.quadraticOptimum[String(pr)];
      it(`optimumProfileInterval of the quadratic at price ratio ${pr} matches R`, () => {
        const prices = { grainPricePerKg: 0.2, nutrientPricePerKg: 0.2 * pr };
        if (expected === null) {
          expect(optimumProfileInterval(fits.quadratic, null, prices, 0.9)).toBeNull();
          return;
        }
        for (const level of reference.levels) {
          const ours = optimumProfileInterval(fits.quadratic, null, prices, level);
          expect(close(ours!.estimateKgHa, expected.estimate)).toBe(true);
          expectEnds(ours, expected[String(level)]);
        }
      });
    }
  });
}

describe('a linear-plateau join exactly at a tested rate (R 4.2.2 brute force)', () => {
  it('gets a profile interval that is not the symmetric estimate ± t·SE', () => {
    const r = reference.sites['join-at-rate'];
    const site = prepareSite(r, r.blocks);
    const fit = fitAllModelsPrepared(site, { models: ['linearPlateau'], confidence: 0.9 }).fits
      .linearPlateau;
    const profile = joinProfileInterval(site, fit, 0.9)!;
    const expected = r.join.linearPlateau!['0.9'];
    expectEnds(profile, expected);
    // R's interval: 120 − low and high − 120 differ by more than a kg/ha; Wald's are equal.
    expect(Math.abs(120 - expected.low - (expected.high - 120))).toBeGreaterThan(1);
    const wald = fit.joinPoint!;
    expect(wald.estimate - wald.ciLow).toBeCloseTo(wald.ciHigh - wald.estimate, 9);
  });
});
