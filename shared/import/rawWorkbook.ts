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
