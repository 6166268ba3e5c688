/**
 * Where a value of the plot table came from: file, sheet, A1 address and row, so every
 * finding and every original cell can point back to the spreadsheet.
 */
import type { CellRef } from '../table/plotTable';
import { cellAddress, type RawCell } from './rawWorkbook';

/**
 * The reference of one cell, or of its position when the row has no cell there.
 * @param file - the source file's name
 * @param sheet - the sheet's name
 * @param cell - the cell, or null when the row is short
 * @param row - 1-based row
 * @param col - 1-based column
 * @returns the cell's own address when it has one, else the address of (row, col)
 * @example
 * cellRef('trial.xlsx', 'Plots', null, 7, 3) // { file: 'trial.xlsx', sheet: 'Plots', cell: 'C7', row: 7 }
 */
export function cellRef(
  file: string,
  sheet: string,
  cell: RawCell | null,
  row: number,
  col: number,
): CellRef {
  return { file, sheet, cell: cell?.address ?? cellAddress(row, col), row };
}
