/**
 * Which curve parameters a profiled model (linear-plateau, quadratic-plateau, exponential
 * rise) no longer estimates once its status says the fit reached an edge of its parameter
 * space. The fit is then its limiting model, and counts that model's parameters (finishFit's
 * `fixed`, and so `estimatedParameterCount` and the residual df):
 * - "no-plateau": the profiled parameter sits at its limit (the join at the highest rate; the
 *   rate constant at 0, a straight line): the rise and the intercept are estimated;
 * - "full-response-at-lowest-rate": the join at the second-lowest rate, or the rate constant
 *   at infinity: check against the rest, a step, whose two levels are estimated;
 * - "no-response": the rise is held at 0 as well, by its sign constraint: only the mean;
 * - "ok" (and the statuses of other models): nothing is fixed.
 */
import type { FitStatus } from './modelTypes';

/**
 * The parameters a status fixes.
 * @param status - the fit's status
 * @param rise - the parameter whose sign makes the curve rise (b of the linear-plateau and the
 *   exponential, c of the quadratic-plateau)
 * @param profiled - the profiled nonlinear parameter (x0, k)
 * @returns the names to fix, none for "ok"
 * @example
 * fixedByStatus('no-response', 'b', 'x0') // ['b', 'x0']
 */
export function fixedByStatus(status: FitStatus, rise: string, profiled: string): string[] {
  switch (status) {
    case 'no-response':
      return [rise, profiled];
    case 'no-plateau':
    case 'full-response-at-lowest-rate':
      return [profiled];
    default:
      return [];
  }
}
