/**
 * The plot table: the one typed value that import produces and every analysis
 * reads. Canonical units inside: nutrient rate in kg/ha and yield in kg/ha at
 * the crop's standard moisture. Conversion to display units happens at the
 * edges (shared/units). Nothing the user gave is lost: every value keeps the
 * text of the cell it came from, and an exclusion is a flag with a reason.
 */

/** Where a value came from, for messages and for "click to the row". */
export interface CellRef {
  /** File name as the user chose it (no directories). */
  file: string;
  /** Sheet name; "" for a CSV/TSV file. */
  sheet: string;
  /** A1-style address, e.g. "C7". */
  cell: string;
  /** 1-based row number in the sheet. */
  row: number;
}

/**
 * The column roles import can assign, in the order screens and messages list
 * them; the one list every stage checks roles against.
 */
export const COLUMN_ROLES = [
  'site',
  'year',
  'block',
  'plot',
  'treatment',
  'rate',
  'yield',
  'plotWeight',
  'plotArea',
  'plotLength',
  'plotWidth',
  'moisture',
  'testWeight',
  'notes',
  'exclude',
  'group',
] as const;

/** A column role of the plot table. */
export type ColumnRole = (typeof COLUMN_ROLES)[number];

/** The roles whose cells hold text: names, labels, notes and exclusion flags. */
const TEXT_COLUMN_ROLES: ReadonlySet<ColumnRole> = new Set<ColumnRole>([
  'site',
  'block',
  'plot',
  'treatment',
  'notes',
  'exclude',
  'group',
]);

/** The roles whose cells hold numbers (import reads them as numbers, quality checks them as such). */
export const NUMERIC_COLUMN_ROLES: readonly ColumnRole[] = COLUMN_ROLES.filter(
  (r) => !TEXT_COLUMN_ROLES.has(r),
);

/**
 * The original cell behind one value: its text as shown in the sheet and where it is. Flat, with
 * its column as a number: every plot keeps about seven, so a nested reference and a spelled A1
 * address were two more objects or strings per cell (a third of a 10,000-site table's objects).
 * `originalRef` (originalCell.ts) gives its {@link CellRef} for messages and sheets.
 */
export interface OriginalCell {
  /** The text as shown in the sheet (or as written in the CSV). */
  text: string;
  /** File name as the user chose it (no directories). */
  file: string;
  /** Sheet name; "" for a CSV/TSV file. */
  sheet: string;
  /** 1-based row. */
  row: number;
  /** 1-based column. */
  col: number;
}

export interface Exclusion {
  /** Why the plot is left out, in the user's words or the check's. */
  reason: string;
  /** Who decided: the sheet's own exclude column, the user, or a quality check the user accepted. */
  by: 'sheet' | 'user' | 'quality-check';
}

export interface Plot {
  /** Unique within the table, stable across re-imports of the same file: "file|sheet|row". */
  id: string;
  site: string;
  year: number | null;
  /** Block (replicate) label; null when the sheet has no block column. */
  block: string | null;
  plotLabel: string | null;
  treatment: string | null;
  /** Nutrient rate, kg/ha (after product × analysis and unit conversion). */
  rateKgHa: number | null;
  /** Yield at the crop's standard moisture, kg/ha. */
  yieldKgHa: number | null;
  /** Grain moisture at harvest, % (wet basis). */
  moisturePct: number | null;
  /** Test weight as given, in the sheet's own unit (kept for reports only). */
  testWeight: number | null;
  notes: string | null;
  /** Extra grouping columns (previous crop, soil, …): column header → value. */
  groups: Record<string, string>;
  excluded: Exclusion | null;
  /** The original cell of every mapped role for this plot. */
  original: Partial<Record<ColumnRole, OriginalCell>>;
  /**
   * Values the user corrected (a mistyped cell), each with the value it replaced; the cell's own
   * text stays in `original`. Absent when nothing was corrected.
   */
  corrections?: Correction[];
}

/** A rate or yield the user corrected, with the value read from the sheet and why. */
export interface Correction {
  role: 'rate' | 'yield';
  /** The value read from the sheet, kg/ha (null when the cell was empty or unreadable). */
  fromKgHa: number | null;
  /** The corrected value, kg/ha. */
  toKgHa: number;
  reason: string;
}

/** A source file as read: its name, size and SHA-256 (hex) for provenance. */
export interface SourceFile {
  name: string;
  bytes: number;
  sha256: string;
}

/** Crop identifiers the unit tables know. */
export type CropId = 'corn' | 'wheat' | 'soybean' | 'barley' | 'sorghum' | 'oats' | 'canola';

export interface PlotTable {
  crop: CropId;
  /** Standard moisture the yields are adjusted to, % (wet basis). */
  standardMoisturePct: number;
  plots: Plot[];
  sources: SourceFile[];
  /**
   * Headers of the columns given the treatment-factor role (source, timing, placement, or any
   * column the user names): each plot's value is in `Plot.groups` under the header, and each
   * value is a level with its own response curve; plots at rate 0 belong to every level (the
   * shared check). Absent or empty: a rate-only trial.
   */
  factorKeys?: string[];
}

/**
 * Above this nutrient rate no trial applies fertilizer: a figure this large is a unit or typing
 * error (a plot weight, grams, a date), never a treatment. Common practice: nitrogen trials top
 * out near 300–450 kg N/ha and phosphate or potash trials near 500 kg/ha of oxide; 2,000 leaves
 * room for any real design.
 */
export const MAX_POSSIBLE_RATE_KG_HA = 2000;

/**
 * Above this yield no grain crop is harvested: 60 t/ha is half again the highest maize yields
 * on record (near 40 t/ha; from memory). The crop's own plausible bound (shared/units/crops)
 * warns far below this; this one refuses.
 */
export const MAX_POSSIBLE_YIELD_KG_HA = 60000;

/**
 * Why a rate or yield cannot be what the sheet meant, or null when it can: negative, not a
 * finite number, or beyond any practice. Such a value is kept in the table (and its cell named
 * by the quality checks) but never fitted.
 * @param role - which value
 * @param valueKgHa - the value in kg/ha
 * @returns a short reason, or null for a possible value
 * @example
 * impossibleValue('yield', -5340) // 'negative'
 * impossibleValue('rate', 120) // null
 */
export function impossibleValue(
  role: 'rate' | 'yield',
  valueKgHa: number,
): 'negative' | 'not finite' | 'beyond any practice' | null {
  if (!Number.isFinite(valueKgHa)) return 'not finite';
  if (valueKgHa < 0) return 'negative';
  const max = role === 'rate' ? MAX_POSSIBLE_RATE_KG_HA : MAX_POSSIBLE_YIELD_KG_HA;
  return valueKgHa > max ? 'beyond any practice' : null;
}

/**
 * Why a plot takes no part in fitting, in words for the plot list; null when it does. The one
 * rule analyzablePlots applies: not excluded, with both rate and yield present and possible
 * (impossibleValue): a negative yield or a rate of 1e300 is refused, not fitted.
 * @param p - a plot
 * @returns e.g. "no yield", "rate negative", "excluded (you): hail"; null for a plot in the fit
 * @example outOfFitReason({ ...plot, yieldKgHa: null }) // 'no yield'
 */
export function outOfFitReason(p: Plot): string | null {
  if (p.excluded) return `excluded (${p.excluded.by}): ${p.excluded.reason}`;
  if (p.rateKgHa === null) return 'no rate';
  if (p.yieldKgHa === null) return 'no yield';
  const rate = impossibleValue('rate', p.rateKgHa);
  if (rate) return `rate ${rate}`;
  const yieldProblem = impossibleValue('yield', p.yieldKgHa);
  return yieldProblem ? `yield ${yieldProblem}` : null;
}

/** Plots that take part in fitting (outOfFitReason gives none). */
export function analyzablePlots(table: PlotTable): Plot[] {
  return table.plots.filter((p) => outOfFitReason(p) === null);
}
