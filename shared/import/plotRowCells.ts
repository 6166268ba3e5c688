/**
 * The cells of one plot row as readPlotsSheet reads them: each mapped cell looked up, kept as
 * the plot's original cell (its text and reference) and read as a number, with the findings a
 * cell needs (a number stored as text in a workbook, a formula saved without its result).
 *
 * One reader serves every row of a sheet (`start` moves it to the next row): a 24,000-row sheet
 * then costs no per-row closures, only the values each plot keeps.
 */
import { cellAddress, cellRef } from '../table/cellAddress';
import type { ColumnRole, OriginalCell } from '../table/plotTable';
import type { QualityFinding } from '../table/qualityFinding';
import { cellNumber } from './cellNumber';
import type { ColumnAssignment } from './columnMapping';
import type { RawCell, RawSheet, RawWorkbook } from './rawWorkbook';

/** The cells of the row being read; `start` moves the reader to a row. */
export class PlotRowCells {
  /** The row's 1-based number. */
  r = 0;
  /** The row's original cells, by role; a new object for each row (the plot keeps it). */
  original: Partial<Record<ColumnRole, OriginalCell>> = {};
  private row: readonly (RawCell | null)[] = [];
  private readonly file: string;
  private readonly sheetName: string;
  private readonly decimalComma: boolean;
  private readonly fromWorkbook: boolean;

  /**
   * @param raw - the workbook the sheet belongs to (its file name and format)
   * @param sheet - the sheet read
   * @param where - "file › sheet", to start a finding's message
   * @param findings - receives the findings about single cells
   */
  constructor(
    raw: RawWorkbook,
    sheet: RawSheet,
    private readonly where: string,
    private readonly findings: QualityFinding[],
  ) {
    this.file = raw.file.name;
    this.sheetName = sheet.name;
    this.decimalComma = sheet.decimalComma;
    this.fromWorkbook = raw.format === 'xlsx';
  }

  /**
   * Moves to a row.
   * @param row - its cells
   * @param r - its 1-based number
   */
  start(row: readonly (RawCell | null)[], r: number): void {
    this.row = row;
    this.r = r;
    this.original = {};
  }

  /**
   * The cell of a column in this row.
   * @param a - the column, or undefined when the role has none
   * @returns the cell, or null when it is empty or the column is not mapped
   */
  at(a: ColumnAssignment | undefined): RawCell | null {
    return a ? (this.row[a.col - 1] ?? null) : null;
  }

  /**
   * The cell of a role's column, kept as the plot's original cell: when it has a cell, and
   * always for the yield and the rate (an empty one is kept with its address, to be corrected).
   * @param role - the column's role
   * @param a - the column
   * @returns the cell, or null
   */
  keep(role: ColumnRole, a: ColumnAssignment | undefined): RawCell | null {
    const c = this.at(a);
    if (a && (c || role === 'yield' || role === 'rate'))
      this.original[role] = {
        text: c?.text ?? '',
        file: this.file,
        sheet: this.sheetName,
        row: this.r,
        col: a.col,
      };
    return c;
  }

  /**
   * The number in a role's column, its cell kept; a finding for a number stored as text in a
   * workbook or a formula without a result. An arrow property, so plotWeightYieldKgHa can take it.
   * @param role - the column's role
   * @param a - the column
   * @returns the number, or null when the column is not mapped or holds none
   */
  readonly num = (role: ColumnRole, a: ColumnAssignment | undefined): number | null => {
    const c = this.keep(role, a);
    if (!a) return null;
    // A number cell (the whole of a generated or exported sheet) needs no status: it is the value.
    if (c && c.kind === 'number' && !c.formulaMissingResult) {
      const v = c.value;
      if (typeof v === 'number' && Number.isFinite(v)) return v;
    }
    const n = cellNumber(c, this.decimalComma);
    if (n.status === 'number-as-text' && c && this.fromWorkbook) {
      this.findings.push({
        code: 'number-as-text',
        severity: 'info',
        message: `${this.where} ${cellAddress(this.r, a.col)} (${a.header}) holds a number stored as text ("${c.text}"); it was read as ${n.value}.`,
        refs: [cellRef(this.file, this.sheetName, this.r, a.col)],
      });
    } else if (n.status === 'formula-without-result' && c) {
      this.findings.push({
        code: 'formula-without-result',
        severity: 'warning',
        message: `${this.where} ${cellAddress(this.r, a.col)} (${a.header}) is a formula (=${c.formula}) saved without a calculated result, so it has no value here. Open the file, let it recalculate, save it, and import it again.`,
        refs: [cellRef(this.file, this.sheetName, this.r, a.col)],
      });
    }
    return n.value;
  };
}
