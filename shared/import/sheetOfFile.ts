/**
 * Where a sheet is, as every import message names it: 'Sheet "Plots" of "trial.xlsx"', or just
 * '"trial.csv"' for a CSV or TSV file, which has no sheets (never 'Sheet "" of …').
 * @param file - the file name as the user chose it
 * @param sheet - the sheet name; "" for a CSV/TSV file
 * @returns the place, starting with a capital when it names a sheet
 * @example sheetOfFile('trial.csv', '') // '"trial.csv"'
 */
export function sheetOfFile(file: string, sheet: string): string {
  return sheet ? `Sheet "${sheet}" of "${file}"` : `"${file}"`;
}
