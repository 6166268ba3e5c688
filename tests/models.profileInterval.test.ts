// The profile interval's search (shared/models/solve/profileInterval) on profiles whose
// interval is known in closed form, and joinProfileInterval's edge cases. The F quantiles
// come from shared/stats (checked against the NIST/SEMATECH F table and R in
// tests/stats.distributions.test.ts); R's brute-force intervals on real fits are in
// tests/models.profileInterval.reference.test.ts.
import { describe, expect, it } from 'vitest';
import { fitAllModelsPrepared } from '../shared/models/fitAllModels';
import { joinProfileInterval } from '../shared/models/joinProfile';
import { prepareSite } from '../shared/models/prepareSite';
import { profileInterval } from '../shared/models/solve/profileInterval';
import { fisherFQuantile } from '../shared/stats/distributions';

describe('profileInterval', () => {
  // S(θ) = S0 + k(θ − 5)²: the criterion k(θ − 5)²/(S0/df) ≤ F gives 5 ± √(F·S0/(df·k)).
  const s0 = 40;
  const df = 12;
  const k = 3;
  const half = (level: number) => Math.sqrt((fisherFQuantile(level, 1, df) * s0) / (df * k));

  it('gives the closed-form ends of a parabolic profile', () => {
    const r = profileInterval({
      sse: (t) => s0 + k * (t - 5) ** 2,
      estimate: 5,
      sseMin: s0,
      df,
      level: 0.9,
      points: [0, 2, 4, 6, 8, 10],
    });
    expect(r.low).toBeCloseTo(5 - half(0.9), 10);
    expect(r.high).toBeCloseTo(5 + half(0.9), 10);
    expect([r.lowOpen, r.highOpen]).toEqual([false, false]);
  });

  it('is open at an end the profile never crosses within the range', () => {
    const r = profileInterval({
      sse: (t) => s0 + k * (t - 5) ** 2,
      estimate: 5,
      sseMin: s0,
      df,
      level: 0.9,
      points: [4, 5.5, 20],
    });
    expect(r).toMatchObject({ low: 4, lowOpen: true, highOpen: false });
  });

  it('keeps the piece around the estimate when the profile dips again further out', () => {
    // A second minimum at 9 as low as the first: the set has two pieces; only the first is kept.
    const sse = (t: number) => s0 + k * Math.min((t - 5) ** 2, (t - 9) ** 2);
    const r = profileInterval({
      sse,
      estimate: 5,
      sseMin: s0,
      df,
      level: 0.9,
      points: [0, 7, 9, 12],
    });
    expect(r.high).toBeCloseTo(5 + half(0.9), 10);
  });
});

describe('joinProfileInterval', () => {
  const rateKgHa = [0, 40, 80, 120, 160, 200, 0, 40, 80, 120, 160, 200];

  it('has no interval when the fit reports no join (no plateau within the rates)', () => {
    const site = prepareSite(
      { rateKgHa, yieldKgHa: rateKgHa.map((x, i) => 6000 + 20 * x + (i % 2 ? 90 : -90)) },
      'none',
    );
    const fit = fitAllModelsPrepared(site, { models: ['linearPlateau'] }).fits.linearPlateau;
    expect(fit.status).toBe('no-plateau');
    expect(joinProfileInterval(site, fit, 0.9)).toBeNull();
  });

  it('widens with the level and holds the estimate', () => {
    const yieldKgHa = rateKgHa.map((x, i) => 6000 + 25 * Math.min(x, 110) + (i % 3 ? 150 : -300));
    const site = prepareSite({ rateKgHa, yieldKgHa }, 'none');
    const fit = fitAllModelsPrepared(site, { models: ['linearPlateau'] }).fits.linearPlateau;
    const narrow = joinProfileInterval(site, fit, 0.8)!;
    const wide = joinProfileInterval(site, fit, 0.95)!;
    expect(narrow.lowKgHa).toBeLessThan(fit.params.x0);
    expect(narrow.highKgHa).toBeGreaterThan(fit.params.x0);
    expect(wide.lowKgHa).toBeLessThan(narrow.lowKgHa);
    expect(wide.highKgHa).toBeGreaterThan(narrow.highKgHa);
  });

  it('refuses a level outside (0, 1), naming it', () => {
    const site = prepareSite({ rateKgHa, yieldKgHa: rateKgHa.map((x) => 6000 + x) }, 'none');
    const fit = fitAllModelsPrepared(site, { models: ['linearPlateau'] }).fits.linearPlateau;
    expect(() => joinProfileInterval(site, fit, 90)).toThrow(
      'level must lie strictly between 0 and 1; got 90.',
    );
  });
});
