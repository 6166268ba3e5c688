/**
 * Where a value of the plot table came from: file, sheet, A1 address and row, so every
 * finding and every original cell can point back to the spreadsheet.
 */
import { cellAddress } from '../table/cellAddress';
import type { CellRef } from '../table/plotTable';

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
