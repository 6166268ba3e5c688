/**
 * A plot's original cell as a reference to show: the one place an OriginalCell (kept flat, with
 * its column as a number) becomes the {@link CellRef} that findings, sheets and screens name.
 */
import { cellAddress, cellRef } from './cellAddress';
import type { CellRef, OriginalCell } from './plotTable';

/**
 * The reference of a plot's original cell.
 * @param o - the cell
 * @returns its file, sheet, A1 address and row
 * @example
 * originalRef({ text: '182', file: 't.csv', sheet: '', row: 4, col: 5 })
 * // { file: 't.csv', sheet: '', cell: 'E4', row: 4 }
 */
export function originalRef(o: OriginalCell): CellRef {
  return cellRef(o.file, o.sheet, o.row, o.col);
}

/**
 * The A1 address of a plot's original cell.
 * @param o - the cell
 * @returns e.g. "E4"
 */
export function originalAddress(o: OriginalCell): string {
  return cellAddress(o.row, o.col);
}
