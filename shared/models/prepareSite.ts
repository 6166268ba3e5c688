/**
 * Turns a site's plots into what the profiled fits read: the distinct rates,
 * which rate each plot has, and the per-rate count, mean and within-rate sum of
 * squares. Without block terms every profiled model sees the data only through
 * these (SSE(θ) = SS_within + Σ n_j (ȳ_j − ŷ_j)², O(distinct rates) per
 * evaluation). With block terms in a design where every block has the same
 * mix of rates (proportional frequencies n_bj = n_b n_j / n), the block columns
 * are orthogonal to any function of rate once centered, so the same group sums
 * apply to the block-adjusted yields y − ȳ_block + ȳ, with B − 1 fewer residual
 * df (Searle, Linear Models, 1971, §7.2 on proportional subclass numbers).
 * Other block layouts need the full design ("full").
 */
import { assertFinite, StatsInputError } from '../stats/errors';
import type { BlockTerms, SiteData, TestedRates } from './modelTypes';

export interface PreparedSite {
  n: number;
  x: Float64Array;
  y: Float64Array;
  /** Distinct rates ascending, kg/ha. */
  rates: Float64Array;
  /** Index into `rates` for each plot. */
  groupOf: Int32Array;
  counts: Float64Array;
  blocks: BlockTerms;
  /** Block labels in first-seen order (empty without block terms). */
  blockLabels: string[];
  /** Index into blockLabels for each plot (all 0 without block terms). */
  blockOf: Int32Array;
  /** How SSE(θ) is evaluated: group sums, group sums of block-adjusted yields, or the full design. */
  design: 'groups' | 'balanced-blocks' | 'full';
  /** The yields the group sums are built from: y, or block-adjusted y. */
  yGroup: Float64Array;
  /** Per-rate means of yGroup. */
  means: Float64Array;
  /** Σ (yGroup − group mean)² within rates. */
  ssWithin: number;
  /**
   * Block offsets ȳ_block − ȳ when they are orthogonal to every function of rate
   * and to the intercept (equal block sizes with the same rates in each): then the
   * curve is fitted on group sums alone and the offsets are known in advance.
   * Empty without block terms; null when the full design is needed.
   */
  orthogonalBlockOffsets: Float64Array | null;
  /** Residual df taken by the block offsets (B − 1, or 0). */
  blockDf: number;
  testedRates: TestedRates;
}

/**
 * Groups a site's plots by rate and, when asked, by block.
 * @param data - rates (kg/ha), yields (kg/ha) and optional block labels, one per plot
 * @param blocks - 'none' or 'fixed' block offsets
 * @returns the prepared site
 * @throws {StatsInputError} "length-mismatch" when the arrays differ in length; "non-finite"
 *   for NaN or ±Infinity; "bad-argument" for a negative rate, or blocks 'fixed' without labels
 *   for every plot
 * @example
 * prepareSite({ rateKgHa: [0, 0, 50, 50], yieldKgHa: [5, 6, 8, 9] }, 'none').means // [5.5, 8.5]
 */
export function prepareSite(data: SiteData, blocks: BlockTerms): PreparedSite {
  const n = data.rateKgHa.length;
  if (data.yieldKgHa.length !== n) {
    throw new StatsInputError(
      'length-mismatch',
      `yieldKgHa has ${data.yieldKgHa.length} values but rateKgHa has ${n}.`,
    );
  }
  assertFinite(data.rateKgHa, 'rateKgHa');
  assertFinite(data.yieldKgHa, 'yieldKgHa');
  // Rates and yields in one buffer, group and block indices in another: each
  // typed array with a store of its own is an allocation the GC must track.
  const numbers = new ArrayBuffer(16 * n);
  const x = new Float64Array(numbers, 0, n);
  const y = new Float64Array(numbers, 8 * n, n);
  copyInto(data.rateKgHa, x);
  copyInto(data.yieldKgHa, y);
  const indices = new ArrayBuffer(8 * n);
  for (let i = 0; i < n; i++) {
    if (x[i] < 0) {
      throw new StatsInputError(
        'bad-argument',
        `rateKgHa: value ${i + 1} is ${x[i]}; a rate cannot be negative.`,
      );
    }
  }
  const rates = distinctSorted(x);
  const m = rates.length;
  const groupOf = new Int32Array(indices, 0, n);
  const counts = new Float64Array(m);
  for (let i = 0; i < n; i++) {
    // Binary search: rates are few but sites are many.
    let lo = 0;
    let hi = m - 1;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (rates[mid] < x[i]) lo = mid + 1;
      else hi = mid;
    }
    groupOf[i] = lo;
    counts[lo]++;
  }

  const blockLabels: string[] = [];
  const blockOf = new Int32Array(indices, 4 * n, n);
  let design: PreparedSite['design'] = 'groups';
  let yGroup = y;
  let orthogonalBlockOffsets: Float64Array | null = new Float64Array(0);
  if (blocks === 'fixed') {
    const labels = data.block;
    if (!labels || labels.length !== n) {
      throw new StatsInputError(
        'bad-argument',
        `blocks: 'fixed' needs a block label for each of the ${n} plots.`,
      );
    }
    const index = new Map<string, number>();
    for (let i = 0; i < n; i++) {
      const label = labels[i];
      if (label === null || label === undefined || label === '') {
        throw new StatsInputError(
          'bad-argument',
          `block: plot ${i + 1} has no block label, which blocks: 'fixed' needs.`,
        );
      }
      let b = index.get(label);
      if (b === undefined) {
        b = blockLabels.length;
        index.set(label, b);
        blockLabels.push(label);
      }
      blockOf[i] = b;
    }
    const nb = blockLabels.length;
    const cell = new Float64Array(nb * m);
    const blockSize = new Float64Array(nb);
    for (let i = 0; i < n; i++) {
      cell[blockOf[i] * m + groupOf[i]]++;
      blockSize[blockOf[i]]++;
    }
    let proportional = true;
    for (let b = 0; b < nb && proportional; b++) {
      for (let j = 0; j < m; j++) {
        if (Math.abs(cell[b * m + j] * n - blockSize[b] * counts[j]) > 1e-9) {
          proportional = false;
          break;
        }
      }
    }
    if (proportional) {
      design = 'balanced-blocks';
      const blockSum = new Float64Array(nb);
      let total = 0;
      for (let i = 0; i < n; i++) {
        blockSum[blockOf[i]] += y[i];
        total += y[i];
      }
      const grand = total / n;
      yGroup = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        yGroup[i] = y[i] - blockSum[blockOf[i]] / blockSize[blockOf[i]] + grand;
      }
      let equalSizes = true;
      for (let b = 1; b < nb; b++) if (blockSize[b] !== blockSize[0]) equalSizes = false;
      if (equalSizes) {
        orthogonalBlockOffsets = new Float64Array(nb);
        for (let b = 0; b < nb; b++) orthogonalBlockOffsets[b] = blockSum[b] / blockSize[b] - grand;
      } else {
        orthogonalBlockOffsets = null;
      }
    } else {
      design = 'full';
      orthogonalBlockOffsets = null;
    }
  }
  const { means, ssWithin } = rateGroupMoments(yGroup, groupOf, counts);
  return {
    n,
    x,
    y,
    rates,
    groupOf,
    counts,
    blocks,
    blockLabels,
    blockOf,
    design,
    yGroup,
    means,
    ssWithin,
    orthogonalBlockOffsets,
    blockDf: blocks === 'fixed' ? blockLabels.length - 1 : 0,
    testedRates: {
      lowestKgHa: m > 0 ? rates[0] : NaN,
      highestKgHa: m > 0 ? rates[m - 1] : NaN,
      distinctKgHa: Array.from(rates),
    },
  };
}

/**
 * Copies numbers into a Float64Array by index (Float64Array.from goes through
 * the iterator protocol, several times slower for a plain array).
 * @param values - numbers, as many as `out` holds
 * @param out - receives them
 * @example
 * copyInto([1, 2], new Float64Array(2)) // out is [1, 2]
 */
function copyInto(values: ArrayLike<number>, out: Float64Array): void {
  for (let i = 0; i < out.length; i++) out[i] = values[i];
}

/**
 * The distinct values ascending. Sorting a copy and dropping repeats allocates
 * one array, where a Set and its iterator cost far more for a site's few rates.
 * @param x - values (finite)
 * @returns distinct values ascending
 * @example
 * distinctSorted(new Float64Array([50, 0, 50])) // Float64Array [0, 50]
 */
function distinctSorted(x: Float64Array): Float64Array {
  const sorted = x.slice().sort();
  let m = 0;
  for (let i = 0; i < sorted.length; i++) {
    // −0 and 0 are one rate, as they were for the Set this replaces.
    if (i === 0 || sorted[i] !== sorted[m - 1]) sorted[m++] = sorted[i] + 0;
  }
  return sorted.slice(0, m);
}

/**
 * Per-rate means and the pooled within-rate sum of squares (two passes, so no
 * cancellation between Σy² and (Σy)²/n).
 * @param y - values, one per plot
 * @param groupOf - group index of each plot
 * @param counts - plots per group (every count > 0)
 * @returns group means and Σ (y − ȳ_group)²
 * @example
 * rateGroupMoments([5, 6, 8, 9], new Int32Array([0, 0, 1, 1]), new Float64Array([2, 2])) // { means: [5.5, 8.5], ssWithin: 1 }
 */
export function rateGroupMoments(
  y: ArrayLike<number>,
  groupOf: Int32Array,
  counts: Float64Array,
): { means: Float64Array; ssWithin: number } {
  const m = counts.length;
  const means = new Float64Array(m);
  for (let i = 0; i < y.length; i++) means[groupOf[i]] += y[i];
  for (let j = 0; j < m; j++) means[j] /= counts[j];
  let ssWithin = 0;
  for (let i = 0; i < y.length; i++) {
    const d = y[i] - means[groupOf[i]];
    ssWithin += d * d;
  }
  return { means, ssWithin };
}
