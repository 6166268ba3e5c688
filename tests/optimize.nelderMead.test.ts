// nelderMead on standard test functions with known minima: Rosenbrock's valley
// (H. H. Rosenbrock, The Computer Journal 3 (1960) 175–184; minimum 0 at (1, 1)) and
// Powell's singular function (M. J. D. Powell, The Computer Journal 5 (1962) 147–151;
// minimum 0 at the origin, with a singular Hessian there, like a variance at its boundary).
import { describe, expect, it } from 'vitest';
import { nelderMead } from '../shared/optimize/nelderMead';
import { StatsInputError } from '../shared/stats/errors';

describe('nelderMead', () => {
  it('finds the minimum of Rosenbrock’s valley from its classic start (−1.2, 1)', () => {
    const r = nelderMead(([x, y]) => 100 * (y - x * x) ** 2 + (1 - x) ** 2, [-1.2, 1], {
      functionTolerance: 1e-14,
      pointTolerance: 1e-10,
    });
    expect(r.converged).toBe(true);
    expect(r.x[0]).toBeCloseTo(1, 5);
    expect(r.x[1]).toBeCloseTo(1, 5);
    expect(r.fx).toBeLessThan(1e-10);
  });

  it('reaches Powell’s singular minimum in four variables', () => {
    const f = ([a, b, c, d]: number[]) =>
      (a + 10 * b) ** 2 + 5 * (c - d) ** 2 + (b - 2 * c) ** 4 + 10 * (a - d) ** 4;
    const r = nelderMead(f, [3, -1, 0, 1], { functionTolerance: 1e-16, pointTolerance: 1e-8 });
    expect(r.fx).toBeLessThan(1e-8);
    r.x.forEach((v) => expect(Math.abs(v)).toBeLessThan(0.02));
  });

  it('stops at the evaluation limit and says so', () => {
    const r = nelderMead(([x, y]) => 100 * (y - x * x) ** 2 + (1 - x) ** 2, [-1.2, 1], {
      maxEvaluations: 30,
    });
    expect(r.converged).toBe(false);
    expect(r.evaluations).toBeLessThanOrEqual(33);
  });

  it('refuses an empty or non-finite start, naming it', () => {
    expect(() => nelderMead(() => 0, [])).toThrow(StatsInputError);
    expect(() => nelderMead(() => 0, [NaN])).toThrow(
      'start: needs at least one finite coordinate.',
    );
  });
});
