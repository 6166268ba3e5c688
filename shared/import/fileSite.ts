/**
 * The site of a file's plots when nothing else names it: the file's name without its extension
 * ("North 40.xlsx" → "North 40"). Detection gives it to a file's one plots sheet without a site
 * column, and reading falls back on it for a sheet whose site was left blank.
 * @param fileName - the file name as the user chose it
 * @returns the name without its last extension
 * @example fileSite('North 40.xlsx') // 'North 40'
 */
export function fileSite(fileName: string): string {
  return fileName.replace(/\.[^.]+$/, '');
}
