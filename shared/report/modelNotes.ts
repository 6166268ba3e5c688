/**
 * The report's notes on a fit and on its optimum, in words without numbers, so
 * that every writer can show them beside rates in its own display units (the
 * models and economics stages write their messages in kg/ha).
 */
import type { EconomicOptimum } from '../economics/economicOptimum';
import type { RateProfileInterval } from '../models/joinProfile';
import type { ModelFit } from '../models/modelTypes';

/** What ≤ and ≥ mean at the ends of a profile interval, for a table's legend. */
export const PROFILE_OPEN_ENDS_LEGEND =
  'Profile interval: the rates whose best fit is within the F criterion of the best (Bates & Watts 1988, §6.1); ≤ or ≥ at an end: the data do not close it there, and it runs to the lowest or highest tested rate.';

/**
 * A profile interval as text, its open ends marked ≤ (open below) and ≥ (open above).
 * @param p - the interval, kg/ha
 * @param rate - writes a rate given in kg/ha, in the writer's units
 * @returns e.g. "101 to 185", "≤ 0 to 86", "127 to ≥ 200"
 * @example
 * profileIntervalText({ lowKgHa: 127, highKgHa: 200, lowOpen: false, highOpen: true }, (r) => r.toFixed(0)) // '127 to ≥ 200'
 */
export function profileIntervalText(
  p: Pick<RateProfileInterval, 'lowKgHa' | 'highKgHa' | 'lowOpen' | 'highOpen'>,
  rate: (kgHa: number) => string,
): string {
  return `${p.lowOpen ? '≤ ' : ''}${rate(p.lowKgHa)} to ${p.highOpen ? '≥ ' : ''}${rate(p.highKgHa)}`;
}

/**
 * Which ends of a join's profile interval the data leave open, in words, for a note column.
 * @param p - the interval
 * @returns one sentence, or "" when both ends are closed
 * @example
 * joinProfileNote({ lowOpen: false, highOpen: true }) // 'The join's profile interval is open above: …'
 */
export function joinProfileNote(p: Pick<RateProfileInterval, 'lowOpen' | 'highOpen'>): string {
  if (p.lowOpen && p.highOpen) {
    return "The join's profile interval is open at both ends: it runs over all the tested rates.";
  }
  if (p.lowOpen) {
    return "The join's profile interval is open below: a full response by the lowest non-zero rate is not ruled out.";
  }
  if (p.highOpen) {
    return "The join's profile interval is open above: a join at or past the highest tested rate is not ruled out.";
  }
  return '';
}

/**
 * A fit's status in words without numbers, for the same reason as the
 * optimum note: the models stage writes its rates in kg/ha.
 * @param f - the fit (model, status, R² kind, and the models stage's message for too few rates)
 * @returns one sentence, or "" for a plain fit
 * @example
 * fitMessage({ model: 'quadratic', status: 'convex', message: '', r2Kind: 'centered' }) // 'The quadratic opens upward, so it has no maximum.'
 */
export function fitMessage(f: Pick<ModelFit, 'model' | 'status' | 'message' | 'r2Kind'>): string {
  switch (f.status) {
    case 'ok':
      // A curve through the origin (the line through the origin) has R² about zero.
      return f.r2Kind === 'uncentered'
        ? 'R² is uncentered (about zero, not the mean): do not compare it with the others.'
        : '';
    case 'no-plateau':
      return 'No plateau within the tested rates: the straight line (or the quadratic) fits as well.';
    case 'full-response-at-lowest-rate':
      return 'Full response by the lowest non-zero rate: the join lies between the two lowest rates and cannot be placed more precisely.';
    case 'convex':
      return 'The quadratic opens upward, so it has no maximum.';
    case 'no-response':
      return 'Yield does not rise with rate: the best curve is flat.';
    case 'too-few-rates':
      return f.message;
  }
}

/**
 * The optimum's status in words without numbers: the writers show the rates
 * in their own units (the economics stage's explanation speaks kg/ha).
 * @param o - the optimum (its status)
 * @returns one sentence, or "" for an interior optimum
 * @example
 * optimumNote({ status: 'zero' }) // 'At these prices nitrogen does not pay here: …'
 */
export function optimumNote(o: Pick<EconomicOptimum, 'status'>): string {
  switch (o.status) {
    case 'interior':
      return '';
    case 'zero':
      return 'At these prices nitrogen does not pay here: the first unit already returns less than it costs.';
    case 'capped-at-highest':
      return 'The optimum lies beyond the highest tested rate; the highest tested rate is given instead.';
    case 'corner':
      return 'A straight line never levels off, so it gives only a corner (no N or the highest tested rate); a curve says more.';
    case 'join-in-first-interval':
      return 'Full response by the lowest non-zero rate: the optimum lies between the two lowest rates and cannot be given as one number.';
    case 'not-available':
      return 'This fit has no economic optimum (no plateau, no maximum or no response).';
  }
}
