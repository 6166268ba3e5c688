/**
 * The level test for the plateau models: one plateau curve for every level against one per level,
 * the zero-rate check shared, as levelResponseTest does for the quadratic and the straight line.
 * With a shared check the curves are written from the check's yield a (a block offset or one
 * intercept), so a check plot adds the same terms to every level:
 *
 *   linear-plateau:     y = a + b_k·min(x, x0_k)
 *   quadratic-plateau:  y = a + c_k·(min(x − x0_k, 0)² − x0_k²),  c_k < 0
 *
 * (the quadratic-plateau P + c·min(x − x0, 0)² with P = a − c·x0², its value at 0 being a). Each
 * is linear in a and b_k (or c_k) once the joins x0_k are fixed, so the joins are profiled
 * (variable projection, as the site fits do; DESIGN "Curve models"): the common curve's one join
 * by Brent's method (minimizeBrent) on every interval between distinct fertilized rates, the
 * per-level joins by cyclic coordinate descent, each step the same one-dimensional global search
 * for one level's join with the others held, until a sweep lowers the SSE by less than 1e−13 of
 * it. A join in the first interval (0, lowest rate] fits as well as at the lowest rate (a step),
 * so the search runs from the lowest fertilized rate to the highest.
 *
 * The F test is the extra-sum-of-squares test of nested nonlinear models (Bates & Watts,
 * Nonlinear Regression Analysis and Its Applications, 1988, §3.5; R's anova() of two nls fits),
 * exact only asymptotically; each join counts as a parameter, so 2·(L − 1) numerator df. Weighted
 * as the quadratic's test is (levelResponseTest's header), with w = 1/ŷ² from the same model's
 * unweighted common curve.
 *
 * Edge cases: a level with fewer than 3 fertilized rates (a join needs rates on both sides and a
 * response), a common curve with a fitted yield at or below 0, a quadratic-plateau with no
 * maximum (c ≥ 0 at every join), or a rank-deficient design: no test, with the reason.
 */
import { minimizeBrent } from '../optimize/minimizeBrent';
import { applyQTranspose, qrDecompose, solveUpperTriangular } from '../stats/qr';

/** The plateau models the level tests cover. */
export type LevelPlateauModel = 'linearPlateau' | 'quadraticPlateau';

/** The two profiled fits of one plateau level test (weighted SSE, unitless with w = 1/ŷ²). */
export interface LevelPlateauFits {
  common: { sse: number; df: number; joinKgHa: number };
  perLevel: { sse: number; df: number; joinsKgHa: number[] };
  /** Coordinate-descent sweeps the per-level fit took. */
  sweeps: number;
}

/** The join's column on one plot at join x0 (0 on a check plot for both models). */
function joinColumn(model: LevelPlateauModel, x: number, x0: number): number {
  if (model === 'linearPlateau') return Math.min(x, x0);
  const m = Math.min(x - x0, 0);
  return m * m - x0 * x0;
}

/** SSE and coefficients of y on the columns (no pivoting: a rank below p gives null). */
function leastSquares(
  columns: readonly Float64Array[],
  y: Float64Array,
): { sse: number; coef: Float64Array } | null {
  const n = y.length;
  const p = columns.length;
  if (n <= p) return null;
  const a = new Float64Array(n * p);
  columns.forEach((c, j) => a.set(c, j * n));
  const qr = qrDecompose(a, n, p);
  if (qr.rank < p) return null;
  const qy = Float64Array.from(y);
  applyQTranspose(qr, qy);
  let sse = 0;
  for (let i = p; i < n; i++) sse += qy[i] * qy[i];
  return { sse, coef: solveUpperTriangular(qr, qy.subarray(0, p)) };
}

/**
 * The common and per-level plateau fits of one site's plots, with the shared check.
 * @param model - linear-plateau or quadratic-plateau
 * @param x - rate per plot, kg/ha (checks at 0)
 * @param y - yield per plot, kg/ha
 * @param level - per plot its level index, −1 for a shared check
 * @param levelCount - number of levels
 * @param base - the block indicator columns (or one column of ones)
 * @returns both weighted fits, or the reason there is no test
 * @example
 * levelPlateauFits('linearPlateau', x, y, level, 2, base) // { common: { sse, df, joinKgHa }, … }
 */
export function levelPlateauFits(
  model: LevelPlateauModel,
  x: Float64Array,
  y: Float64Array,
  level: Int32Array,
  levelCount: number,
  base: readonly Float64Array[],
): LevelPlateauFits | { reason: string } {
  const n = y.length;
  const ratesOf = (k: number | null) =>
    [...new Set(Array.from(x).filter((v, i) => v > 0 && (k === null || level[i] === k)))].sort(
      (a, b) => a - b,
    );
  const levelRates = Array.from({ length: levelCount }, (_, k) => ratesOf(k));
  if (levelRates.some((r) => r.length < 3)) {
    return { reason: 'a level has fewer than 3 fertilized rates, too few for a plateau' };
  }
  let scale = new Float64Array(n).fill(1);
  /** Level k's join column at x0 (k null: every plot, the common curve), rows scaled. */
  const zColumn = (k: number | null, x0: number) =>
    Float64Array.from(x, (v, i) =>
      k === null || level[i] === k ? joinColumn(model, v, x0) * scale[i] : 0,
    );
  const fillZColumn = (into: Float64Array, k: number | null, x0: number): void => {
    for (let i = 0; i < n; i++)
      into[i] = k === null || level[i] === k ? joinColumn(model, x[i], x0) * scale[i] : 0;
  };
  const scaledBase = () => base.map((c) => Float64Array.from(c, (v, i) => v * scale[i]));
  const ys = () => Float64Array.from(y, (v, i) => v * scale[i]);
  /** Full fit at these joins: SSE, or Infinity where a quadratic-plateau's c is not negative. */
  const fullSse = (joins: readonly number[]): number => {
    const cols = scaledBase();
    if (joins.length === 1) cols.push(zColumn(null, joins[0]));
    else joins.forEach((j, k) => cols.push(zColumn(k, j)));
    const fit = leastSquares(cols, ys());
    if (!fit) return Infinity;
    if (model === 'quadraticPlateau') {
      for (let j = base.length; j < cols.length; j++) if (!(fit.coef[j] < 0)) return Infinity;
    }
    return fit.sse;
  };
  /**
   * The global minimum over one join in [lowest, highest] of `rates`, every other column held:
   * those are projected out once (their QR), so each SSE is y's residual less its part along the
   * join column's residual, ‖r_y‖² − (r_z·r_y)²/‖r_z‖² (Frisch–Waugh–Lovell), O(n·p) per join.
   */
  const searchJoin = (k: number | null, held: readonly Float64Array[], rates: number[]) => {
    const p = held.length;
    const a = new Float64Array(n * p);
    held.forEach((c, j) => a.set(c, j * n));
    const qr = qrDecompose(a, n, p);
    if (qr.rank < p) return { x: rates[0], fx: Infinity };
    const ry = ys();
    applyQTranspose(qr, ry);
    let yy = 0;
    for (let i = p; i < n; i++) yy += ry[i] * ry[i];
    const rz = new Float64Array(n);
    const at = (x0: number) => {
      fillZColumn(rz, k, x0);
      applyQTranspose(qr, rz);
      let zz = 0;
      let zy = 0;
      for (let i = p; i < n; i++) {
        zz += rz[i] * rz[i];
        zy += rz[i] * ry[i];
      }
      if (!(zz > 1e-14 * yy)) return Infinity;
      // The join column's coefficient is zy/zz: a quadratic-plateau needs it negative.
      if (model === 'quadraticPlateau' && !(zy < 0)) return Infinity;
      return yy - (zy * zy) / zz;
    };
    let best = { x: rates[0], fx: at(rates[0]) };
    for (let i = 0; i + 1 < rates.length; i++) {
      const r = minimizeBrent(at, rates[i], rates[i + 1], { relativeTolerance: 1e-10 });
      if (r.fx < best.fx) best = { x: r.x, fx: r.fx };
    }
    return best;
  };
  const allRates = ratesOf(null);
  const unweighted = searchJoin(null, scaledBase(), allRates);
  const colsU = [...base, Float64Array.from(x, (v) => joinColumn(model, v, unweighted.x))];
  const fitU = Number.isFinite(unweighted.fx) ? leastSquares(colsU, y) : null;
  if (!fitU) return { reason: `the common ${modelWords(model)} could not be fitted` };
  // Fitted yields of the unweighted common curve give the weights 1/ŷ² (rows scaled by 1/ŷ).
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let v = 0;
    colsU.forEach((c, j) => (v += c[i] * fitU.coef[j]));
    fitted[i] = v;
  }
  if (!fitted.every((v) => v > 0))
    return { reason: 'the common curve has a fitted yield at or below 0' };
  scale = Float64Array.from(fitted, (v) => 1 / v);
  const common = searchJoin(null, scaledBase(), allRates);
  if (!Number.isFinite(common.fx))
    return { reason: `the common ${modelWords(model)} could not be fitted` };
  // Start each level at the common join (within its own rates).
  const joins = levelRates.map((r) => Math.min(Math.max(common.x, r[0]), r[r.length - 1]));
  let current = fullSse(joins);
  let sweeps = 0;
  for (; sweeps < 100; sweeps++) {
    const before = current;
    for (let k = 0; k < levelCount; k++) {
      const held = [...scaledBase()];
      joins.forEach((j, m) => {
        if (m !== k) held.push(zColumn(m, j));
      });
      const best = searchJoin(k, held, levelRates[k]);
      if (!(best.fx < current)) continue;
      const trial = [...joins];
      trial[k] = best.x;
      // Accept only a point where every level's curve is still of its kind (c < 0).
      const sse = fullSse(trial);
      if (sse < current) {
        joins[k] = best.x;
        current = sse;
      }
    }
    if (!(before - current > 1e-13 * current)) break;
  }
  if (!Number.isFinite(current))
    return { reason: `the ${modelWords(model)} per level could not be fitted` };
  const p = base.length;
  return {
    common: { sse: common.fx, df: n - (p + 2), joinKgHa: common.x },
    perLevel: { sse: current, df: n - (p + 2 * levelCount), joinsKgHa: joins },
    sweeps: sweeps + 1,
  };
}

function modelWords(model: LevelPlateauModel): string {
  return model === 'linearPlateau' ? 'linear-plateau' : 'quadratic-plateau';
}
