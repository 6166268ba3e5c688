/**
 * The number in a cell, and how it got there: a real number, a number stored
 * as text, a missing-value marker, text that is no number, or a formula saved
 * without its result. Import keeps the status so checks can explain it.
 */
import { isMissingMarker, parseNumberText } from '../table/parseNumberText';
import type { RawCell } from './rawWorkbook';

export type CellNumberStatus =
  'number' | 'number-as-text' | 'missing' | 'not-a-number' | 'formula-without-result';

/**
 * Reads a cell as a number.
 * @param cell - the cell, or null for an empty one
 * @param decimalComma - the sheet writes decimals with a comma
 * @returns the value (null unless a number was found) and its status
 * @example
 * cellNumber({ address: 'D7', text: '187.4', value: '187.4', kind: 'text' }, false)
 * // { value: 187.4, status: 'number-as-text' }
 */
export function cellNumber(
  cell: RawCell | null | undefined,
  decimalComma: boolean,
): { value: number | null; status: CellNumberStatus } {
  if (!cell) return { value: null, status: 'missing' };
  if (cell.formulaMissingResult) return { value: null, status: 'formula-without-result' };
  if (cell.kind === 'number' && typeof cell.value === 'number' && Number.isFinite(cell.value)) {
    return { value: cell.value, status: 'number' };
  }
  if (cell.kind === 'blank') return { value: null, status: 'missing' };
  if (cell.kind === 'text') {
    if (isMissingMarker(cell.text)) return { value: null, status: 'missing' };
    const v = parseNumberText(cell.text, decimalComma);
    if (v !== null && Number.isFinite(v)) return { value: v, status: 'number-as-text' };
  }
  return { value: null, status: 'not-a-number' };
}
