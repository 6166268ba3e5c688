import { describe, expect, it } from 'vitest';
import { UndoStack } from '../renderer/src/lib/undoStack';

describe('UndoStack', () => {
  it('undo returns the state before each step, newest first, and redo replays them', () => {
    const stack = new UndoStack<string[]>();
    stack.record('Exclude 101', [], ['101']);
    stack.record('Exclude 205', ['101'], ['101', '205']);
    expect(stack.undoLabel).toBe('Exclude 205');
    expect(stack.undo()).toEqual(['101']);
    expect(stack.undo()).toEqual([]);
    expect(stack.undo()).toBeNull();
    expect(stack.redoLabel).toBe('Exclude 101');
    expect(stack.redo()).toEqual(['101']);
    expect(stack.redo()).toEqual(['101', '205']);
    expect(stack.redo()).toBeNull();
  });

  it('a new step after an undo drops what could have been redone', () => {
    const stack = new UndoStack<number>();
    stack.record('a', 0, 1);
    stack.record('b', 1, 2);
    stack.undo();
    stack.record('c', 1, 3);
    expect(stack.redo()).toBeNull();
    expect(stack.undo()).toBe(1);
    expect(stack.undo()).toBe(0);
  });

  it('keeps at most its limit of steps, dropping the oldest', () => {
    const stack = new UndoStack<number>(2);
    stack.record('1', 0, 1);
    stack.record('2', 1, 2);
    stack.record('3', 2, 3);
    expect(stack.undo()).toBe(2);
    expect(stack.undo()).toBe(1);
    expect(stack.undo()).toBeNull();
  });

  it('refuses a limit that is not a positive whole number', () => {
    expect(() => new UndoStack(0)).toThrow(
      'UndoStack limit must be a positive whole number; got 0.',
    );
  });

  it('amends the last step only when it has the same label and nothing was undone since', () => {
    const stack = new UndoStack<number>();
    stack.record('price', 0, 1);
    expect(stack.amend('price', 2)).toBe(true);
    expect(stack.amend('moisture', 3)).toBe(false);
    expect(stack.undo()).toBe(0);
    expect(stack.amend('price', 5)).toBe(false);
    expect(stack.redo()).toBe(2);
  });
});
