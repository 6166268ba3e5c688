/**
 * The Nelder–Mead simplex method for an unconstrained minimum of a function of
 * a few variables, without derivatives.
 *
 * Method: J. A. Nelder & R. Mead, "A simplex method for function minimization",
 * The Computer Journal 7 (1965) 308–313, with the reflection, expansion,
 * contraction and shrink steps as stated by Lagarias, Reeds, Wright & Wright,
 * SIAM J. Optim. 9 (1998) 112–147 (coefficients 1, 2, ½, ½). Because the
 * simplex can collapse before it reaches a minimum, the search restarts from
 * the best point with a fresh simplex until a restart no longer improves f by
 * more than the tolerance (the restart check of R. O'Neill, Applied
 * Statistics AS 47, 1971).
 *
 * Edge cases:
 * - NaN from f counts as +Infinity (never chosen).
 * - stops at `maxEvaluations` and says so (`converged: false`) with the best point.
 */
import { StatsInputError } from '../stats/errors';

export interface NelderMeadOptions {
  /** Initial step along each coordinate, default 0.5 (or 10 % of |x| when larger). */
  step?: number;
  /** Stop when the simplex's f values differ by less than this (absolute), default 1e-10. */
  functionTolerance?: number;
  /** …and its vertices by less than this in every coordinate, default 1e-8. */
  pointTolerance?: number;
  /** Largest number of evaluations, default 20,000. */
  maxEvaluations?: number;
}

export interface NelderMeadResult {
  /** The minimizing point. */
  x: number[];
  /** f(x). */
  fx: number;
  evaluations: number;
  /** True when the tolerances were met within the evaluation limit. */
  converged: boolean;
}

/**
 * Minimizes f from a starting point by Nelder–Mead with restarts.
 * @param f - the function to minimize; NaN is treated as +Infinity
 * @param start - the starting point (at least one coordinate, all finite)
 * @param options - step, tolerances and evaluation limit
 * @returns the best point found
 * @throws {StatsInputError} "bad-argument" when start is empty or not finite
 * @example
 * nelderMead(([a, b]) => (a - 1) ** 2 + 10 * (b + 2) ** 2, [0, 0]).x // ≈ [1, -2]
 */
export function nelderMead(
  f: (x: number[]) => number,
  start: readonly number[],
  options: NelderMeadOptions = {},
): NelderMeadResult {
  if (start.length === 0 || !start.every(Number.isFinite)) {
    throw new StatsInputError('bad-argument', 'start: needs at least one finite coordinate.');
  }
  const fTol = options.functionTolerance ?? 1e-10;
  const xTol = options.pointTolerance ?? 1e-8;
  const maxEvaluations = options.maxEvaluations ?? 20000;
  let evaluations = 0;
  const evaluate = (x: number[]): number => {
    evaluations++;
    const v = f(x);
    return Number.isNaN(v) ? Infinity : v;
  };
  let best = { x: [...start], fx: evaluate([...start]) };
  let step = options.step ?? 0.5;
  for (;;) {
    const run = simplexSearch(
      evaluate,
      best.x,
      best.fx,
      step,
      fTol,
      xTol,
      () => evaluations >= maxEvaluations,
    );
    const improved = best.fx - run.fx;
    best = run;
    if (evaluations >= maxEvaluations) return { ...best, evaluations, converged: false };
    if (!(improved > fTol)) return { ...best, evaluations, converged: true };
    step = Math.max(step / 4, 1e-4);
  }
}

function simplexSearch(
  evaluate: (x: number[]) => number,
  start: number[],
  fStart: number,
  step: number,
  fTol: number,
  xTol: number,
  exhausted: () => boolean,
): { x: number[]; fx: number } {
  const d = start.length;
  const points: number[][] = [start];
  const values: number[] = [fStart];
  for (let i = 0; i < d; i++) {
    const p = [...start];
    p[i] += Math.max(step, 0.1 * Math.abs(p[i]));
    points.push(p);
    values.push(evaluate(p));
  }
  const order = Array.from({ length: d + 1 }, (_, i) => i);
  const along = (from: number[], to: number[], t: number): number[] =>
    from.map((v, i) => v + t * (to[i] - v));
  while (!exhausted()) {
    order.sort((a, b) => values[a] - values[b]);
    const lo = order[0];
    const hi = order[d];
    const second = order[d - 1];
    let spread = 0;
    for (const i of order) {
      for (let k = 0; k < d; k++) spread = Math.max(spread, Math.abs(points[i][k] - points[lo][k]));
    }
    if (values[hi] - values[lo] <= fTol && spread <= xTol) break;
    const centroid = new Array<number>(d).fill(0);
    for (const i of order) {
      if (i === hi) continue;
      for (let k = 0; k < d; k++) centroid[k] += points[i][k] / d;
    }
    const reflected = along(centroid, points[hi], -1);
    const fr = evaluate(reflected);
    if (fr < values[lo]) {
      const expanded = along(centroid, points[hi], -2);
      const fe = evaluate(expanded);
      if (fe < fr) [points[hi], values[hi]] = [expanded, fe];
      else [points[hi], values[hi]] = [reflected, fr];
      continue;
    }
    if (fr < values[second]) {
      [points[hi], values[hi]] = [reflected, fr];
      continue;
    }
    const outside = fr < values[hi];
    const contracted = along(centroid, outside ? reflected : points[hi], 0.5);
    const fc = evaluate(contracted);
    if (outside ? fc <= fr : fc < values[hi]) {
      [points[hi], values[hi]] = [contracted, fc];
      continue;
    }
    for (const i of order) {
      if (i === lo) continue;
      points[i] = along(points[lo], points[i], 0.5);
      values[i] = evaluate(points[i]);
    }
  }
  let bestIndex = 0;
  for (let i = 1; i <= d; i++) if (values[i] < values[bestIndex]) bestIndex = i;
  return { x: points[bestIndex], fx: values[bestIndex] };
}
