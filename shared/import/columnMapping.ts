/**
 * The mapping from a workbook's columns to meanings: plain JSON, so a screen
 * can show it, the user can change any part, and a project can store it and
 * reuse it for the next file of the same shape ({@link ColumnMapping.shapeSignature}).
 */
import { COLUMN_ROLES, type CropId } from '../table/plotTable';

/**
 * Every meaning a column can be given: the plot-table roles, the treatment-key
 * fields (product, timing) and "ignore"; the one list that detection,
 * validation and the command line's --map check against.
 */
export const MAPPED_ROLES = [...COLUMN_ROLES, 'product', 'timing', 'ignore'] as const;

/** A column's meaning: a plot-table role, a treatment-key field, or nothing. */
export type MappedRole = (typeof MAPPED_ROLES)[number];

/** Units a header can name. Rates and yields per area; weights, areas, lengths per plot. */
export type HeaderUnit =
  | 'kg/ha'
  | 'lb/ac'
  | 'g/m2'
  | 't/ha'
  | 'bu/ac'
  | '%'
  | 'kg'
  | 'g'
  | 'lb'
  | 'm2'
  | 'ft2'
  | 'ha'
  | 'ac'
  | 'm'
  | 'ft'
  | 'lb/bu'
  | 'kg/hl';

/** The units a column of each role may carry; a role not listed has no unit. */
export const UNITS_BY_ROLE: Readonly<Partial<Record<MappedRole, readonly HeaderUnit[]>>> = {
  rate: ['kg/ha', 'lb/ac', 'g/m2'],
  yield: ['kg/ha', 't/ha', 'lb/ac', 'bu/ac', 'g/m2'],
  plotWeight: ['kg', 'g', 'lb'],
  plotArea: ['m2', 'ft2', 'ha', 'ac'],
  plotLength: ['m', 'ft'],
  plotWidth: ['m', 'ft'],
  moisture: ['%'],
  testWeight: ['lb/bu', 'kg/hl'],
};

export interface ColumnAssignment {
  /** 1-based column number. */
  col: number;
  /** Column letters, e.g. "D". */
  letter: string;
  /** The header text as written. */
  header: string;
  role: MappedRole;
  /** The unit of the values, from the header or guessed from the values (see evidence). */
  unit: HeaderUnit | null;
  /** For a rate: product or nutrient (null: use the import settings). */
  basis?: 'product' | 'nutrient' | null;
  /** For a yield: "harvest" when weighed wet (adjust with the moisture column) or "standard" when already adjusted. */
  moistureBasis?: 'harvest' | 'standard';
  /** Why this role and unit, in words for the user. */
  evidence: string;
}

export interface SheetMapping {
  sheet: string;
  /** "plots": one plot per row; "treatment-key": treatment number → rate; "ignore". */
  use: 'plots' | 'treatment-key' | 'ignore';
  /** 1-based row of the header; 0 when none was found. */
  headerRow: number;
  /** Where a plot's site name comes from. */
  site: { from: 'column' } | { from: 'sheet-name' } | { from: 'fixed'; value: string };
  columns: ColumnAssignment[];
  /** Why the sheet got this use. */
  evidence: string;
  /**
   * The crop the sheet's name or title rows name, if exactly one. A plots sheet of
   * another crop than the import settings' is left out unless chosen by name.
   */
  cropHint?: CropId | null;
}

export interface ColumnMapping {
  version: 1;
  /** Hash of the sheets' uses and header texts: equal for files of the same shape. */
  shapeSignature: string;
  sheets: SheetMapping[];
}
