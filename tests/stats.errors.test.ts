// Bad input: every function in shared/stats throws StatsInputError with a code
// and a message that says what is wrong and where. Messages are checked exactly.
import { describe, expect, it } from 'vitest';
import { StatsInputError, type StatsErrorCode } from '../shared/stats/errors';
import { fitLeastSquares } from '../shared/stats/leastSquares';
import { testIntercept } from '../shared/stats/interceptTest';
import { pearsonCorrelation } from '../shared/stats/pearson';
import { spearmanCorrelation } from '../shared/stats/spearman';
import { describeSample } from '../shared/stats/describeSample';
import { sampleMean, sampleVariance } from '../shared/stats/variance';
import { sampleQuantile } from '../shared/stats/quantile';
import { oneWayAnova } from '../shared/stats/oneWayAnova';
import { randomizedBlockAnova } from '../shared/stats/randomizedBlockAnova';
import { fisherLsd } from '../shared/stats/fisherLsd';
import {
  fisherFUpperP,
  standardNormalQuantile,
  studentTQuantile,
} from '../shared/stats/distributions';

function expectStatsError(run: () => unknown, code: StatsErrorCode, message: string): void {
  let caught: unknown;
  try {
    run();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(StatsInputError);
  expect((caught as StatsInputError).code).toBe(code);
  expect((caught as StatsInputError).message).toBe(message);
}

const cases: Array<[string, () => unknown, StatsErrorCode, string]> = [
  // Fewer points than parameters
  [
    'testIntercept with 2 points',
    () => testIntercept([0, 60], [5000, 6000]),
    'too-few-points',
    'testIntercept: x and y: 2 values, but at least 3 are needed (the straight line needs 1 residual degree of freedom).',
  ],
  [
    'fitLeastSquares with as many points as coefficients',
    () => fitLeastSquares({ columns: [[0, 60]], y: [5000, 6000], intercept: true }),
    'too-few-points',
    '2 points cannot fit 2 coefficients with any residual degrees of freedom; at least 3 are needed.',
  ],
  [
    'pearsonCorrelation with 2 pairs',
    () => pearsonCorrelation([1, 2], [3, 4]),
    'too-few-points',
    'pearsonCorrelation: x and y: 2 values, but at least 3 are needed (the test on n − 2 degrees of freedom needs n ≥ 3).',
  ],
  [
    'describeSample with one value',
    () => describeSample([6200], 'yield'),
    'too-few-points',
    'describeSample: yield: 1 value, but at least 2 are needed (a spread needs n − 1 ≥ 1).',
  ],
  [
    'sampleMean of nothing',
    () => sampleMean([]),
    'too-few-points',
    'sampleMean: values: 0 values, but at least 1 is needed (a mean needs one value).',
  ],
  [
    'oneWayAnova with no replication',
    () => oneWayAnova({ treatment: [0, 60, 120], y: [5, 6, 7] }),
    'too-few-points',
    'oneWayAnova: 3 plots in 3 treatments leave no within-treatment degrees of freedom; at least one treatment needs two plots.',
  ],
  [
    'randomizedBlockAnova with one block',
    () => randomizedBlockAnova({ treatment: [0, 60], block: ['I', 'I'], y: [5, 6] }),
    'too-few-points',
    'randomizedBlockAnova: 2 treatments in 1 block; a block design needs at least 2 of each.',
  ],
  [
    'randomizedBlockAnova with no error df left',
    () => randomizedBlockAnova({ treatment: [0, 60, 0], block: ['I', 'I', 'II'], y: [5, 6, 5.5] }),
    'too-few-points',
    'randomizedBlockAnova: 3 plots for 2 treatments in 2 blocks leave no error degrees of freedom.',
  ],
  // All x equal
  [
    'testIntercept with every x equal',
    () => testIntercept([80, 80, 80, 80], [6000, 6100, 5900, 6050]),
    'constant-values',
    'testIntercept: x: all 4 values equal 80; a slope needs at least two different x values.',
  ],
  [
    'fitLeastSquares with a constant regressor',
    () => fitLeastSquares({ columns: [[80, 80, 80]], y: [1, 2, 3], intercept: true }),
    'rank-deficient',
    'All x values are equal, so no slope can be estimated.',
  ],
  [
    'pearsonCorrelation with constant y',
    () => pearsonCorrelation([0, 60, 120], [7, 7, 7]),
    'constant-values',
    'pearsonCorrelation: y: all 3 values equal 7; a correlation needs y to vary.',
  ],
  [
    'oneWayAnova with a single treatment',
    () => oneWayAnova({ treatment: ['N0', 'N0', 'N0'], y: [5, 6, 7] }),
    'constant-values',
    'oneWayAnova: treatment: all 3 plots have the treatment "N0"; an ANOVA needs at least two treatments.',
  ],
  [
    'oneWayAnova with every y equal',
    () => oneWayAnova({ treatment: [0, 0, 60, 60], y: [5, 5, 5, 5] }),
    'constant-values',
    'oneWayAnova: y: all 4 values equal 5; there is no variation to analyze.',
  ],
  [
    'randomizedBlockAnova with every y equal',
    () => randomizedBlockAnova({ treatment: [0, 60, 0, 60], block: [1, 1, 2, 2], y: [5, 5, 5, 5] }),
    'constant-values',
    'randomizedBlockAnova: y: all 4 values equal 5; there is no variation to analyze.',
  ],
  // Non-finite values
  [
    'testIntercept with NaN in y',
    () => testIntercept([0, 60, 120], [5000, NaN, 7000]),
    'non-finite',
    'testIntercept: y: value 2 is NaN; every value must be a finite number.',
  ],
  [
    'spearmanCorrelation with Infinity in x',
    () => spearmanCorrelation([0, Infinity, 120], [1, 2, 3]),
    'non-finite',
    'spearmanCorrelation: x: value 2 is Infinity; every value must be a finite number.',
  ],
  [
    'sampleVariance with −Infinity',
    () => sampleVariance([1, 2, -Infinity], 'yield'),
    'non-finite',
    'sampleMean: yield: value 3 is -Infinity; every value must be a finite number.',
  ],
  [
    'randomizedBlockAnova with NaN yield',
    () =>
      randomizedBlockAnova({ treatment: [0, 60, 0, 60], block: [1, 1, 2, 2], y: [5, 6, NaN, 6] }),
    'non-finite',
    'randomizedBlockAnova: y: value 3 is NaN; every value must be a finite number.',
  ],
  // Mismatched lengths
  [
    'testIntercept with 3 x and 4 y',
    () => testIntercept([0, 60, 120], [5, 6, 7, 8]),
    'length-mismatch',
    'testIntercept: x has 3 values but y has 4; they must pair up one to one.',
  ],
  [
    'pearsonCorrelation with 4 x and 3 y',
    () => pearsonCorrelation([0, 60, 120, 180], [5, 6, 7]),
    'length-mismatch',
    'pearsonCorrelation: x has 4 values but y has 3; they must pair up one to one.',
  ],
  [
    'randomizedBlockAnova with a short block column',
    () => randomizedBlockAnova({ treatment: [0, 60, 0, 60], block: [1, 1, 2], y: [5, 6, 5, 6] }),
    'length-mismatch',
    'randomizedBlockAnova: block has 3 values but y has 4; they must pair up one to one.',
  ],
  [
    'fitLeastSquares with a short column',
    () =>
      fitLeastSquares({ columns: [[1, 2]], columnNames: ['rate'], y: [1, 2, 3], intercept: true }),
    'length-mismatch',
    'Column "rate" has 2 values but the response has 3.',
  ],
  // Other arguments
  [
    'testIntercept with alpha = 5 (a percent, not a fraction)',
    () => testIntercept([0, 60, 120], [5, 6, 7.5], 5),
    'bad-argument',
    'testIntercept: alpha is 5; it must lie strictly between 0 and 1.',
  ],
  [
    'sampleQuantile with p = 1.5',
    () => sampleQuantile([1, 2, 3], 1.5),
    'bad-argument',
    'sampleQuantile: p is 1.5; it must lie between 0 and 1.',
  ],
  [
    'oneWayAnova with an empty treatment label',
    () => oneWayAnova({ treatment: ['N0', '', 'N60', 'N60'], y: [5, 6, 7, 8] }),
    'bad-argument',
    'oneWayAnova: treatment: label 2 is ""; every row needs a non-empty label.',
  ],
  [
    'randomizedBlockAnova with two plots in one cell',
    () =>
      randomizedBlockAnova({
        treatment: [0, 60, 0, 60, 0],
        block: [1, 1, 2, 2, 2],
        y: [5, 6, 5, 6, 5.2],
      }),
    'bad-argument',
    'randomizedBlockAnova: treatment "0" appears twice in block "2" (rows 3 and 5); a complete block design has one plot per treatment in each block.',
  ],
  [
    'fisherLsd with no error df',
    () =>
      fisherLsd({
        levels: ['a', 'b'],
        means: [1, 2],
        seDifference: () => 1,
        dfError: 0,
        alpha: 0.05,
      }),
    'bad-argument',
    'fisherLsd: dfError is 0; comparisons need at least 1 error degree of freedom.',
  ],
  [
    'studentTQuantile with 0 degrees of freedom',
    () => studentTQuantile(0.975, 0),
    'bad-argument',
    'studentTQuantile: df is 0; degrees of freedom must be positive.',
  ],
  [
    'fisherFUpperP with NaN denominator df',
    () => fisherFUpperP(2, 3, NaN),
    'bad-argument',
    'fisherFUpperP: df2 is NaN; degrees of freedom must be positive.',
  ],
  [
    'standardNormalQuantile with p = 95 (a percent)',
    () => standardNormalQuantile(95),
    'bad-argument',
    'standardNormalQuantile: p is 95; a probability lies between 0 and 1.',
  ],
];

describe('bad input throws StatsInputError with an exact message', () => {
  it.each(cases)('%s', (_, run, code, message) => expectStatsError(run, code, message));
});

describe('randomizedBlockAnova on a disconnected design', () => {
  it('says the missing plots separate treatments from blocks', () => {
    // T2 and T3 share no block with T0 and T1: blocks I–II hold T0/T1, III–IV hold T2/T3.
    expectStatsError(
      () =>
        randomizedBlockAnova({
          treatment: ['T0', 'T1', 'T0', 'T1', 'T2', 'T3', 'T2', 'T3'],
          block: ['I', 'I', 'II', 'II', 'III', 'III', 'IV', 'IV'],
          y: [5, 6, 5.2, 6.1, 7, 8, 7.3, 8.2],
        }),
      'rank-deficient',
      'randomizedBlockAnova: the missing plots leave some treatments with no block in common with the others, so their effects cannot be separated from block effects.',
    );
  });
});
