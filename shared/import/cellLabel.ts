/**
 * A cell read as a label (site, block, plot, treatment) or as plain text (product, notes,
 * group values). A number cell is a label too: plot 101 is the label "101".
 */
import { isMissingMarker } from '../table/parseNumberText';
import type { RawCell } from './rawWorkbook';

/**
 * The cell's text, trimmed; empty for no cell.
 * @param cell - the cell, or null/undefined when the row is short
 * @returns the trimmed text
 * @example
 * cellText({ text: ' urea ', … }) // 'urea'
 */
export function cellText(cell: RawCell | null | undefined): string {
  return cell ? cell.text.trim() : '';
}

/**
 * The cell as a label, or null when it is empty or a missing-value marker ("NA", "-", …).
 * @param cell - the cell, or null/undefined when the row is short
 * @returns the label, numbers written as JavaScript writes them
 * @example
 * cellLabel({ kind: 'number', value: 101, … }) // '101'
 */
export function cellLabel(cell: RawCell | null | undefined): string | null {
  if (!cell) return null;
  if (cell.kind === 'number' && typeof cell.value === 'number') return String(cell.value);
  const t = cell.text.trim();
  return t === '' || isMissingMarker(t) ? null : t;
}
