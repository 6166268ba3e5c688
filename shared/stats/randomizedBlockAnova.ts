/**
 * Randomized complete block ANOVA: treatments × blocks, one plot per cell,
 * model y = μ + blockⱼ + treatmentᵢ + e.
 *
 * Complete data: SS_blocks = t Σ (ȳ.ⱼ − ȳ)², SS_treatments = b Σ (ȳᵢ. − ȳ)²,
 * SS_error = Σ (y − ȳᵢ. − ȳ.ⱼ + ȳ)² on (t − 1)(b − 1) df (Steel, Torrie & Dickey,
 * Principles and Procedures of Statistics, 3rd ed., §9.3; Gomez & Gomez,
 * Statistical Procedures for Agricultural Research, 2nd ed., §2.2). All sums
 * run on values shifted by the first plot, as in oneWayAnova.
 *
 * Missing plots: block and treatment effects are no longer orthogonal, so the
 * model is fitted by least squares with blocks first: SS_blocks is unadjusted,
 * SS_treatments = SSE(blocks) − SSE(blocks + treatments) is adjusted for blocks,
 * and the error df drop by one per missing plot. This gives the same tests as
 * Yates's missing-plot estimate with its bias correction (Steel, Torrie &
 * Dickey §9.7; Searle, Linear Models for Unbalanced Data, §5). Treatment means
 * are then least-squares means (each treatment's prediction averaged over all
 * blocks), their standard errors and the LSD of each pair come from the fit's
 * covariance, and the result says the design is unbalanced.
 */
import { assertFinite, assertLevel, assertSameLength, StatsInputError } from './errors';
import { fisherFUpperP } from './distributions';
import { factorLevels } from './factorLevels';
import { fisherLsd, type FisherLsdResult } from './fisherLsd';
import { fitLeastSquares } from './leastSquares';
import type { AnovaSource, TreatmentMean } from './anovaTable';

export interface RandomizedBlockInput {
  /** The treatment of every plot (label or number, e.g. the rate). */
  treatment: ArrayLike<string | number>;
  /** The block (replicate) of every plot. */
  block: ArrayLike<string | number>;
  /** The response of every plot, e.g. yield in kg/ha. */
  y: ArrayLike<number>;
  /** Significance level for the LSD, default 0.05. */
  alpha?: number;
}

export interface MissingPlot {
  treatment: string;
  block: string;
  /** The model's prediction for the empty cell (equals Yates's estimate for one missing plot). */
  estimate: number;
}

export interface RandomizedBlockResult {
  n: number;
  treatmentCount: number;
  blockCount: number;
  /** False when plots are missing (the least-squares route was taken). */
  balanced: boolean;
  missingPlots: MissingPlot[];
  /** Sentences for the screen about how the analysis was done. */
  notes: string[];
  blocks: AnovaSource;
  /** Adjusted for blocks when unbalanced. */
  treatments: AnovaSource;
  error: AnovaSource;
  total: AnovaSource;
  /** Treatment F and its upper-tail p-value. */
  F: number;
  p: number;
  blockF: number;
  blockP: number;
  /** Treatment means (least-squares means when unbalanced), in order of first appearance. */
  treatmentMeans: TreatmentMean[];
  /**
   * Var(mean_i − mean_k) / σ² for every pair, in the order of treatmentMeans (2 / blocks when
   * complete; from the least-squares fit's covariance otherwise): what a contrast of the means
   * needs besides the error mean square.
   */
  unscaledDifferenceVariance: number[][];
  /** Mean of the observed plots. */
  grandMean: number;
  /** √MS_error. */
  residualSd: number;
  /** 100 √MS_error / grand mean; null when the grand mean is 0. */
  cvPercent: number | null;
  lsd: FisherLsdResult;
}

/**
 * ANOVA of a randomized complete block trial.
 * @param input - treatment and block labels, responses, alpha
 * @returns the ANOVA table, treatment F-test, means with SEs, CV%, Fisher's LSD and missing-plot notes
 * @throws {StatsInputError} "length-mismatch"; "non-finite" in y; "bad-argument" for a missing label, alpha
 *   outside (0, 1) or a cell with more than one plot; "constant-values" when every y is equal; "too-few-points" for fewer than 2 treatments or
 *   blocks or no error df; "rank-deficient" when missing plots disconnect treatments from blocks
 * @example
 * randomizedBlockAnova({ treatment: [0, 60, 0, 60, 0, 60], block: [1, 1, 2, 2, 3, 3], y: [5, 7, 5.4, 7.1, 4.9, 6.8] }).F // ≈ 448
 */
export function randomizedBlockAnova(input: RandomizedBlockInput): RandomizedBlockResult {
  const { treatment, block, y } = input;
  const alpha = input.alpha ?? 0.05;
  assertSameLength(treatment, y, ['randomizedBlockAnova: treatment', 'y']);
  assertSameLength(block, y, ['randomizedBlockAnova: block', 'y']);
  assertFinite(y, 'randomizedBlockAnova: y');
  assertLevel(alpha, 'randomizedBlockAnova: alpha');
  const tr = factorLevels(treatment, 'randomizedBlockAnova: treatment');
  const bl = factorLevels(block, 'randomizedBlockAnova: block');
  const n = y.length;
  const t = tr.levels.length;
  const b = bl.levels.length;
  if (t < 2 || b < 2) {
    throw new StatsInputError(
      'too-few-points',
      `randomizedBlockAnova: ${t} treatment${t === 1 ? '' : 's'} in ${b} block${b === 1 ? '' : 's'}; a block design needs at least 2 of each.`,
    );
  }
  const cell = new Int32Array(t * b).fill(-1);
  for (let i = 0; i < n; i++) {
    const c = tr.index[i] * b + bl.index[i];
    if (cell[c] >= 0) {
      throw new StatsInputError(
        'bad-argument',
        `randomizedBlockAnova: treatment "${tr.levels[tr.index[i]]}" appears twice in block "${bl.levels[bl.index[i]]}" (rows ${cell[c] + 1} and ${i + 1}); a complete block design has one plot per treatment in each block.`,
      );
    }
    cell[c] = i;
  }
  const dfError = n - t - b + 1;
  if (dfError < 1) {
    throw new StatsInputError(
      'too-few-points',
      `randomizedBlockAnova: ${n} plots for ${t} treatments in ${b} blocks leave no error degrees of freedom.`,
    );
  }
  if (Array.prototype.every.call(y, (v: number) => v === y[0])) {
    throw new StatsInputError(
      'constant-values',
      `randomizedBlockAnova: y: all ${n} values equal ${String(y[0])}; there is no variation to analyze.`,
    );
  }
  const shift = y[0];
  const complete = n === t * b;
  const core = complete
    ? completeBlocks(tr.index, bl.index, y, shift, t, b)
    : leastSquaresBlocks(tr.index, bl.index, y, shift, t, b);

  const msError = core.ssError / dfError;
  const blocks: AnovaSource = { df: b - 1, ss: core.ssBlocks, ms: core.ssBlocks / (b - 1) };
  const treatments: AnovaSource = {
    df: t - 1,
    ss: core.ssTreatments,
    ms: core.ssTreatments / (t - 1),
  };
  const ssTotal = core.ssTotal;
  // With no error variation a source that varies is infinitely significant; one
  // that does not vary either gets F = 0 (p = 1), the only reading that does not
  // claim a difference the data do not show.
  const ratio = (ms: number) => (msError > 0 ? ms / msError : ms > 0 ? Infinity : 0);
  const F = ratio(treatments.ms);
  const blockF = ratio(blocks.ms);
  const grandMean = shift + core.grandShifted;
  const residualSd = Math.sqrt(msError);
  const rawSums = new Float64Array(t);
  for (let i = 0; i < n; i++) rawSums[tr.index[i]] += y[i] - shift;
  const treatmentMeans: TreatmentMean[] = tr.levels.map((level, i) => ({
    level,
    n: tr.counts[i],
    mean: shift + core.means[i],
    rawMean: shift + rawSums[i] / tr.counts[i],
    se: Math.sqrt(msError * core.unscaledMeanVariance(i)),
  }));
  const missingPlots: MissingPlot[] = [];
  for (let i = 0; i < t; i++) {
    for (let j = 0; j < b; j++) {
      if (cell[i * b + j] < 0) {
        missingPlots.push({
          treatment: tr.levels[i],
          block: bl.levels[j],
          estimate: shift + core.cellPrediction(i, j),
        });
      }
    }
  }
  const notes = complete
    ? []
    : [
        `Unbalanced: ${missingPlots.length} plot${missingPlots.length === 1 ? '' : 's'} missing (${missingPlots
          .map((m) => `treatment "${m.treatment}" in block "${m.block}"`)
          .join(
            ', ',
          )}). Fitted by least squares with blocks first: the treatment sum of squares is adjusted for blocks, treatment means are least-squares means, and each pair has its own LSD.`,
      ];
  return {
    n,
    treatmentCount: t,
    blockCount: b,
    balanced: complete,
    missingPlots,
    notes,
    blocks,
    treatments,
    error: { df: dfError, ss: core.ssError, ms: msError },
    total: { df: n - 1, ss: ssTotal, ms: ssTotal / (n - 1) },
    F,
    p: fisherFUpperP(F, t - 1, dfError),
    blockF,
    blockP: fisherFUpperP(blockF, b - 1, dfError),
    treatmentMeans,
    unscaledDifferenceVariance: tr.levels.map((_, i) =>
      tr.levels.map((__, k) => (i === k ? 0 : core.unscaledDifferenceVariance(i, k))),
    ),
    grandMean,
    residualSd,
    cvPercent: grandMean === 0 ? null : (100 * residualSd) / grandMean,
    lsd: fisherLsd({
      levels: tr.levels,
      means: core.means,
      seDifference: (i, k) => Math.sqrt(msError * core.unscaledDifferenceVariance(i, k)),
      dfError,
      alpha,
    }),
  };
}

/** What both routes hand back, on the shifted scale. */
interface BlockCore {
  ssBlocks: number;
  ssTreatments: number;
  ssError: number;
  ssTotal: number;
  grandShifted: number;
  /** Treatment means (least-squares means when unbalanced), shifted. */
  means: number[];
  /** Var(mean_i) / σ². */
  unscaledMeanVariance: (i: number) => number;
  /** Var(mean_i − mean_k) / σ². */
  unscaledDifferenceVariance: (i: number, k: number) => number;
  /** Prediction for treatment i in block j, shifted. */
  cellPrediction: (i: number, j: number) => number;
}

function completeBlocks(
  ti: Int32Array,
  bi: Int32Array,
  y: ArrayLike<number>,
  shift: number,
  t: number,
  b: number,
): BlockCore {
  const n = y.length;
  const tSum = new Float64Array(t);
  const bSum = new Float64Array(b);
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const v = y[i] - shift;
    tSum[ti[i]] += v;
    bSum[bi[i]] += v;
    sum += v;
  }
  const grand = sum / n;
  const tMean = Array.from(tSum, (s) => s / b);
  const bMean = Array.from(bSum, (s) => s / t);
  let ssTreatments = 0;
  for (const m of tMean) ssTreatments += b * (m - grand) ** 2;
  let ssBlocks = 0;
  for (const m of bMean) ssBlocks += t * (m - grand) ** 2;
  // Error and total from their own deviations, not by subtraction, so a small
  // error sum of squares keeps its digits.
  let ssError = 0;
  let ssTotal = 0;
  for (let i = 0; i < n; i++) {
    const v = y[i] - shift;
    ssError += (v - tMean[ti[i]] - bMean[bi[i]] + grand) ** 2;
    ssTotal += (v - grand) ** 2;
  }
  return {
    ssBlocks,
    ssTreatments,
    ssError,
    ssTotal,
    grandShifted: grand,
    means: tMean,
    unscaledMeanVariance: () => 1 / b,
    unscaledDifferenceVariance: () => 2 / b,
    cellPrediction: (i, j) => tMean[i] + bMean[j] - grand,
  };
}

function leastSquaresBlocks(
  ti: Int32Array,
  bi: Int32Array,
  y: ArrayLike<number>,
  shift: number,
  t: number,
  b: number,
): BlockCore {
  const n = y.length;
  const ys = Float64Array.from(y, (v) => v - shift);
  // Treatment contrasts: the first block and the first treatment are the reference levels.
  const indicator = (index: Int32Array, level: number) =>
    Float64Array.from(index, (k) => (k === level ? 1 : 0));
  const blockColumns = Array.from({ length: b - 1 }, (_, j) => indicator(bi, j + 1));
  const treatmentColumns = Array.from({ length: t - 1 }, (_, i) => indicator(ti, i + 1));
  let grand = 0;
  for (let i = 0; i < n; i++) grand += ys[i];
  grand /= n;
  let ssTotal = 0;
  for (let i = 0; i < n; i++) ssTotal += (ys[i] - grand) ** 2;
  const blocksOnly = fitLeastSquares({ columns: blockColumns, y: ys, intercept: true });
  let full;
  try {
    full = fitLeastSquares({
      columns: [...blockColumns, ...treatmentColumns],
      y: ys,
      intercept: true,
    });
  } catch (e) {
    if (e instanceof StatsInputError && e.code === 'rank-deficient') {
      throw new StatsInputError(
        'rank-deficient',
        'randomizedBlockAnova: the missing plots leave some treatments with no block in common with the others, so their effects cannot be separated from block effects.',
      );
    }
    throw e;
  }
  const beta = full.coefficients.map((c) => c.estimate);
  const cov = full.covariance;
  const s2 = full.sse / full.dfResidual;
  // LS mean of treatment i: μ + mean over blocks of blockⱼ + treatmentᵢ, a linear combination cᵢᵀβ.
  const weights = (i: number): Float64Array => {
    const c = new Float64Array(beta.length);
    c[0] = 1;
    for (let j = 1; j < b; j++) c[j] = 1 / b;
    if (i > 0) c[b - 1 + i] = 1;
    return c;
  };
  const quad = (c: Float64Array): number => {
    let s = 0;
    for (let r = 0; r < c.length; r++)
      for (let q = 0; q < c.length; q++) s += c[r] * cov[r][q] * c[q];
    return s / s2;
  };
  const dot = (c: Float64Array): number => c.reduce((s, v, r) => s + v * beta[r], 0);
  const means = Array.from({ length: t }, (_, i) => dot(weights(i)));
  return {
    ssBlocks: Math.max(ssTotal - blocksOnly.sse, 0),
    ssTreatments: Math.max(blocksOnly.sse - full.sse, 0),
    ssError: full.sse,
    ssTotal,
    grandShifted: grand,
    means,
    unscaledMeanVariance: (i) => quad(weights(i)),
    unscaledDifferenceVariance: (i, k) => {
      const c = weights(i);
      const d = weights(k);
      return quad(c.map((v, r) => v - d[r]));
    },
    cellPrediction: (i, j) => beta[0] + (j > 0 ? beta[j] : 0) + (i > 0 ? beta[b - 1 + i] : 0),
  };
}
