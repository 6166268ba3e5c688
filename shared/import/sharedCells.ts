/**
 * The cells of a text file, one object per distinct text. A cell is a value (its place is its
 * row and column), so every "0" of a rate column can be one object; trial files repeat a few
 * hundred texts (rates, blocks, sites, years), and the table stays bounded when a file does not:
 * past MAX_SHARED_CELLS distinct texts, new ones get a cell each and are not remembered.
 *
 * A field of the file is looked up by its place in the text (`slice`-free: the hash is taken
 * while the reader scans the field, and a candidate is compared in place with `startsWith`), so
 * a repeated text costs no string at all.
 */
import { parseNumberText } from '../table/parseNumberText';
import type { RawCell } from './rawWorkbook';

/** How many distinct texts are shared at most. */
export const MAX_SHARED_CELLS = 65_536;

/**
 * One step of the hash of a field's text, character by character (31·h + c, in 32 bits), as
 * the reader computes it while scanning.
 * @param h - the hash so far (0 for an empty text)
 * @param c - the next UTF-16 code unit
 * @returns the hash with c
 * @example
 * hashStep(hashStep(0, 0x31), 0x32) // hash of "12": 1601
 */
export function hashStep(h: number, c: number): number {
  return (Math.imul(h, 31) + c) | 0;
}

/**
 * The first slot tried for a hash: its bits mixed (a multiply and shifts, as in MurmurHash3's
 * finalizer) so texts that differ only in their last characters ("71.2", "71.3") spread out.
 */
function slotOf(h: number, mask: number): number {
  const m = Math.imul(h ^ (h >>> 16), 0x45d9f3b);
  return (m ^ (m >>> 16)) & mask;
}

/** Whether `text` holds `known` from `start` on, compared in place. */
function holdsAt(text: string, start: number, known: string): boolean {
  for (let i = 0; i < known.length; i++)
    if (text.charCodeAt(start + i) !== known.charCodeAt(i)) return false;
  return true;
}

/** The hash of a whole text, as {@link hashStep} builds it. */
function hashOf(s: string): number {
  let h = 0;
  for (let i = 0; i < s.length; i++) h = hashStep(h, s.charCodeAt(i));
  return h;
}

/** Cells by text: open addressing over typed arrays, grown at half full. */
export class SharedCells {
  private slots = new Int32Array(1024);
  private hashes = new Int32Array(512);
  private readonly cells: RawCell[] = [];

  /** @param decimalComma - the file writes decimals with a comma ("12,5" is 12.5) */
  constructor(private readonly decimalComma: boolean) {}

  /**
   * The cell of the field `text[start, end)`, whose hash is `h`.
   * @param text - the file's text
   * @param start - the field's first character
   * @param end - one past its last character (end > start)
   * @param h - its hash ({@link hashStep} over the field)
   * @returns the shared cell, a number cell when the text is a number
   */
  inText(text: string, start: number, end: number, h: number): RawCell {
    const mask = this.slots.length - 1;
    const length = end - start;
    for (let s = slotOf(h, mask); ; s = (s + 1) & mask) {
      const k = this.slots[s];
      if (k === 0) return this.add(s, h, text.slice(start, end));
      const known = this.cells[k - 1];
      if (
        this.hashes[k - 1] === h &&
        known.text.length === length &&
        holdsAt(text, start, known.text)
      )
        return known;
    }
  }

  /**
   * The cell of a field already made a string (a quoted field, or the plain reading).
   * @param f - the field's text, not empty
   * @returns the shared cell
   * @example
   * new SharedCells(false).of('12.5').value // 12.5
   */
  of(f: string): RawCell {
    const h = hashOf(f);
    const mask = this.slots.length - 1;
    for (let s = slotOf(h, mask); ; s = (s + 1) & mask) {
      const k = this.slots[s];
      if (k === 0) return this.add(s, h, f);
      const known = this.cells[k - 1];
      if (this.hashes[k - 1] === h && known.text === f) return known;
    }
  }

  /** A new cell for `f`, remembered in free slot `s` while fewer than MAX_SHARED_CELLS are. */
  private add(s: number, h: number, f: string): RawCell {
    const num = parseNumberText(f, this.decimalComma);
    const cell: RawCell =
      num === null ? { text: f, value: f, kind: 'text' } : { text: f, value: num, kind: 'number' };
    const count = this.cells.length;
    if (count >= MAX_SHARED_CELLS) return cell;
    if (count >= this.hashes.length) {
      const hashes = new Int32Array(this.hashes.length * 2);
      hashes.set(this.hashes);
      this.hashes = hashes;
    }
    this.cells.push(cell);
    this.hashes[count] = h;
    this.slots[s] = count + 1;
    if (2 * (count + 1) > this.slots.length) this.grow();
    return cell;
  }

  /** Doubles the slots and places every remembered cell again. */
  private grow(): void {
    const slots = new Int32Array(this.slots.length * 2);
    const mask = slots.length - 1;
    for (let k = 0; k < this.cells.length; k++) {
      let s = slotOf(this.hashes[k], mask);
      while (slots[s] !== 0) s = (s + 1) & mask;
      slots[s] = k + 1;
    }
    this.slots = slots;
  }
}
