/**
 * A workbook as read, before any meaning is given to it: sheets of cells with
 * A1 addresses, the text the user saw and the typed value. CSV files become a
 * workbook with one sheet named "".
 */
import type { SourceFile } from '../table/plotTable';

export type RawValue = number | string | boolean | Date | null;

/**
 * One cell. Its address is its place (`rows[r - 1][c - 1]` is at `cellAddress(r, c)`), not a
 * field: a file of millions of cells would otherwise hold millions of address strings, and a
 * cell being a value lets a reader share one object among equal cells.
 */
export interface RawCell {
  /** The text as shown in the sheet (or as written in the CSV). */
  text: string;
  /** Typed value; for a formula, its cached result (null when it has none). */
  value: RawValue;
  kind: 'number' | 'text' | 'date' | 'boolean' | 'error' | 'blank';
  /** The formula, when the cell holds one. */
  formula?: string;
  /** A formula cell saved without a cached result (never calculated). */
  formulaMissingResult?: boolean;
  /** For a cell inside a merged range: the address of the range's top-left cell. */
  mergedFrom?: string;
}

export interface RawSheet {
  /** Sheet name; "" for a CSV file. */
  name: string;
  /** Hidden or very hidden in Excel. */
  hidden: boolean;
  /** 1-based numbers of hidden rows. */
  hiddenRows: number[];
  /**
   * rows[r - 1][c - 1] is the cell at row r, column c; null where empty, or absent (a hole) in
   * a wide gap of a sparse row: read cells as `row[c - 1] ?? null`.
   */
  rows: (RawCell | null)[][];
  /** Whether numbers written as text here use a decimal comma ("12,5"). */
  decimalComma: boolean;
}

export interface RawWorkbook {
  file: SourceFile;
  format: 'xlsx' | 'csv';
  /** For a text file, the field separator found. */
  separator?: ',' | ';' | '\t';
  sheets: RawSheet[];
}

/**
 * The column letters of a 1-based column number.
 * @param col - column number, 1-based
 * @returns "A", "B", …, "Z", "AA", …
 * @example
 * columnLetters(28) // 'AB'
 */
export function columnLetters(col: number): string {
  let s = '';
  let n = col;
  while (n > 0) {
    const r = (n - 1) % 26;
    s = String.fromCharCode(65 + r) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** Column letters already spelled (every plot keeps the addresses of its cells). */
const LETTERS_KEPT = 1024;
const letters: string[] = [];

/**
 * The A1 address of a cell.
 * @param row - 1-based row
 * @param col - 1-based column
 * @returns e.g. "C7"
 * @example
 * cellAddress(7, 3) // 'C7'
 */
export function cellAddress(row: number, col: number): string {
  return `${col <= LETTERS_KEPT ? (letters[col] ??= columnLetters(col)) : columnLetters(col)}${row}`;
}
