/**
 * The rate + block model of one site: yield = mean + block + rate + error, with the rate taken as
 * a factor (one mean per rate, no curve assumed). The one place that fits it; the quality checks
 * (trial CV, outliers), the analysis (did the site respond: the rate effect's F-test) and the
 * report (the ANOVA table with rate means ± SE) all read it from here.
 *
 * Blocks enter when {@link hasBlocks} says so (every plot labeled, two blocks or more):
 * - one plot per rate in each block, some possibly missing: the randomized complete block ANOVA
 *   (randomizedBlockAnova; complete data in closed form, missing plots by least squares with
 *   blocks first, so the rate effect is adjusted for blocks and the means are least-squares
 *   means; Steel, Torrie & Dickey, Principles and Procedures of Statistics, 3rd ed., ch. 9);
 * - a rate repeated within a block (an extra check plot, say): the same additive model by least
 *   squares with blocks first, plain rate means with SE √(MSE / nᵢ), and no common LSD.
 * Without blocks it is the one-way ANOVA (oneWayAnova; Snedecor & Cochran, §12.2).
 *
 * The rate effect is the extra-sum-of-squares F-test of y ~ block + rate against y ~ block, and
 * CV% = 100 · √(residual mean square) / mean yield. Every route also gives each rate's mean as a
 * difference from the lowest rate's, with the covariance of those differences over the residual
 * mean square, which is all a contrast of the rate means needs (shared/stats/rateContrast).
 *
 * A site the model cannot be fitted to is a result with a reason, never an exception:
 * - no plots, or a single rate (nothing to compare);
 * - no residual degrees of freedom after blocks and rates;
 * - missing plots that leave blocks and rates confounded;
 * - every plot with the same yield.
 */
import type { AnovaSource } from './anovaTable';
import { fisherFUpperP } from './distributions';
import { StatsInputError } from './errors';
import { hasBlocks } from './hasBlocks';
import { fitLeastSquares, type LeastSquaresFit } from './leastSquares';
import { oneWayAnova } from './oneWayAnova';
import { randomizedBlockAnova } from './randomizedBlockAnova';

export interface RateBlockInput {
  /** Rate of each plot, kg/ha (each distinct rate is one level). */
  rateKgHa: ArrayLike<number>;
  /** Yield of each plot, kg/ha. */
  yieldKgHa: ArrayLike<number>;
  /** Block label of each plot, null where the sheet has none. */
  block: ReadonlyArray<string | null>;
  /** Significance level of the LSD, default 0.05. */
  alpha?: number;
}

/** One rate's mean and its standard error. */
export interface RateMean {
  rateKgHa: number;
  /** Plots observed at this rate. */
  n: number;
  /** The mean used for comparisons (least-squares mean when plots are missing), kg/ha. */
  meanKgHa: number;
  /** Standard error of the mean from the residual mean square, kg/ha. */
  seKgHa: number;
}

export interface RateBlockModel {
  /** 'rcbd' with block terms, 'oneWay' without. */
  design: 'rcbd' | 'oneWay';
  n: number;
  rateCount: number;
  /** Blocks in the model; 1 without block terms. */
  blockCount: number;
  /** Mean yield of the plots, kg/ha. */
  meanKgHa: number;
  /** Rate means ± SE, by increasing rate. */
  rateMeans: RateMean[];
  /** Each rate's mean less the lowest rate's, with their covariance (rateContrast reads these). */
  differences: RateDifferences;
  /** The blocks line (unadjusted), null without blocks. */
  blocks: AnovaSource | null;
  blockF: number | null;
  blockP: number | null;
  /** The rate line, adjusted for blocks. */
  rates: AnovaSource;
  /** Residual (error) line: SS in (kg/ha)², df, mean square. */
  residual: AnovaSource;
  total: AnovaSource;
  /** The rate effect's F and its upper-tail p-value on (rates.df, residual.df). */
  F: number;
  p: number;
  /** 100 √MSE / mean, %; null when the mean yield is 0. */
  cvPct: number | null;
  /** Fisher's LSD (α = alpha) shared by every pair, kg/ha; null when pairs differ. */
  lsdKgHa: number | null;
  /** Rate × block cells with no plot (one plot per cell designs only). */
  missingPlots: { rateKgHa: number; block: string }[];
  /** Sentences about how the model was fitted (unbalanced data). */
  notes: string[];
}

/**
 * The rate means as differences from the lowest rate's: block-adjusted (least-squares means when
 * plots are missing, the rate effects of the least-squares fit when a rate repeats in a block).
 */
export interface RateDifferences {
  /** The rates above the lowest, ascending, kg/ha. */
  rateKgHa: number[];
  /** Each one's mean less the lowest rate's mean, kg/ha. */
  differenceKgHa: number[];
  /** Cov(difference_j, difference_k) / σ², row-major; σ² is estimated by the residual mean square. */
  unscaledCovariance: number[][];
}

/** Why the model could not be fitted to a site. */
export interface RateBlockProblem {
  problem: string;
  /**
   * Which reason: no plots, one rate, no residual degrees of freedom after blocks and rates
   * ("too-few-points": no rate replicated within the design), blocks confounded with rates
   * ("rank-deficient") or one yield on every plot ("constant-values").
   */
  code: 'no-plots' | 'one-rate' | keyof typeof PROBLEMS;
}

/**
 * Fits the rate + block model to one site.
 * @param input - rates (kg/ha), yields (kg/ha) and block labels of the site's analyzable plots
 * @returns the model (ANOVA lines, rate F-test, means ± SE, CV%), or the reason there is none
 * @throws {StatsInputError} only for a caller's mistake: arrays of different lengths, a
 *   non-finite yield, alpha outside (0, 1)
 * @example
 * const m = fitRateBlockModel({ rateKgHa: [0, 90, 0, 90, 0, 90], yieldKgHa: [6.1, 8, 6.3, 8.4, 5.9, 7.9], block: ['1', '1', '2', '2', '3', '3'] });
 * 'problem' in m ? m.problem : [m.F, m.p, m.residual.df] // [≈ 1200, ≈ 0.00083, 2] (R's anova(lm) agrees)
 */
export function fitRateBlockModel(input: RateBlockInput): RateBlockModel | RateBlockProblem {
  const { rateKgHa, yieldKgHa, block } = input;
  const n = yieldKgHa.length;
  if (rateKgHa.length !== n || block.length !== n) {
    throw new StatsInputError(
      'length-mismatch',
      `fitRateBlockModel: ${rateKgHa.length} rates, ${block.length} block labels and ${n} yields; give one of each per plot.`,
    );
  }
  if (n === 0) return { problem: 'no plots', code: 'no-plots' };
  if (new Set(Array.from(rateKgHa)).size < 2)
    return { problem: 'only one rate was tested', code: 'one-rate' };
  try {
    if (!hasBlocks(block)) return fromOneWay(input);
    return repeatedCell(rateKgHa, block as string[]) ? additiveBlocks(input) : fromRcbd(input);
  } catch (e) {
    if (!(e instanceof StatsInputError) || !(e.code in PROBLEMS)) throw e;
    const code = e.code as keyof typeof PROBLEMS;
    return { problem: PROBLEMS[code], code };
  }
}

/**
 * The least-squares fit of the same model (intercept, one indicator per rate but the first, one
 * per block but the first when the site has blocks), for residual diagnostics: studentized
 * residuals and leverages.
 * @param input - the site's rates (kg/ha), yields (kg/ha) and block labels
 * @param options - `inference: false` skips the coefficient tests and intervals (NaN), for a
 *   caller that reads only the residuals and leverages (fitLeastSquares)
 * @returns the fit; coefficients are contrasts with the lowest rate and the first block
 * @throws {StatsInputError} "rank-deficient" when blocks and rates are confounded, "too-few-points"
 * @example
 * fitRateBlockLeastSquares(site).studentizedResiduals // one per plot
 */
export function fitRateBlockLeastSquares(
  input: RateBlockInput,
  options: { inference?: boolean } = {},
): LeastSquaresFit {
  const { rateKgHa, block } = input;
  const n = rateKgHa.length;
  const rates = [...new Set(Array.from(rateKgHa))].sort((a, b) => a - b);
  const blockLabels = hasBlocks(block) ? [...new Set(block)].slice(1) : [];
  const columns: Float64Array[] = [];
  const names: string[] = [];
  // Indicator columns by plain loops (Float64Array.from with a function costs far more), all
  // in one store: each typed array with a store of its own is an allocation the GC tracks.
  const store = new ArrayBuffer(8 * n * (rates.length - 1 + blockLabels.length));
  const indicator = (is: (i: number) => boolean): Float64Array => {
    const column = new Float64Array(store, 8 * n * columns.length, n);
    for (let i = 0; i < n; i++) if (is(i)) column[i] = 1;
    return column;
  };
  for (const level of rates.slice(1)) {
    columns.push(indicator((i) => rateKgHa[i] === level));
    names.push(`rate ${level}`);
  }
  for (const b of blockLabels) {
    columns.push(indicator((i) => block[i] === b));
    names.push(`block ${b}`);
  }
  return fitLeastSquares({
    columns,
    columnNames: names,
    y: input.yieldKgHa,
    intercept: true,
    inference: options.inference,
  });
}

/** The data problems the ANOVA routines report, as a site's reason. */
const PROBLEMS = {
  'too-few-points': 'no residual degrees of freedom are left after blocks and rates',
  'rank-deficient': 'the blocks and rates are confounded',
  'constant-values': 'every plot has the same yield',
} as const;

function byRate(a: RateMean, b: RateMean): number {
  return a.rateKgHa - b.rateKgHa;
}

function fromOneWay(input: RateBlockInput): RateBlockModel {
  const a = oneWayAnova({ treatment: input.rateKgHa, y: input.yieldKgHa, alpha: input.alpha });
  const sorted = [...a.treatments].sort((u, v) => Number(u.level) - Number(v.level));
  // Independent means: Var(m_j − m_0) = σ²(1/n_j + 1/n_0), and any two share 1/n_0.
  const [low, ...rest] = sorted;
  const differences: RateDifferences = {
    rateKgHa: rest.map((m) => Number(m.level)),
    differenceKgHa: rest.map((m) => m.mean - low.mean),
    unscaledCovariance: rest.map((m, j) => rest.map((_, k) => (j === k ? 1 / m.n : 0) + 1 / low.n)),
  };
  return {
    design: 'oneWay',
    n: a.n,
    rateCount: a.treatments.length,
    blockCount: 1,
    meanKgHa: a.grandMean,
    rateMeans: a.treatments
      .map((m) => ({ rateKgHa: Number(m.level), n: m.n, meanKgHa: m.mean, seKgHa: m.se }))
      .sort(byRate),
    differences,
    blocks: null,
    blockF: null,
    blockP: null,
    rates: a.between,
    residual: a.within,
    total: a.total,
    F: a.F,
    p: a.p,
    cvPct: a.cvPercent,
    lsdKgHa: a.lsd.lsd,
    missingPlots: [],
    notes: a.notes,
  };
}

function fromRcbd(input: RateBlockInput): RateBlockModel {
  const a = randomizedBlockAnova({
    treatment: input.rateKgHa,
    block: input.block as string[],
    y: input.yieldKgHa,
    alpha: input.alpha,
  });
  // Level order of the ANOVA (first appearance) sorted by rate; v(i, k) = Var(m_i − m_k) / σ².
  const order = a.treatmentMeans
    .map((m, i) => ({ rate: Number(m.level), i }))
    .sort((u, v) => u.rate - v.rate);
  const v = (i: number, k: number) => a.unscaledDifferenceVariance[i][k];
  const low = order[0].i;
  const rest = order.slice(1);
  const differences: RateDifferences = {
    rateKgHa: rest.map((o) => o.rate),
    differenceKgHa: rest.map((o) => a.treatmentMeans[o.i].mean - a.treatmentMeans[low].mean),
    // Cov(m_j − m_0, m_k − m_0) = [v(0, j) + v(0, k) − v(j, k)] / 2.
    unscaledCovariance: rest.map((oj) =>
      rest.map((ok) => (v(low, oj.i) + v(low, ok.i) - v(oj.i, ok.i)) / 2),
    ),
  };
  return {
    design: 'rcbd',
    n: a.n,
    rateCount: a.treatmentCount,
    blockCount: a.blockCount,
    meanKgHa: a.grandMean,
    rateMeans: a.treatmentMeans
      .map((m) => ({ rateKgHa: Number(m.level), n: m.n, meanKgHa: m.mean, seKgHa: m.se }))
      .sort(byRate),
    differences,
    blocks: a.blocks,
    blockF: a.blockF,
    blockP: a.blockP,
    rates: a.treatments,
    residual: a.error,
    total: a.total,
    F: a.F,
    p: a.p,
    cvPct: a.cvPercent,
    lsdKgHa: a.lsd.lsd,
    missingPlots: a.missingPlots.map((m) => ({ rateKgHa: Number(m.treatment), block: m.block })),
    notes: a.notes,
  };
}

function repeatedCell(rates: ArrayLike<number>, blocks: readonly string[]): boolean {
  const seen = new Set<string>();
  for (let i = 0; i < blocks.length; i++) {
    const cell = `${rates[i]}\u0000${blocks[i]}`;
    if (seen.has(cell)) return true;
    seen.add(cell);
  }
  return false;
}

/** Blocks first, then rates, by least squares: for blocks holding a rate more than once. */
function additiveBlocks(input: RateBlockInput): RateBlockModel {
  const y = input.yieldKgHa;
  const n = y.length;
  const labels = input.block as string[];
  const full = fitRateBlockLeastSquares(input);
  if (full.dfResidual < 1) throw new StatsInputError('too-few-points', 'no residual df');
  // Blocks alone: SSE is the spread around each block's mean (shifted by the first plot).
  const shift = y[0];
  const sums = new Map<string, { sum: number; count: number }>();
  let grand = 0;
  for (let i = 0; i < n; i++) {
    const s = sums.get(labels[i]) ?? { sum: 0, count: 0 };
    s.sum += y[i] - shift;
    s.count++;
    sums.set(labels[i], s);
    grand += y[i] - shift;
  }
  grand /= n;
  let sseBlocks = 0;
  let ssTotal = 0;
  for (let i = 0; i < n; i++) {
    const s = sums.get(labels[i])!;
    sseBlocks += (y[i] - shift - s.sum / s.count) ** 2;
    ssTotal += (y[i] - shift - grand) ** 2;
  }
  const b = sums.size;
  const rateLevels = [...new Set(Array.from(input.rateKgHa))].sort((u, v) => u - v);
  const t = rateLevels.length;
  const msError = full.sse / full.dfResidual;
  const ssRates = Math.max(sseBlocks - full.sse, 0);
  const ssBlocks = Math.max(ssTotal - sseBlocks, 0);
  const ratio = (ms: number) => (msError > 0 ? ms / msError : ms > 0 ? Infinity : 0);
  const F = ratio(ssRates / (t - 1));
  const blockF = ratio(ssBlocks / (b - 1));
  const meanKgHa = shift + grand;
  const rateMeans = rateLevels.map((rate) => {
    let sum = 0;
    let count = 0;
    for (let i = 0; i < n; i++) {
      if (input.rateKgHa[i] !== rate) continue;
      sum += y[i];
      count++;
    }
    return { rateKgHa: rate, n: count, meanKgHa: sum / count, seKgHa: Math.sqrt(msError / count) };
  });
  // The fit's rate coefficients are the differences from the lowest rate (columns 1 … t − 1
  // after the intercept), adjusted for blocks.
  const rateColumns = rateLevels.slice(1).map((_, j) => j + 1);
  const differences: RateDifferences = {
    rateKgHa: rateLevels.slice(1),
    differenceKgHa: rateColumns.map((c) => full.coefficients[c].estimate),
    unscaledCovariance: rateColumns.map((c) =>
      rateColumns.map((d) => full.unscaledCovariance[c][d]),
    ),
  };
  return {
    design: 'rcbd',
    n,
    rateCount: t,
    blockCount: b,
    meanKgHa,
    rateMeans,
    differences,
    blocks: { df: b - 1, ss: ssBlocks, ms: ssBlocks / (b - 1) },
    blockF,
    blockP: fisherFUpperP(blockF, b - 1, full.dfResidual),
    rates: { df: t - 1, ss: ssRates, ms: ssRates / (t - 1) },
    residual: { df: full.dfResidual, ss: full.sse, ms: msError },
    total: { df: n - 1, ss: ssTotal, ms: ssTotal / (n - 1) },
    F,
    p: fisherFUpperP(F, t - 1, full.dfResidual),
    cvPct: meanKgHa === 0 ? null : (100 * Math.sqrt(msError)) / meanKgHa,
    lsdKgHa: null,
    missingPlots: [],
    notes: [
      'A rate appears more than once in a block: fitted by least squares with blocks first; the rate means are plain averages.',
    ],
  };
}
