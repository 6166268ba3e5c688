/**
 * The mapping from a workbook's columns to meanings: plain JSON, so a screen
 * can show it, the user can change any part, and a project can store it and
 * reuse it for the next file of the same shape ({@link ColumnMapping.shapeSignature}).
 */
import { COLUMN_ROLES, type CropId } from '../table/plotTable';
import type { ProductId } from '../units/products';

/**
 * Every meaning a column can be given: the plot-table roles, the treatment-key
 * fields (product, timing), a treatment factor of a plots sheet (its values are levels, each
 * with its own response curve: shared/analysis/siteLevels) and "ignore"; the one list that detection,
 * validation and the command line's --map check against.
 */
export const MAPPED_ROLES = [...COLUMN_ROLES, 'product', 'timing', 'factor', 'ignore'] as const;

/** A column's meaning: a plot-table role, a treatment-key field, or nothing. */
export type MappedRole = (typeof MAPPED_ROLES)[number];

/** A role's name for people: the column review, messages, the command line's help. */
export const ROLE_LABELS: Readonly<Record<MappedRole, string>> = {
  site: 'Site',
  year: 'Year',
  block: 'Block (replicate)',
  plot: 'Plot',
  treatment: 'Treatment',
  rate: 'N rate',
  yield: 'Yield',
  plotWeight: 'Plot grain weight',
  plotArea: 'Plot area',
  plotLength: 'Plot length',
  plotWidth: 'Plot width',
  moisture: 'Grain moisture',
  testWeight: 'Test weight',
  notes: 'Notes',
  exclude: 'Exclude flag',
  group: 'Grouping (soil, previous crop…)',
  product: 'Product (key)',
  timing: 'Timing (key)',
  factor: 'Treatment factor (source, timing…)',
  ignore: 'Not used',
};

/** Units a header can name. Rates and yields per area; weights, areas, lengths per plot. */
export type HeaderUnit =
  | 'kg/ha'
  | 'lb/ac'
  | 'g/m2'
  | 't/ha'
  | 'q/ha'
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
  yield: ['kg/ha', 't/ha', 'q/ha', 'lb/ac', 'bu/ac', 'g/m2'],
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
  /**
   * For a rate of product: the product its header names ("Urea (lb/ac)"); a product column or
   * the treatment key, row by row, comes first, the import settings' product after.
   */
  product?: ProductId | null;
  /** For a yield: "harvest" when weighed wet (adjust with the moisture column) or "standard" when already adjusted. */
  moistureBasis?: 'harvest' | 'standard';
  /** Why this role and unit, in words for the user. */
  evidence: string;
  /**
   * A question import could not settle from the evidence (plot weights or yields?): while it is
   * open the column is not read, and the table is not built; the user's answer (a role and a
   * unit) closes it. Absent when the evidence was clear.
   */
  question?: ColumnQuestion;
}

/** One way to read a column that import could not choose between, with what it would give. */
export interface ColumnReading {
  role: 'yield' | 'plotWeight';
  unit: HeaderUnit;
  /** The median yield this reading gives, kg/ha, or null when it cannot be computed. */
  medianYieldKgHa: number | null;
  /** What this reading means, for the user: "plot weights in kg over plots of 12 m²". */
  meaning: string;
}

/** The open question of a column (see ColumnAssignment.question). */
export interface ColumnQuestion {
  readings: ColumnReading[];
  /** Why import asks, for the user. */
  why: string;
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
  /** Where the crop hint was read: 'the title row "2025 winter wheat N trial"'. */
  cropEvidence?: string;
}

export interface ColumnMapping {
  version: 1;
  /** Hash of the sheets' uses and header texts: equal for files of the same shape. */
  shapeSignature: string;
  sheets: SheetMapping[];
}

/**
 * Roles any number of columns may hold: grouping columns (previous crop, soil…), treatment factors
 * (a rate × source × timing trial has two: each gets its own level test, and factorCrossing says
 * how they meet) and columns left out. Every other role (site, rate, yield, notes…) is held by at
 * most one column of a sheet.
 */
const MANY_COLUMN_ROLES: ReadonlySet<MappedRole> = new Set<MappedRole>([
  'group',
  'factor',
  'ignore',
]);

/**
 * Whether a sheet may give this role to one column only. The one rule that detection, the
 * screen's role edits and the command line's --map follow, and that the sheet readers rely on.
 * @param role - a column role
 * @returns false for 'group' and 'ignore', true for every other role (notes included)
 * @example
 * roleTakesOneColumn('notes') // true
 * roleTakesOneColumn('group') // false
 */
export function roleTakesOneColumn(role: MappedRole): boolean {
  return !MANY_COLUMN_ROLES.has(role);
}

/**
 * The column of a sheet that holds a one-column role. A mapping from an older file that gave a
 * role to two columns is read from the first, as detection would have chosen.
 * @param columns - the sheet's columns, in sheet order
 * @param role - a role that takes one column
 * @returns the column, or undefined when no column has the role
 * @example
 * columnForRole(sheet.columns, 'yield')?.letter // 'F'
 */
export function columnForRole(
  columns: readonly ColumnAssignment[],
  role: MappedRole,
): ColumnAssignment | undefined {
  return columns.find((c) => c.role === role);
}

/**
 * The first column of a plots sheet whose question is still open (see ColumnAssignment.question).
 * @example openQuestion(sheet)?.letter // 'D'
 */
export function openQuestion(sheet: SheetMapping): ColumnAssignment | undefined {
  return sheet.use === 'plots'
    ? sheet.columns.find((c) => c.question && c.role !== 'ignore')
    : undefined;
}

/**
 * The sentence that says what an open question is about and what each answer would give, for
 * the screen and both import paths: "Column D "Harvested grain" of sheet "Plots" in "t.csv" may
 * hold plot weights or yields: …".
 */
export function questionSentence(
  file: string,
  sheet: SheetMapping,
  column: ColumnAssignment,
): string {
  const why = column.question?.why ?? '';
  const where = sheet.sheet ? `of sheet "${sheet.sheet}" ` : '';
  return `Column ${column.letter} "${column.header}" ${where}in "${file}" may hold plot weights or yields, and the file does not say which (${why}). No yield is computed from a guess: say which it holds`;
}
