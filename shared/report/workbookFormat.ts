/**
 * The look every sheet of the report workbook shares: header style, number
 * formats by unit and magnitude, p-value format, sheet names Excel accepts,
 * column widths and page setup. Formats are Excel number formats so the cells
 * keep their full value (a reader can recompute) while showing sensible
 * precision.
 */
import type ExcelJS from 'exceljs';
import type { RateUnit } from '../units/convertRate';
import type { YieldUnit } from '../units/convertYield';

/**
 * p-values: the number is kept; below 0.001 it shows "< 0.001" (more digits
 * there are noise; common practice in trial reports).
 */
export const P_VALUE_FORMAT = '[<0.001]"< 0.001";0.000';

/** Percent with one decimal for CV (the value is already in %, not a fraction). */
export const PERCENT_VALUE_FORMAT = '0.0" %"';

/**
 * The headers of the optimum columns that the overview and each site's model
 * table share: the rate, its interval and the yield there.
 * @param rateUnitN - the rate unit written of nutrient, e.g. "lb N/ac"
 * @param yieldUnit - the display yield unit
 * @returns four headers, in column order
 * @example
 * optimumHeaders('kg N/ha', 't/ha')[0] // 'Optimum rate (kg N/ha)'
 */
export function optimumHeaders(rateUnitN: string, yieldUnit: YieldUnit): string[] {
  return [
    `Optimum rate (${rateUnitN})`,
    `Interval low (${rateUnitN})`,
    `Interval high (${rateUnitN})`,
    `Yield at optimum (${yieldUnit})`,
  ];
}

/**
 * Number format for a rate column.
 * @param unit - the display rate unit
 * @returns whole numbers for lb/ac and kg/ha (plot rates are set in whole units), 0.0 for g/m²
 */
export function rateFormat(unit: RateUnit): string {
  return unit === 'g/m2' ? '0.0' : '0';
}

/**
 * Number format for a yield column (decimals as formatQuantity uses them).
 * @param unit - the display yield unit
 * @returns an Excel number format
 */
export function yieldFormat(unit: YieldUnit): string {
  switch (unit) {
    case 't/ha':
      return '0.00';
    case 'bu/ac':
    case 'g/m2':
      return '0.0';
    default:
      return '#,##0';
  }
}

/**
 * Number format for a statistic whose size is not known in advance (SS, MS, F,
 * curve parameters): about four significant digits, scientific when tiny.
 * @param maxAbs - the largest absolute value the column holds
 * @returns an Excel number format
 * @example
 * magnitudeFormat(0.0021) // '0.000E+00'
 */
export function magnitudeFormat(maxAbs: number): string {
  if (!Number.isFinite(maxAbs) || maxAbs === 0) return '0.000';
  if (maxAbs >= 1000) return '#,##0';
  if (maxAbs >= 100) return '0.0';
  if (maxAbs >= 10) return '0.00';
  if (maxAbs >= 0.1) return '0.000';
  return '0.000E+00';
}

const forbidden = /[\\/?*[\]:]/g;

/**
 * A sheet name Excel accepts (≤ 31 characters, none of \ / ? * [ ] :, no straight apostrophe), unique in the workbook.
 * @param wanted - the name to use, e.g. a site name
 * @param taken - names already used (lower case compared, as Excel does); the result is added
 * @returns the cleaned, unique name
 * @example
 * sheetName('North/East [2025]', new Set()) // 'North-East (2025)'
 * sheetName("Orrin's Bend", new Set()) // 'Orrin’s Bend'
 */
export function sheetName(wanted: string, taken: Set<string>): string {
  let base = wanted
    .replace(/\[/g, '(')
    .replace(/]/g, ')')
    .replace(forbidden, '-')
    // exceljs writes print areas as 'Name'!A1 without doubling an apostrophe inside the
    // name, which makes the file unreadable; the typographic apostrophe looks the same.
    .replace(/'/g, '’')
    .trim();
  if (!base) base = 'Sheet';
  let name = base.slice(0, 31);
  for (let i = 2; taken.has(name.toLowerCase()); i++) {
    const suffix = ` (${i})`;
    name = base.slice(0, 31 - suffix.length) + suffix;
  }
  taken.add(name.toLowerCase());
  return name;
}

/** Header row look: bold on light grey with a bottom rule, wrapped. */
export function styleHeaderRow(row: ExcelJS.Row): void {
  row.eachCell((cell) => {
    cell.font = { bold: true };
    cell.fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: 'FFE8ECEF' } };
    cell.border = { bottom: { style: 'thin', color: { argb: 'FF7A8590' } } };
    cell.alignment = { wrapText: true, vertical: 'middle' };
  });
}

/** A section title inside a sheet. */
export function styleTitle(cell: ExcelJS.Cell, size = 12): void {
  cell.font = { bold: true, size };
}

/**
 * Writes a section title in column A and notes its row (fitColumns leaves title rows out
 * of the column widths).
 * @param ws - the worksheet
 * @param r - the 1-based row
 * @param text - the title
 * @param titles - the sheet's title rows, to which r is added
 * @example
 * titleRow(ws, 5, 'Source files', titles)
 */
export function titleRow(
  ws: ExcelJS.Worksheet,
  r: number,
  text: string,
  titles: Set<number>,
): void {
  ws.getCell(r, 1).value = text;
  styleTitle(ws.getCell(r, 1));
  titles.add(r);
}

/**
 * Writes a styled header row.
 * @param ws - the worksheet
 * @param r - the 1-based row
 * @param values - the column headers
 * @example
 * headerRow(ws, 6, ['File', 'Bytes', 'SHA-256'])
 */
export function headerRow(ws: ExcelJS.Worksheet, r: number, values: string[]): void {
  const row = ws.getRow(r);
  row.values = values;
  styleHeaderRow(row);
}

/**
 * A titled table's heading: the title row, then the header row.
 * @param ws - the worksheet
 * @param r - the title's 1-based row
 * @param text - the title
 * @param headers - the column headers
 * @param titles - the sheet's title rows
 * @returns the first row of the table's body
 * @example
 * r = tableHeading(ws, r, 'Source files', ['File', 'Bytes', 'SHA-256'], titles)
 */
export function tableHeading(
  ws: ExcelJS.Worksheet,
  r: number,
  text: string,
  headers: string[],
  titles: Set<number>,
): number {
  titleRow(ws, r, text, titles);
  headerRow(ws, r + 1, headers);
  return r + 2;
}

/**
 * Page setup for printing: fit to one page wide, landscape or portrait, paper by units.
 * @param sheet - the worksheet
 * @param paper - 'letter' (US units) or 'a4'
 * @param orientation - page orientation
 */
export function setupPage(
  sheet: ExcelJS.Worksheet,
  paper: 'letter' | 'a4',
  orientation: 'portrait' | 'landscape',
): void {
  // Excel paper codes (ECMA-376 Part 1, the pageSetup paperSize attribute): 1 = Letter, 9 = A4.
  sheet.pageSetup.paperSize = (paper === 'letter' ? 1 : 9) as never;
  sheet.pageSetup.orientation = orientation;
  sheet.pageSetup.fitToPage = true;
  sheet.pageSetup.fitToWidth = 1;
  sheet.pageSetup.fitToHeight = 0;
  sheet.pageSetup.margins = {
    left: 0.5,
    right: 0.5,
    top: 0.6,
    bottom: 0.6,
    header: 0.3,
    footer: 0.3,
  };
  sheet.headerFooter.oddFooter = '&L&8Plotrate&C&8&A&R&8Page &P of &N';
}

/**
 * Column widths from the longest text in each column, within bounds.
 * @param sheet - the worksheet
 * @param min - narrowest width, characters
 * @param max - widest width, characters
 * @param skipRows - rows not to measure (long titles and notes that span columns)
 */
export function fitColumns(
  sheet: ExcelJS.Worksheet,
  min = 8,
  max = 48,
  skipRows = new Set<number>(),
): void {
  const widths: number[] = [];
  sheet.eachRow((row, r) => {
    if (skipRows.has(r)) return;
    row.eachCell((cell, c) => {
      const v = cell.value;
      let len: number;
      if (typeof v === 'number') len = 10;
      else if (v instanceof Date) len = 18;
      else if (v && typeof v === 'object' && 'richText' in v)
        len = v.richText.map((t) => t.text).join('').length;
      else len = String(v ?? '').length;
      // Wrapped headers need only their longest word.
      if (cell.alignment?.wrapText)
        len =
          Math.max(
            ...String(v ?? '')
              .split(/\s+/)
              .map((w) => w.length),
            6,
          ) + 2;
      widths[c] = Math.max(widths[c] ?? 0, len);
    });
  });
  widths.forEach((w, c) => {
    if (w !== undefined) sheet.getColumn(c).width = Math.min(max, Math.max(min, w + 2));
  });
}
