// The workspace's one undo history: a column role, a plot excluded and a price changed are
// steps of the same list, undone newest first whichever part of the work they touched.
import { UndoStack } from '../lib/undoStack';

/** A step as two ways to put the work: as it was before, and as it is after. */
interface Restore {
  before: () => void;
  after: () => void;
}

export class History {
  undoLabel = $state<string | null>(null);
  redoLabel = $state<string | null>(null);
  readonly #stack = new UndoStack<() => void>();

  /**
   * Records a step that has just been made.
   * @param label - what it did, for the Undo button ("Product price")
   * @param restore - how to put the work as it was before, and as it is after
   * @param continues - fold into the last step when it has the same label (typing, dragging)
   */
  record(label: string, restore: Restore, continues = false): void {
    if (!(continues && this.#stack.amend(label, restore.after)))
      this.#stack.record(label, restore.before, restore.after);
    this.#labels();
  }

  undo(): void {
    this.#stack.undo()?.();
    this.#labels();
  }

  redo(): void {
    this.#stack.redo()?.();
    this.#labels();
  }

  /** Forgets every step (a restored session, a new project). */
  clear(): void {
    this.#stack.clear();
    this.#labels();
  }

  #labels(): void {
    this.undoLabel = this.#stack.undoLabel;
    this.redoLabel = this.#stack.redoLabel;
  }
}
