/**
 * Lack-of-fit F-test with pure error from replicated x values (Draper & Smith,
 * Applied Regression Analysis, 3rd ed., §2.1). With m distinct x values, the
 * pure-error sum of squares is SSPE = Σ over groups Σ (y − ȳ_group)² on n − m
 * df; the model's residual SSE splits into SSPE and SSLOF = SSE − SSPE on m − p
 * df, and F = (SSLOF/(m − p)) / (SSPE/(n − m)). It works for any model whose
 * fitted values depend on x alone (straight line, quadratic, plateau curves),
 * so the caller passes only its SSE and parameter count.
 *
 * "Not available" is a typed result, not an error, because it is a property of
 * the trial layout the screen should explain:
 * - no x value is replicated (no pure error);
 * - the model has as many parameters as there are distinct x values (no lack-of-fit df);
 * - every replicate agrees exactly (pure error is zero, F would be infinite).
 */
import { assertFinite, assertSameLength, StatsInputError } from './errors';
import { fisherFUpperP } from './distributions';
import { sampleMean } from './variance';

export interface LackOfFitInput {
  /** The regressor of every observation, e.g. rate in kg N/ha; equal values form replicate groups. */
  x: ArrayLike<number>;
  /** The response, same length, e.g. yield in kg/ha. */
  y: ArrayLike<number>;
  /** The fitted model's residual sum of squares, in the square of y's unit. */
  sse: number;
  /** Number of parameters the model estimated (2 for the straight line). */
  parameters: number;
}

export interface LackOfFitAvailable {
  available: true;
  /** Number of distinct x values (replicate groups). */
  distinctX: number;
  ssPureError: number;
  dfPureError: number;
  msPureError: number;
  ssLackOfFit: number;
  dfLackOfFit: number;
  msLackOfFit: number;
  F: number;
  /** Upper-tail p-value of F on (dfLackOfFit, dfPureError). */
  p: number;
}

export interface LackOfFitUnavailable {
  available: false;
  reason: 'no-replicates' | 'no-lack-of-fit-df' | 'zero-pure-error';
  /** One sentence for the screen. */
  message: string;
  distinctX: number;
  dfPureError: number;
  dfLackOfFit: number;
}

export type LackOfFitResult = LackOfFitAvailable | LackOfFitUnavailable;

/**
 * Lack-of-fit F-test of a fitted model against pure error.
 * @param input - x, y, the model's SSE and parameter count
 * @returns the F-test, or a typed "not available" result with the reason
 * @throws {StatsInputError} "length-mismatch"; "non-finite"; "bad-argument" when parameters is not a
 *   positive whole number, sse is negative, or sse is below the pure error (so the model was not a
 *   function of x alone)
 * @example
 * lackOfFitTest({ x: [0, 0, 50, 50, 100, 100], y: [1, 1.2, 2, 2.2, 2.5, 2.7], sse: 0.27, parameters: 2 }).available // true
 */
export function lackOfFitTest(input: LackOfFitInput): LackOfFitResult {
  const { x, y, sse, parameters } = input;
  assertSameLength(x, y, ['lackOfFitTest: x', 'y']);
  assertFinite(x, 'lackOfFitTest: x');
  assertFinite(y, 'lackOfFitTest: y');
  if (!(Number.isInteger(parameters) && parameters >= 1)) {
    throw new StatsInputError(
      'bad-argument',
      `lackOfFitTest: parameters is ${String(parameters)}; it must be a whole number of at least 1.`,
    );
  }
  if (!(Number.isFinite(sse) && sse >= 0)) {
    throw new StatsInputError(
      'bad-argument',
      `lackOfFitTest: sse is ${String(sse)}; a residual sum of squares is a finite number ≥ 0.`,
    );
  }
  const groups = new Map<number, number[]>();
  for (let i = 0; i < x.length; i++) {
    // +0 folds −0 into 0 so they form one group.
    const key = x[i] + 0;
    const g = groups.get(key);
    if (g) g.push(y[i]);
    else groups.set(key, [y[i]]);
  }
  const n = x.length;
  const distinctX = groups.size;
  const dfPureError = n - distinctX;
  const dfLackOfFit = distinctX - parameters;
  const unavailable = (reason: LackOfFitUnavailable['reason'], message: string) =>
    ({ available: false, reason, message, distinctX, dfPureError, dfLackOfFit }) as const;
  if (dfPureError === 0) {
    return unavailable(
      'no-replicates',
      `No x value is repeated (${n} points, ${distinctX} distinct x), so there is no pure error to test lack of fit against.`,
    );
  }
  if (dfLackOfFit <= 0) {
    return unavailable(
      'no-lack-of-fit-df',
      `The model has ${parameters} parameters for ${distinctX} distinct x values, so it passes through every group mean and lack of fit cannot be tested.`,
    );
  }
  let ssPureError = 0;
  for (const g of groups.values()) {
    if (g.length < 2) continue;
    const m = sampleMean(g);
    for (const v of g) ssPureError += (v - m) ** 2;
  }
  // Rounding may leave SSE a few ulps under SSPE for a model that fits the group
  // means closely; a real shortfall means the model used more than x.
  const slack = 1e-9 * Math.max(ssPureError, sse);
  if (sse < ssPureError - slack) {
    throw new StatsInputError(
      'bad-argument',
      `lackOfFitTest: sse (${sse}) is smaller than the pure-error sum of squares (${ssPureError}); the model's fitted values must depend on x alone (no block or other terms).`,
    );
  }
  if (ssPureError === 0) {
    return unavailable(
      'zero-pure-error',
      'Every replicate group has identical y values, so pure error is zero and the F ratio is undefined.',
    );
  }
  const ssLackOfFit = Math.max(sse - ssPureError, 0);
  const msPureError = ssPureError / dfPureError;
  const msLackOfFit = ssLackOfFit / dfLackOfFit;
  const F = msLackOfFit / msPureError;
  return {
    available: true,
    distinctX,
    ssPureError,
    dfPureError,
    msPureError,
    ssLackOfFit,
    dfLackOfFit,
    msLackOfFit,
    F,
    p: fisherFUpperP(F, dfLackOfFit, dfPureError),
  };
}
