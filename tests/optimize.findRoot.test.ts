// findRoot (shared/optimize/findRoot, Brent's "zero") on roots known outside the project:
// Wallis's cubic x³ − 2x − 5 = 0, the classic test of root finders (Forsythe, Malcolm &
// Moler 1977, §7), and cos x = x; the reference digits are R 4.2.2's
// (Re(polyroot(c(-5, -2, 0, 1)))[1] = 2.0945514815423265; uniroot(function(x) cos(x) - x,
// c(0, 1), tol = 1e-15)$root = 0.73908513321516067).
import { describe, expect, it } from 'vitest';
import { findRoot } from '../shared/optimize/findRoot';
import { StatsInputError } from '../shared/stats/errors';

describe('findRoot', () => {
  it("finds the root of Wallis's cubic to the last digits R gives", () => {
    const r = findRoot((x) => x * x * x - 2 * x - 5, 2, 3);
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x - 2.0945514815423265)).toBeLessThan(4e-15 * 2.1);
  });

  it('finds the fixed point of the cosine from either orientation of the bracket', () => {
    for (const [a, b] of [
      [0, 1],
      [1, 0],
    ]) {
      expect(Math.abs(findRoot((x) => Math.cos(x) - x, a, b).x - 0.7390851332151607)).toBeLessThan(
        1e-14,
      );
    }
  });

  it('needs fewer evaluations than bisection on a smooth root', () => {
    // Bisection to 1e-12 of a unit bracket takes 40 halvings.
    expect(findRoot((x) => Math.exp(x) - 2, 0, 1).evaluations).toBeLessThan(15);
  });

  it('returns an end where f is exactly zero', () => {
    expect(findRoot((x) => x - 3, 3, 5)).toMatchObject({ x: 3, fx: 0 });
  });

  it('finds where the sign changes across a jump', () => {
    const r = findRoot((x) => (x < 1.5 ? -1 : 1), 0, 4);
    expect(Math.abs(r.x - 1.5)).toBeLessThan(1e-11);
  });

  it('refuses a bracket without a sign change, saying so', () => {
    let caught: unknown;
    try {
      findRoot((x) => x * x + 1, -1, 1);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(StatsInputError);
    expect((caught as StatsInputError).message).toBe(
      'findRoot: f has the same sign at both ends of [-1, 1] (2, 2); bracket a sign change first.',
    );
  });
});
