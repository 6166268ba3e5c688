/**
 * A short fingerprint of a workbook's layout: the uses of its sheets and their
 * header texts, not the sheet names (next year's file has other sites) and not
 * the data. Two files with the same signature can share a saved mapping.
 */
import type { SheetMapping } from './columnMapping';
import { normalizeHeader } from './headerWords';

/**
 * Computes the shape signature (FNV-1a, 32 bit, over the sorted distinct sheet shapes).
 * @param sheets - the sheet mappings
 * @returns e.g. "shape-1a2b3c4d"
 * @example
 * shapeSignature(detectColumns(raw).sheets) // 'shape-5f0e9c21'
 */
export function shapeSignature(sheets: readonly Pick<SheetMapping, 'use' | 'columns'>[]): string {
  const shapes = [
    ...new Set(
      sheets
        .filter((s) => s.use !== 'ignore')
        .map((s) => `${s.use}:${s.columns.map((c) => normalizeHeader(c.header)).join('|')}`),
    ),
  ].sort();
  let h = 0x811c9dc5;
  for (const ch of shapes.join('\n')) {
    h ^= ch.codePointAt(0) ?? 0;
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return `shape-${h.toString(16).padStart(8, '0')}`;
}
