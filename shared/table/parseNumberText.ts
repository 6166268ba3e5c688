/**
 * Reads a number written as text the way trial sheets write them: thousands
 * separators ("1,234.5" or "1.234,5"), decimal commas ("12,5"), a leading
 * plus, spaces. Returns null for anything else, so the caller can tell a
 * missing marker from text that is not a number.
 *
 * It sits beside the plot table, below the import (which reads cells with it) and the quality
 * checks (which re-read a plot's original cell text with it), so both read a number one way.
 */

const missingMarkers = new Set([
  '',
  '.',
  '-',
  '--',
  '—',
  'na',
  'n/a',
  '#n/a',
  '*',
  'missing',
  'nd',
  'none',
]);

/**
 * The longest marker: a longer text is no marker, so the many site and notes texts of a sheet
 * are not lower-cased only to be looked up (lower-casing never shortens a text).
 */
const LONGEST_MARKER = Math.max(...[...missingMarkers].map((m) => m.length));

/**
 * Whether a cell's text means "no value" (blank . - NA n/a * missing).
 * @param text - the cell text
 * @returns true for a missing-value marker
 * @example
 * isMissingMarker(' NA ') // true
 */
export function isMissingMarker(text: string): boolean {
  const t = text.trim();
  return t.length <= LONGEST_MARKER && missingMarkers.has(t.toLowerCase());
}

/**
 * Parses a number written as text.
 * @param text - the text, e.g. "1,234.5", "12,5", " 180 "
 * @param decimalComma - the file writes decimals with a comma, so "1,234" is 1.234
 * @returns the number, or null when the text is not a number
 * @example
 * parseNumberText('1,234.5', false) // 1234.5
 * parseNumberText('12,5', true) // 12.5
 */
export function parseNumberText(text: string, decimalComma: boolean): number | null {
  let t = text.trim().replace(/[\u00a0\u202f ]/g, '');
  if (t.startsWith('+')) t = t.slice(1);
  if (t === '') return null;
  if (/^-?\d+(\.\d+)?([eE][-+]?\d+)?$/.test(t) && !decimalComma) return Number(t);
  if (decimalComma) {
    if (/^-?\d{1,3}(\.\d{3})+(,\d+)?$/.test(t))
      return Number(t.replace(/\./g, '').replace(',', '.'));
    if (/^-?\d+(,\d+)?$/.test(t)) return Number(t.replace(',', '.'));
    // A dot decimal in a decimal-comma file is still unambiguous when not a thousands group.
    if (/^-?\d+\.\d+$/.test(t) && !/^-?\d{1,3}\.\d{3}$/.test(t)) return Number(t);
    return null;
  }
  if (/^-?\d{1,3}(,\d{3})+(\.\d+)?$/.test(t)) return Number(t.replace(/,/g, ''));
  // A lone comma with other than three digits after it can only be a decimal comma.
  if (/^-?\d+,\d{1,2}$/.test(t) || /^-?\d+,\d{4,}$/.test(t)) return Number(t.replace(',', '.'));
  if (/^-?\.\d+$/.test(t)) return Number(t);
  return null;
}
