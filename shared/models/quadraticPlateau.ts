/**
 * The quadratic-plateau with a smooth join: y = P + c·min(x − x0, 0)², c < 0.
 * It rises as a parabola to its vertex at the join point x0 (kg/ha), where the
 * slope is zero, and stays at the plateau P (kg/ha) beyond. In the usual
 * a + b x + c x² form, b = −2 c x0 and a = P + c x0².
 *
 * Fitted globally by profiling x0 with the inner fit of [1, min(x − x0, 0)²] by
 * least squares, c < 0 enforced, interval by interval (searchJoinPoint). Limits:
 * a join at or past the highest rate is a quadratic (or straight line) that has
 * not levelled off within the tested rates: "no-plateau". A join at or below the
 * second-lowest rate is check against the rest: "full-response-at-lowest-rate".
 *
 * The x0 derivative −2c(x − x0)·[x < x0] is continuous here (it is zero at the
 * join), so the asymptotic errors are better behaved than the linear-plateau's.
 */
import {
  blankParameters,
  finishFit,
  tooFewRatesMessage,
  unfittedFit,
  type CurveSpec,
} from './finishFit';
import { linearCoefficients } from './linearCoefficients';
import type { FitOptions, ModelFit, SiteData } from './modelTypes';
import { prepareSite, type PreparedSite } from './prepareSite';
import { profileSolver } from './profileSolver';
import { searchJoinPoint } from './searchJoinPoint';

/** The quadratic-plateau curve, parameters [P, c, x0]. */
export const quadraticPlateauSpec: CurveSpec = {
  model: 'quadraticPlateau',
  label: 'Quadratic-plateau',
  formula: 'P + c·min(x − x0, 0)²',
  paramNames: ['P', 'c', 'x0'],
  value: (x, p) => {
    const d = x < p[2] ? x - p[2] : 0;
    return p[0] + p[1] * d * d;
  },
  gradient: (x, p, out) => {
    const d = x < p[2] ? x - p[2] : 0;
    out[0] = 1;
    out[1] = d * d;
    out[2] = -2 * p[1] * d;
  },
  r2Kind: 'centered',
};

const TIE = 1e-10;

/**
 * Fits the quadratic-plateau to a prepared site.
 * @param site - from prepareSite
 * @param options - confidence level, curve grid
 * @returns the fit with its status; join and plateau only when "ok"
 * @example
 * // see fitQuadraticPlateau
 */
export function fitQuadraticPlateauPrepared(site: PreparedSite, options: FitOptions): ModelFit {
  const why = tooFewRatesMessage(site, quadraticPlateauSpec, 3);
  if (why) return unfittedFit(site, quadraticPlateauSpec, why);
  const rates = site.rates;
  const m = rates.length;
  const solver = profileSolver(site, { intercept: true, sign: 'negative' });
  const g = new Float64Array(m);
  const sseAt = (x0: number): number => {
    for (let j = 0; j < m; j++) {
      const d = rates[j] < x0 ? rates[j] - x0 : 0;
      g[j] = d * d;
    }
    return solver.sse(g);
  };
  const best = searchJoinPoint(rates, sseAt);
  const rMax = rates[m - 1];

  // The limit x0 ≥ r_max: the quadratic with its vertex past the data, or the
  // rising straight line as x0 → ∞ with c → 0.
  let limitSse = sseAt(rMax);
  const line = linearCoefficients(site, [rates], true);
  if (line.curve[1] > 0) limitSse = Math.min(limitSse, sseOf(site, [1, rates], line));
  const quad = linearCoefficients(site, [rates, rates.map((r) => r * r)], true);
  if (quad.curve[2] < 0 && -quad.curve[1] / (2 * quad.curve[2]) >= rMax) {
    limitSse = Math.min(limitSse, sseOf(site, [1, rates, rates.map((r) => r * r)], quad));
  }

  let x0 = best.x0;
  let status: ModelFit['status'] = 'ok';
  let message: string;
  if (best.sse >= solver.flatSse * (1 - TIE)) {
    status = 'no-response';
    message = 'Yield does not rise with rate: the best quadratic-plateau is flat.';
  } else if (x0 >= rMax * (1 - 1e-9) || best.sse >= limitSse * (1 - TIE)) {
    status = 'no-plateau';
    message = `No plateau within the tested rates: the curve has not levelled off by the highest rate (${rMax} kg/ha).`;
  } else if (x0 <= rates[1] * (1 + 1e-9)) {
    status = 'full-response-at-lowest-rate';
    message = `Full response by the lowest non-zero rate: the join lies between ${rates[0]} and ${rates[1]} kg/ha and these rates cannot place it more precisely.`;
    x0 = rates[1];
  } else {
    message = 'Quadratic-plateau fitted; join point between tested rates.';
  }
  if (status === 'no-response' || status === 'no-plateau') x0 = rMax;
  const gFinal = rates.map((r) => (r < x0 ? (r - x0) ** 2 : 0));
  const coef = linearCoefficients(site, [gFinal], true);
  // A flat best fit has c = 0 exactly (the constrained optimum).
  const c = status === 'no-response' ? 0 : coef.curve[1];
  const P = status === 'no-response' ? flatIntercept(site) : coef.curve[0];
  const params = Float64Array.of(P, c, x0);
  const ok = status === 'ok';
  const fit = finishFit({
    site,
    spec: quadraticPlateauSpec,
    params,
    blockCoefficients:
      status === 'no-response' ? linearCoefficients(site, [], true).blocks : coef.blocks,
    status,
    message,
    options,
    joinPoint: ok ? { value: x0, gradient: [0, 0, 1] } : undefined,
    plateauYield:
      ok || status === 'full-response-at-lowest-rate'
        ? { value: P, gradient: [1, 0, 0] }
        : undefined,
    joinBetweenKgHa: status === 'full-response-at-lowest-rate' ? [rates[0], rates[1]] : null,
  });
  if (status === 'full-response-at-lowest-rate') blankParameters(fit, ['c', 'x0']);
  else if (!ok) blankParameters(fit, ['x0']);
  return fit;
}

function flatIntercept(site: PreparedSite): number {
  return linearCoefficients(site, [], true).curve[0];
}

/** SSE of a linear fit whose regressors are given per distinct rate (1 = a column of ones). */
function sseOf(
  site: PreparedSite,
  columns: (1 | Float64Array)[],
  coef: { curve: Float64Array; blocks: Float64Array },
): number {
  const nb = site.blockLabels.length;
  let s = 0;
  for (let i = 0; i < site.n; i++) {
    const j = site.groupOf[i];
    let f = 0;
    columns.forEach((col, k) => (f += coef.curve[k] * (col === 1 ? 1 : col[j])));
    const b = site.blockOf[i];
    if (coef.blocks.length > 0) {
      if (b < nb - 1) f += coef.blocks[b];
      else for (let k = 0; k < nb - 1; k++) f -= coef.blocks[k];
    }
    s += (site.y[i] - f) ** 2;
  }
  return s;
}

/**
 * Fits the quadratic-plateau y = P + c·min(x − x0, 0)² by a global profiled search.
 * @param data - rates (kg/ha), yields (kg/ha), optional blocks
 * @param options - blocks, confidence level, curve grid
 * @returns params {P (kg/ha), c (kg/ha per (kg/ha)²), x0 (kg/ha)}, joinPoint and plateauYield when "ok"
 * @throws {StatsInputError} for mismatched lengths, non-finite or negative values
 * @example
 * fitQuadraticPlateau({ rateKgHa: [0, 50, 100, 150, 200], yieldKgHa: [6300, 7800, 8700, 9000, 9000] }).joinPoint?.estimate // ≈ 150
 */
export function fitQuadraticPlateau(data: SiteData, options: FitOptions = {}): ModelFit {
  return fitQuadraticPlateauPrepared(prepareSite(data, options.blocks ?? 'none'), options);
}
