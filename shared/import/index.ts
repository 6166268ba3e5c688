/**
 * Import: trial files (bytes) → RawWorkbook → ColumnMapping → PlotTable.
 *
 * ```ts
 * const raw = await readTrialFile({ name: 'trial.xlsx', bytes });   // throws ImportError
 * const mapping = detectColumns(raw);                                // plain JSON, editable
 * const { table, findings } = buildPlotTable(raw, mapping, {
 *   crop: 'corn', rateBasis: 'nutrient',                             // standardMoisturePct?, product?, sheets?, plotAreaM2?
 * });
 * const more = checkQuality(table);                                  // shared/quality
 * ```
 *
 * Public API
 * - `readTrialFile({ name, bytes }, limits?) → Promise<RawWorkbook>`: .xlsx (read from its XML
 *   by readXlsx, unzipped under the checks of {@link unzipChecked}), .csv/.tsv/.txt (comma, semicolon or tab; BOM; decimal
 *   commas; quotes). A legacy .xls, an .ods, a password-protected or damaged file, an oversized
 *   file: an {@link ImportError} whose message says what to do.
 * - `detectColumns(raw) → ColumnMapping`: per sheet the header row, each column's role and unit with
 *   evidence, the sheet's use (plots, treatment key, ignore) and where the site comes from;
 *   `shapeSignature` identifies files of the same layout.
 * - `reuseMapping(raw, saved) → { mapping, sameShape }`: a saved mapping applied to a new file.
 * - `buildPlotTable(raws, mappings, settings) → { table: PlotTable, findings: QualityFinding[] }`.
 * - Limits: {@link importLimits} (file size, unzipped size, rows, zip entries).
 *
 * Types: RawWorkbook/RawSheet/RawCell (rawWorkbook.ts), ColumnMapping/SheetMapping/
 * ColumnAssignment (columnMapping.ts), ImportSettings (importSettings.ts), ImportError
 * (importError.ts; `code` is one of ImportErrorCode, `where` names file, sheet, cell).
 * Nothing here writes a file: the caller's bytes are only read.
 */
export { readTrialFile, type TrialFileInput } from './readTrialFile';
export { detectColumns } from './detectColumns';
export { reuseMapping } from './reuseMapping';
export { buildPlotTable } from './buildPlotTable';
export {
  ImportError,
  isImportError,
  type ImportErrorCode,
  type ImportErrorWhere,
} from './importError';
export { importLimits, formatBytes, type ImportLimits } from './importLimits';
export { guardZip, zipEntryNames } from './zipGuard';
export { sniffFormat } from './sniffFormat';
export { shapeSignature } from './shapeSignature';
export { parseNumberText, isMissingMarker } from '../table/parseNumberText';
export { cellNumber, type CellNumberStatus } from './cellNumber';
export { roleFromHeader, unitFromHeader, normalizeHeader, rateHeaderBasis } from './headerWords';
export { columnLetters, cellAddress } from '../table/cellAddress';
export type { RawWorkbook, RawSheet, RawCell, RawValue } from './rawWorkbook';
export type {
  ColumnMapping,
  SheetMapping,
  ColumnAssignment,
  MappedRole,
  HeaderUnit,
} from './columnMapping';
export type { ImportSettings } from './importSettings';
