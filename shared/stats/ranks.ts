/**
 * Ranks 1…n with tied values sharing the average of the ranks they span
 * ("mid-ranks"), the convention Spearman's coefficient and the rank tests use
 * (Conover, Practical Nonparametric Statistics, 3rd ed., §5.1).
 */
import { assertFinite } from './errors';

/**
 * Average ranks of a sample.
 * @param values - finite numbers, any unit (not modified)
 * @param what - how to name the values in an error message, default "values"
 * @returns a rank for each value in input order, ties averaged (e.g. 2.5 for a tie at 2 and 3)
 * @throws {StatsInputError} "non-finite" for NaN or ±Infinity
 * @example
 * averageRanks([30, 10, 20, 10]) // Float64Array [4, 1.5, 3, 1.5]
 */
export function averageRanks(values: ArrayLike<number>, what = 'values'): Float64Array {
  assertFinite(values, what);
  const n = values.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => values[a] - values[b]);
  const ranks = new Float64Array(n);
  let start = 0;
  while (start < n) {
    let end = start;
    while (end + 1 < n && values[order[end + 1]] === values[order[start]]) end++;
    // Positions start…end (0-based) hold ranks start+1…end+1; their mean:
    const rank = (start + end) / 2 + 1;
    for (let k = start; k <= end; k++) ranks[order[k]] = rank;
    start = end + 1;
  }
  return ranks;
}
