/**
 * A mistake in how the command was called (unknown option, missing value,
 * an --out path that is also an input): exit code 2 with one line.
 */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}
