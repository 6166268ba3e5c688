/**
 * Undo and redo for the user's edits (exclusions, column mapping changes).
 * Snapshot-based: each step stores the edits as they were before it, so an
 * undo can never drift out of step with what the table shows. Edits are small
 * (a mapping and a list of exclusions), so snapshots cost little.
 */

/** One remembered step: the state before it and a label for the Undo button. */
interface Step<T> {
  before: T;
  after: T;
  label: string;
}

export class UndoStack<T> {
  #past: Step<T>[] = [];
  #future: Step<T>[] = [];
  readonly #limit: number;

  /**
   * @param limit - how many steps to keep (oldest dropped first); 200 unless told
   * @throws {RangeError} when the limit is not a positive whole number
   */
  constructor(limit = 200) {
    if (!Number.isInteger(limit) || limit < 1) {
      throw new RangeError(`UndoStack limit must be a positive whole number; got ${limit}.`);
    }
    this.#limit = limit;
  }

  /**
   * Records a step. Clears anything that could have been redone.
   * @param label - what the step did, e.g. "Exclude plot 104"
   * @param before - the edits before the step
   * @param after - the edits after it
   */
  record(label: string, before: T, after: T): void {
    this.#past.push({ label, before, after });
    if (this.#past.length > this.#limit) this.#past.shift();
    this.#future = [];
  }

  /**
   * Folds a step into the last one when it continues it (same label, nothing undone since): a
   * price typed digit by digit or a slider dragged is one step, back to where it started.
   * @param label - the step's label
   * @param after - the state after it
   * @returns true when folded in; false when the caller should record a new step
   */
  amend(label: string, after: T): boolean {
    const last = this.#past.at(-1);
    if (!last || last.label !== label || this.#future.length > 0) return false;
    last.after = after;
    return true;
  }

  /**
   * Steps back.
   * @returns the edits to restore, or null when there is nothing to undo
   */
  undo(): T | null {
    const step = this.#past.pop();
    if (!step) return null;
    this.#future.push(step);
    return step.before;
  }

  /**
   * Steps forward again after an undo.
   * @returns the edits to restore, or null when there is nothing to redo
   */
  redo(): T | null {
    const step = this.#future.pop();
    if (!step) return null;
    this.#past.push(step);
    return step.after;
  }

  /** Label of the step Undo would take back, or null. */
  get undoLabel(): string | null {
    return this.#past.at(-1)?.label ?? null;
  }

  /** Label of the step Redo would repeat, or null. */
  get redoLabel(): string | null {
    return this.#future.at(-1)?.label ?? null;
  }

  /** Forgets everything (a new project). */
  clear(): void {
    this.#past = [];
    this.#future = [];
  }
}
