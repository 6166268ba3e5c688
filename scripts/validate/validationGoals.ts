// The goals the analysis' decisions are held to in simulation, and whether each is met.
// The goals are the project's own targets for a recommendation tool (no outside document):
// a nominal 90 % interval should cover about 90 % of the time, a rate should not be biased by
// more than a small fraction of a rate step (40 kg/ha), the edge cases should rarely be given
// a rate they do not need, and a 5 % test should reject a true null about 5 % of the time.
import type { TruthName } from '../../shared/demo/simulatedSite';
import type { GainNullFigures, RegionFigures, TruthFigures } from './decisionFigures';

/** The truths whose optimum lies inside the tested rates: the interval's coverage is judged on these. */
export const CURVED_TRUTHS: readonly TruthName[] = [
  'linear-plateau',
  'quadratic-plateau',
  'exponential',
];

export const GOALS = {
  coverage: { low: 0.87, high: 0.93 },
  biasKgHa: 5,
  flatAboveZero: 0.05,
  fullResponseAboveSecondLowest: 0.05,
  gainTestTypeI: { low: 0.04, high: 0.06 },
  bendTestTypeI: { low: 0.04, high: 0.06 },
  regionalBiasKgHa: 5,
  /** Two levels with one true response declared different at the test's 5 % level, ± 1.5 %. */
  levelTypeI: { low: 0.035, high: 0.065 },
  /** A real 20 kg N/ha difference in the optimum found by the level test in 4-block trials. */
  levelPower: 0.8,
} as const;

export interface GoalCheck {
  /** What is measured, e.g. "coverage of the 90 % interval". */
  figure: string;
  /** The truth it is measured on, or "regions". */
  on: string;
  value: number;
  /** The goal in words, e.g. "0.87–0.93". */
  goal: string;
  met: boolean;
}

/**
 * Every goal beside its measured figure.
 * @param truths - the figures of each truth
 * @param gainNulls - the gain-over-check tests on the truths whose nulls hold (STRAIGHT_GAIN_TRUTHS:
 *   the gains lie on a straight line through the origin; on the curved truths the gains bend, so
 *   rejecting there is not an error)
 * @param regions - the regional figures
 * @returns one check per goal and truth
 * @example
 * validationGoals(truths, gainNulls, regions).filter((g) => !g.met).map((g) => g.figure)
 */
export function validationGoals(
  truths: readonly TruthFigures[],
  gainNulls: readonly GainNullFigures[],
  regions: RegionFigures,
): GoalCheck[] {
  const checks: GoalCheck[] = [];
  const by = (t: TruthName) => truths.find((f) => f.truth === t);
  for (const t of CURVED_TRUTHS) {
    const f = by(t);
    if (!f) continue;
    const c = f.coverage.share;
    checks.push({
      figure: `coverage of the ${Math.round(f.intervalLevel * 100)} % interval`,
      on: t,
      value: c,
      goal: `${GOALS.coverage.low}–${GOALS.coverage.high}`,
      met: c >= GOALS.coverage.low && c <= GOALS.coverage.high,
    });
  }
  // The join's profile interval is judged where the truth is that model's own curve and its
  // join lies well inside the rates (130 kg/ha, between the tested 120 and 160).
  const lp = by('linear-plateau')?.join;
  if (lp) {
    checks.push({
      figure: `coverage of the join's ${Math.round(by('linear-plateau')!.intervalLevel * 100)} % profile interval`,
      on: 'linear-plateau',
      value: lp.coverage.share,
      goal: `${GOALS.coverage.low}–${GOALS.coverage.high}`,
      met: lp.coverage.share >= GOALS.coverage.low && lp.coverage.share <= GOALS.coverage.high,
    });
  }
  // A full response is answered with a range, (0, second-lowest rate], not one rate: its
  // figures are the share placed above that range and whether the interval holds the truth.
  for (const f of truths) {
    if (f.truth === 'full-response') continue;
    checks.push({
      figure: 'mean bias of the recommended rate, kg/ha',
      on: f.truth,
      value: f.rate.meanBiasKgHa,
      goal: `|bias| < ${GOALS.biasKgHa}`,
      met: Math.abs(f.rate.meanBiasKgHa) < GOALS.biasKgHa,
    });
  }
  const flat = by('flat');
  if (flat) {
    checks.push({
      figure: 'share given a rate above 0',
      on: 'flat',
      value: flat.aboveZero.share,
      goal: `≤ ${GOALS.flatAboveZero}`,
      met: flat.aboveZero.share <= GOALS.flatAboveZero,
    });
  }
  const full = by('full-response');
  if (full) {
    checks.push({
      figure: 'share recommended above the second-lowest rate',
      on: 'full-response',
      value: full.aboveSecondLowest.share,
      goal: `≤ ${GOALS.fullResponseAboveSecondLowest}`,
      met: full.aboveSecondLowest.share <= GOALS.fullResponseAboveSecondLowest,
    });
    checks.push({
      figure: `the ${Math.round(full.intervalLevel * 100)} % interval holds the true optimum`,
      on: 'full-response',
      value: full.coverage.share,
      goal: `≥ ${GOALS.coverage.low}`,
      met: full.coverage.share >= GOALS.coverage.low,
    });
  }
  for (const f of gainNulls) {
    for (const [figure, r, goal] of [
      [
        'gain at rate zero (gain-over-check): Type I error at 5 %',
        f.gainAtZeroFound.share,
        GOALS.gainTestTypeI,
      ],
      [
        'bend of the gains (gain-over-check): Type I error at 5 %',
        f.gainsBend.share,
        GOALS.bendTestTypeI,
      ],
    ] as const) {
      checks.push({
        figure,
        on: f.truth,
        value: r,
        goal: `${goal.low}–${goal.high}`,
        met: r >= goal.low && r <= goal.high,
      });
    }
  }
  checks.push({
    figure: 'mean bias of the regional rate, kg/ha',
    on: 'regions',
    value: regions.meanBiasKgHa,
    goal: `|bias| < ${GOALS.regionalBiasKgHa}`,
    met: Math.abs(regions.meanBiasKgHa) < GOALS.regionalBiasKgHa,
  });
  checks.push({
    figure: "coverage of the regional rate's 90 % site-year interval (population optimum)",
    on: 'regions',
    value: regions.intervalCoverage,
    goal: `${GOALS.coverage.low}–${GOALS.coverage.high}`,
    met:
      regions.intervalCoverage >= GOALS.coverage.low &&
      regions.intervalCoverage <= GOALS.coverage.high,
  });
  return checks;
}
