/**
 * Turns a column of labels (treatment, block) into levels in order of first
 * appearance and a level index for every row, so an ANOVA can keep the order
 * the trial sheet used (a rate series reads 0, 40, 80, …, not sorted as text).
 */
import { StatsInputError } from './errors';

export interface FactorLevels {
  /** The distinct labels as text, in order of first appearance. */
  levels: string[];
  /** For each row, its level's position in `levels`. */
  index: Int32Array;
  /** Rows per level. */
  counts: number[];
}

/**
 * Levels of a factor column.
 * @param labels - one label per row: a non-empty string or a finite number
 * @param what - how to name the column in an error message, e.g. "oneWayAnova: treatment"
 * @returns the levels, each row's level index and the count per level
 * @throws {StatsInputError} "bad-argument" for an empty, missing or non-finite label, naming the row (1-based)
 * @example
 * factorLevels(['N0', 'N60', 'N0'], 'treatment').levels // ['N0', 'N60']
 */
export function factorLevels(labels: ArrayLike<string | number>, what: string): FactorLevels {
  const position = new Map<string, number>();
  const levels: string[] = [];
  const counts: number[] = [];
  const index = new Int32Array(labels.length);
  for (let i = 0; i < labels.length; i++) {
    const label = labels[i];
    const ok =
      (typeof label === 'string' && label.trim() !== '') ||
      (typeof label === 'number' && Number.isFinite(label));
    if (!ok) {
      throw new StatsInputError(
        'bad-argument',
        `${what}: label ${i + 1} is ${JSON.stringify(label) ?? String(label)}; every row needs a non-empty label.`,
      );
    }
    const key = String(label);
    let k = position.get(key);
    if (k === undefined) {
      k = levels.length;
      position.set(key, k);
      levels.push(key);
      counts.push(0);
    }
    index[i] = k;
    counts[k]++;
  }
  return { levels, index, counts };
}
