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
  for (const f of truths) {
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
  return checks;
}
