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
