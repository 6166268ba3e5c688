/**
 * Applies a mapping the user saved for an earlier file to a new file of the
 * same shape: each column's role, unit and basis are taken from the saved
 * column with the same header text and sheet use, so corrections made once
 * (a unit, a basis, a column set to "ignore") carry over.
 */
import type { ColumnMapping } from './columnMapping';
import { detectColumns } from './detectColumns';
import { normalizeHeader } from './headerWords';
import type { RawWorkbook } from './rawWorkbook';

/**
 * Detects the new file's layout and overlays the saved choices.
 * @param raw - the new workbook
 * @param saved - a mapping stored with the project
 * @returns the mapping for the new file, and whether the shapes matched
 * @example
 * reuseMapping(raw2026, project.mapping).sameShape // true
 */
export function reuseMapping(
  raw: RawWorkbook,
  saved: ColumnMapping,
): { mapping: ColumnMapping; sameShape: boolean } {
  const fresh = detectColumns(raw);
  if (fresh.shapeSignature !== saved.shapeSignature) return { mapping: fresh, sameShape: false };
  for (const sheet of fresh.sheets) {
    // By name first (same sheet), else the first saved sheet with the same use and headers.
    const key = (s: { columns: { header: string }[] }) =>
      s.columns.map((c) => normalizeHeader(c.header)).join('|');
    const match =
      saved.sheets.find((s) => s.sheet === sheet.sheet) ??
      saved.sheets.find((s) => s.use === sheet.use && key(s) === key(sheet));
    if (!match) continue;
    sheet.use = match.use;
    sheet.site = match.site.from === 'fixed' ? sheet.site : match.site;
    for (const col of sheet.columns) {
      const c = match.columns.find(
        (m) => normalizeHeader(m.header) === normalizeHeader(col.header),
      );
      if (!c) continue;
      col.role = c.role;
      col.unit = c.unit;
      col.basis = c.basis;
      col.moistureBasis = c.moistureBasis;
      col.evidence = `as in the saved mapping (${c.evidence})`;
    }
  }
  return { mapping: fresh, sameShape: true };
}
