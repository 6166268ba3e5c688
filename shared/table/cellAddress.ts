/**
 * A1 addresses: the one reading and writing of "C7" for the whole engine, and the one making of
 * a cell's reference. Import names the cells it reads with them, and a plot's original cells
 * (originalCell.ts) keep their column as a number and spell the address only when a message or a
 * sheet shows it.
 */
import type { CellRef } from './plotTable';

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

/** Column letters already spelled (addresses are spelled for every plot a report lists). */
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

/**
 * Row and column of an A1 address.
 * @param address - e.g. "C7" (a "$" is allowed)
 * @returns 1-based row and column, or null when it is not an address
 * @example
 * parseAddress('AB12') // { row: 12, col: 28 }
 */
export function parseAddress(address: string): { row: number; col: number } | null {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d{1,7})$/.exec(address);
  if (!m) return null;
  let col = 0;
  for (const ch of m[1].toUpperCase()) col = col * 26 + (ch.charCodeAt(0) - 64);
  return { row: Number(m[2]), col };
}

/**
 * The reference of the cell at a row and column (whether or not the row has a cell there).
 * @param file - the source file's name
 * @param sheet - the sheet's name
 * @param row - 1-based row
 * @param col - 1-based column
 * @returns file, sheet, the A1 address of (row, col) and the row
 * @example
 * cellRef('trial.xlsx', 'Plots', 7, 3) // { file: 'trial.xlsx', sheet: 'Plots', cell: 'C7', row: 7 }
 */
export function cellRef(file: string, sheet: string, row: number, col: number): CellRef {
  return { file, sheet, cell: cellAddress(row, col), row };
}
