/**
 * One-way analysis of variance (completely randomized design) with treatment
 * means, their standard errors, CV% and Fisher's LSD.
 *
 * SS_between = Σ nᵢ (ȳᵢ − ȳ)², SS_within = Σᵢ Σⱼ (yᵢⱼ − ȳᵢ)², F = MS_between / MS_within
 * on (k − 1, N − k) df (Snedecor & Cochran, Statistical Methods, 8th ed., §12.2).
 *
 * Numerical care: every value is first shifted by the first observation, an
 * exact subtraction for values of like magnitude (Sterbenz's lemma), so the
 * means and squared deviations are formed from the small differences rather
 * than from numbers with thirteen shared leading digits; within each group
 * the corrected two-pass sum (Chan, Golub & LeVeque 1983) removes what
 * rounding is left in the group mean. This is what lets NIST StRD SmLs07–09
 * (values near 10¹²) come out right; the textbook Σy² − (Σy)²/N form loses
 * every digit there.
 *
 * R² = SS_between / (SS_between + SS_within); CV% = 100 √MS_within / ȳ, null for ȳ = 0.
 */
import { assertFinite, assertLevel, assertSameLength, StatsInputError } from './errors';
import { fisherFUpperP } from './distributions';
import { factorLevels } from './factorLevels';
import { fisherLsd, type FisherLsdResult } from './fisherLsd';
import type { AnovaSource, TreatmentMean } from './anovaTable';

export interface OneWayAnovaInput {
  /** The treatment of every plot: a label or a number (e.g. the rate). */
  treatment: ArrayLike<string | number>;
  /** The response of every plot, same length, e.g. yield in kg/ha. */
  y: ArrayLike<number>;
  /** Significance level for the LSD, default 0.05. */
  alpha?: number;
}

export interface OneWayAnovaResult {
  n: number;
  /** Treatment means in order of first appearance. */
  treatments: TreatmentMean[];
  /** The same list as `treatments`, under the name randomizedBlockAnova uses. */
  treatmentMeans: TreatmentMean[];
  /** Sentences for the screen about how the analysis was done (unequal replication). */
  notes: string[];
  between: AnovaSource;
  within: AnovaSource;
  total: AnovaSource;
  F: number;
  /** Upper-tail p-value of F. */
  p: number;
  r2: number;
  /** √MS_within, in the response's unit. */
  residualSd: number;
  grandMean: number;
  /** 100 √MS_within / grand mean; null when the grand mean is 0. */
  cvPercent: number | null;
  /** True when every treatment has the same number of plots. */
  balanced: boolean;
  lsd: FisherLsdResult;
}

/**
 * One-way ANOVA of a response by treatment.
 * @param input - treatment labels, responses and alpha
 * @returns the ANOVA table, F-test, treatment means with SEs, CV% and Fisher's LSD
 * @throws {StatsInputError} "length-mismatch"; "non-finite" in y; "bad-argument" for a missing label or
 *   alpha outside (0, 1); "constant-values" when there is only one treatment or every y is equal;
 *   "too-few-points" when no treatment is replicated (no within-treatment df)
 * @example
 * oneWayAnova({ treatment: [0, 0, 60, 60], y: [5100, 5300, 6800, 7000] }).F // 144.5
 */
export function oneWayAnova(input: OneWayAnovaInput): OneWayAnovaResult {
  const { treatment, y } = input;
  const alpha = input.alpha ?? 0.05;
  assertSameLength(treatment, y, ['oneWayAnova: treatment', 'y']);
  assertFinite(y, 'oneWayAnova: y');
  assertLevel(alpha, 'oneWayAnova: alpha');
  const { levels, index, counts } = factorLevels(treatment, 'oneWayAnova: treatment');
  const n = y.length;
  const k = levels.length;
  if (k < 2) {
    throw new StatsInputError(
      'constant-values',
      `oneWayAnova: treatment: all ${n} plots have the treatment "${levels[0] ?? ''}"; an ANOVA needs at least two treatments.`,
    );
  }
  if (n - k < 1) {
    throw new StatsInputError(
      'too-few-points',
      `oneWayAnova: ${n} plots in ${k} treatments leave no within-treatment degrees of freedom; at least one treatment needs two plots.`,
    );
  }

  const shift = y[0];
  const sums = new Float64Array(k);
  for (let i = 0; i < n; i++) sums[index[i]] += y[i] - shift;
  const means = Array.from(sums, (s, g) => s / counts[g]);
  // Second pass: deviations from the group means, with the correction term per group.
  const devSum = new Float64Array(k);
  let ssWithin = 0;
  for (let i = 0; i < n; i++) {
    const d = y[i] - shift - means[index[i]];
    ssWithin += d * d;
    devSum[index[i]] += d;
  }
  for (let g = 0; g < k; g++) ssWithin -= (devSum[g] * devSum[g]) / counts[g];
  ssWithin = Math.max(ssWithin, 0);
  let grand = 0;
  for (let g = 0; g < k; g++) grand += counts[g] * means[g];
  grand /= n;
  let ssBetween = 0;
  for (let g = 0; g < k; g++) ssBetween += counts[g] * (means[g] - grand) ** 2;
  if (ssBetween === 0 && ssWithin === 0) {
    throw new StatsInputError(
      'constant-values',
      `oneWayAnova: y: all ${n} values equal ${String(y[0])}; there is no variation to analyze.`,
    );
  }

  const dfBetween = k - 1;
  const dfWithin = n - k;
  const msBetween = ssBetween / dfBetween;
  const msWithin = ssWithin / dfWithin;
  const F = msWithin > 0 ? msBetween / msWithin : Infinity;
  const ssTotal = ssBetween + ssWithin;
  const grandMean = shift + grand;
  const residualSd = Math.sqrt(msWithin);
  const treatments: TreatmentMean[] = levels.map((level, g) => ({
    level,
    n: counts[g],
    mean: shift + means[g],
    rawMean: shift + means[g],
    se: Math.sqrt(msWithin / counts[g]),
  }));
  const lsd = fisherLsd({
    levels,
    // The shifted means: their differences keep digits the shifted-back means would round away.
    means,
    seDifference: (a, b) => Math.sqrt(msWithin * (1 / counts[a] + 1 / counts[b])),
    dfError: dfWithin,
    alpha,
  });
  const balanced = counts.every((c) => c === counts[0]);
  return {
    n,
    treatments,
    treatmentMeans: treatments,
    notes: balanced
      ? []
      : [
          `Unequal replication (${Math.min(...counts)} to ${Math.max(...counts)} plots per treatment): each mean has its own standard error and each pair its own LSD.`,
        ],
    between: { df: dfBetween, ss: ssBetween, ms: msBetween },
    within: { df: dfWithin, ss: ssWithin, ms: msWithin },
    total: { df: n - 1, ss: ssTotal, ms: ssTotal / (n - 1) },
    F,
    p: fisherFUpperP(F, dfBetween, dfWithin),
    r2: ssBetween / ssTotal,
    residualSd,
    grandMean,
    cvPercent: grandMean === 0 ? null : (100 * residualSd) / grandMean,
    balanced,
    lsd,
  };
}
