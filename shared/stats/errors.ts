/**
 * The one error type the statistics core throws for a caller's mistake: too few
 * points, a constant regressor, a non-finite value. A data problem that the
 * screen should explain (singular design, no interior optimum) is a typed result
 * instead, never an exception.
 */
export type StatsErrorCode =
  | 'too-few-points'
  | 'non-finite'
  | 'length-mismatch'
  | 'constant-values'
  | 'rank-deficient'
  | 'bad-argument';

export class StatsInputError extends Error {
  readonly code: StatsErrorCode;

  constructor(code: StatsErrorCode, message: string) {
    super(message);
    this.name = 'StatsInputError';
    this.code = code;
  }
}

/**
 * Throws a StatsInputError unless every value is a finite number.
 * @param values - the numbers to check
 * @param what - how to name them in the message, e.g. "yield"
 * @throws {StatsInputError} code "non-finite", naming the first bad position (1-based)
 */
export function assertFinite(values: ArrayLike<number>, what: string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) {
      throw new StatsInputError(
        'non-finite',
        `${what}: value ${i + 1} is ${String(values[i])}; every value must be a finite number.`,
      );
    }
  }
}

/**
 * Throws a StatsInputError unless two paired arrays have the same length.
 * @param a - the first array, e.g. rates
 * @param b - the second array, e.g. yields
 * @param names - how to name the two in the message, e.g. ["x", "y"]
 * @throws {StatsInputError} code "length-mismatch", giving both lengths
 * @example
 * assertSameLength([1, 2], [3], ['x', 'y']) // throws "x has 2 values but y has 1; they must pair up one to one."
 */
export function assertSameLength(
  a: ArrayLike<unknown>,
  b: ArrayLike<unknown>,
  names: readonly [string, string],
): void {
  if (a.length !== b.length) {
    throw new StatsInputError(
      'length-mismatch',
      `${names[0]} has ${a.length} values but ${names[1]} has ${b.length}; they must pair up one to one.`,
    );
  }
}

/**
 * Throws a StatsInputError when there are fewer values than a method needs.
 * @param count - how many values there are
 * @param needed - the least number the method can work with
 * @param what - the method and its argument, e.g. "pearsonCorrelation: x and y"
 * @param why - what the minimum buys, e.g. "a correlation test needs 1 residual degree of freedom"
 * @throws {StatsInputError} code "too-few-points"
 * @example
 * assertAtLeast(2, 3, 'pearsonCorrelation: x and y', 'the t-test needs n − 2 ≥ 1')
 * // throws "pearsonCorrelation: x and y: 2 values, but at least 3 are needed (the t-test needs n − 2 ≥ 1)."
 */
export function assertAtLeast(count: number, needed: number, what: string, why: string): void {
  if (count < needed) {
    throw new StatsInputError(
      'too-few-points',
      `${what}: ${count} value${count === 1 ? '' : 's'}, but at least ${needed} ${needed === 1 ? 'is' : 'are'} needed (${why}).`,
    );
  }
}

/**
 * Throws a StatsInputError when every value is the same, so nothing varies to
 * correlate or regress on.
 * @param values - the numbers to check (finite)
 * @param what - how to name them, e.g. "x (rate)"
 * @param why - what needs the spread, e.g. "a slope needs at least two different x values"
 * @throws {StatsInputError} code "constant-values", giving the repeated value
 * @example
 * assertNotConstant([5, 5, 5], 'x', 'a slope needs at least two different x values')
 * // throws "x: all 3 values equal 5; a slope needs at least two different x values."
 */
export function assertNotConstant(values: ArrayLike<number>, what: string, why: string): void {
  for (let i = 1; i < values.length; i++) if (values[i] !== values[0]) return;
  throw new StatsInputError(
    'constant-values',
    `${what}: all ${values.length} values equal ${String(values[0])}; ${why}.`,
  );
}

/**
 * Throws a StatsInputError unless a significance or confidence level lies strictly between 0 and 1.
 * @param level - the level to check, e.g. alpha = 0.05 or confidence = 0.95
 * @param what - the function and argument, e.g. "oneWayAnova: alpha"
 * @throws {StatsInputError} code "bad-argument"
 * @example
 * assertLevel(1.5, 'testIntercept: alpha') // throws "testIntercept: alpha is 1.5; it must lie strictly between 0 and 1."
 */
export function assertLevel(level: number, what: string): void {
  if (!(level > 0 && level < 1)) {
    throw new StatsInputError(
      'bad-argument',
      `${what} is ${String(level)}; it must lie strictly between 0 and 1.`,
    );
  }
}
