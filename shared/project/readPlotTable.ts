import {
  COLUMN_ROLES,
  type CellRef,
  type ColumnRole,
  type CropId,
  type Correction,
  type Exclusion,
  type OriginalCell,
  type Plot,
  type PlotTable,
  type SourceFile,
} from '../table/plotTable';
import { parseAddress } from '../table/cellAddress';
import type { FieldReader } from './fieldReader';

const CROPS = [
  'corn',
  'wheat',
  'soybean',
  'barley',
  'sorghum',
  'oats',
  'canola',
] as const satisfies readonly CropId[];

const EXCLUDERS = ['sheet', 'user', 'quality-check'] as const satisfies readonly Exclusion['by'][];

// If the plot table gains a crop, this line stops compiling until the list above follows.
const _allCrops: Exclude<CropId, (typeof CROPS)[number]> extends never ? true : never = true;

/**
 * Read the list of source files (name, size in bytes, SHA-256 hex).
 * @throws ProjectFileError naming the field when an entry is malformed
 */
export function readSources(r: FieldReader): SourceFile[] {
  return r.items().map((s) => {
    const sha256 = s.field('sha256').string();
    if (!/^[0-9a-f]{64}$/.test(sha256))
      s.field('sha256').fail('should be 64 lower-case hexadecimal digits (a SHA-256)');
    const bytes = s.field('bytes').number();
    if (!Number.isInteger(bytes) || bytes < 0)
      s.field('bytes').fail(`should be a whole number of bytes ≥ 0, found ${bytes}`);
    return { name: s.field('name').string(), bytes, sha256 };
  });
}

/**
 * Read and check a plot table stored in a project file, field by field.
 * @param r reader positioned on the table
 * @returns the table, typed
 * @throws ProjectFileError naming the plot and field when anything is malformed
 */
export function readPlotTable(r: FieldReader): PlotTable {
  const ids = new Set<string>();
  const plots = r
    .field('plots')
    .items()
    .map((p) => {
      const plot = readPlot(p);
      if (ids.has(plot.id)) p.field('id').fail(`repeats the plot id "${plot.id}"`);
      ids.add(plot.id);
      return plot;
    });
  const moisture = r.field('standardMoisturePct').number();
  if (moisture < 0 || moisture >= 100)
    r.field('standardMoisturePct').fail(
      `should be a percentage from 0 to below 100, found ${moisture}`,
    );
  const table: PlotTable = {
    crop: r.field('crop').oneOf(CROPS),
    standardMoisturePct: moisture,
    plots,
    sources: readSources(r.field('sources')),
  };
  // Treatment-factor columns (rate × source, rate × timing); absent in older projects.
  if (r.has('factorKeys'))
    table.factorKeys = r
      .field('factorKeys')
      .items()
      .map((k) => k.string());
  return table;
}

function readPlot(p: FieldReader): Plot {
  const year = p.field('year').nullableNumber();
  if (year !== null && !Number.isInteger(year))
    p.field('year').fail(`should be a whole year, found ${year}`);
  const groups: Record<string, string> = {};
  const g = p.field('groups');
  for (const key of Object.keys(g.object())) groups[key] = g.field(key).string();
  const original: Partial<Record<ColumnRole, OriginalCell>> = {};
  const o = p.field('original');
  for (const key of Object.keys(o.object())) {
    if (!(COLUMN_ROLES as readonly string[]).includes(key))
      o.fail(`names "${key}", which is not a column role (${COLUMN_ROLES.join(', ')})`);
    const cell = o.field(key);
    const ref = readCellRef(cell.field('ref'));
    // Kept in memory by its column number (OriginalCell), so the address must be one.
    const at = parseAddress(ref.cell);
    if (!at) {
      const address: FieldReader = cell.field('ref').field('cell');
      address.fail(`should be an A1 address such as "E4", found "${ref.cell}"`);
    }
    original[key as ColumnRole] = {
      text: cell.field('text').string(),
      file: ref.file,
      sheet: ref.sheet,
      row: ref.row,
      col: at.col,
    };
  }
  const ex = p.field('excluded');
  const excluded: Exclusion | null =
    ex.value === null
      ? null
      : { reason: ex.field('reason').string(), by: ex.field('by').oneOf(EXCLUDERS) };
  // Corrections (optional: files written before them have none).
  const corrections: Correction[] | undefined = p.has('corrections')
    ? p
        .field('corrections')
        .items()
        .map((c) => ({
          role: c.field('role').oneOf(['rate', 'yield'] as const),
          fromKgHa: c.field('fromKgHa').nullableNumber(),
          toKgHa: c.field('toKgHa').number(),
          reason: c.field('reason').string(),
        }))
    : undefined;
  return {
    id: p.field('id').string(),
    site: p.field('site').string(),
    year,
    block: p.field('block').nullableString(),
    plotLabel: p.field('plotLabel').nullableString(),
    treatment: p.field('treatment').nullableString(),
    rateKgHa: p.field('rateKgHa').nullableNumber(),
    yieldKgHa: p.field('yieldKgHa').nullableNumber(),
    moisturePct: p.field('moisturePct').nullableNumber(),
    testWeight: p.field('testWeight').nullableNumber(),
    notes: p.field('notes').nullableString(),
    groups,
    excluded,
    original,
    ...(corrections ? { corrections } : {}),
  };
}

function readCellRef(r: FieldReader): CellRef {
  const row = r.field('row').number();
  if (!Number.isInteger(row) || row < 1)
    r.field('row').fail(`should be a row number ≥ 1, found ${row}`);
  return {
    file: r.field('file').string(),
    sheet: r.field('sheet').string(),
    cell: r.field('cell').string(),
    row,
  };
}
