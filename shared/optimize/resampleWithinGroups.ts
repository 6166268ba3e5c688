/**
 * Stratified resampling with replacement: every group (stratum) keeps its size
 * and is refilled by draws from its own members only (Davison & Hinkley,
 * Bootstrap Methods and their Application, 1997, §3.2, stratified sampling).
 * In a rate trial the strata are the rates, so every resample keeps the design.
 */
import type { SeededRandom } from './seededRandom';

/** Members of each group, packed: group g owns members[starts[g]] … members[starts[g + 1] − 1]. */
export interface Strata {
  members: Int32Array;
  starts: Int32Array;
}

/**
 * Packs group labels into strata.
 * @param groupOf - group index (0 … groups − 1) of each item
 * @param groups - number of groups
 * @returns the packed strata, items in input order within each group
 * @example
 * strataOf(new Int32Array([1, 0, 1]), 2) // members [1, 0, 2], starts [0, 1, 3]
 */
export function strataOf(groupOf: Int32Array, groups: number): Strata {
  const starts = new Int32Array(groups + 1);
  for (let i = 0; i < groupOf.length; i++) starts[groupOf[i] + 1]++;
  for (let g = 0; g < groups; g++) starts[g + 1] += starts[g];
  const fill = starts.slice(0, groups);
  const members = new Int32Array(groupOf.length);
  for (let i = 0; i < groupOf.length; i++) members[fill[groupOf[i]]++] = i;
  return { members, starts };
}

/**
 * Draws one stratified resample: out[k] is the item that fills position k of the
 * packed strata (position k belongs to the same group as members[k]).
 * @param strata - from strataOf
 * @param random - a seeded generator
 * @param out - receives item indices, length = members.length
 * @example
 * resampleWithinGroups(strataOf(groupOf, m), seededRandom(1), out)
 * @returns nothing; `out` is filled
 */
export function resampleWithinGroups(strata: Strata, random: SeededRandom, out: Int32Array): void {
  const { members, starts } = strata;
  for (let g = 0; g + 1 < starts.length; g++) {
    const from = starts[g];
    const size = starts[g + 1] - from;
    for (let k = 0; k < size; k++) out[from + k] = members[from + random.nextInt(size)];
  }
}
