/**
 * The user's edits on top of what import detected: column mappings, import
 * settings (crop, standard moisture, rate basis) and decisions on plots
 * (exclude with a reason, or keep a flagged plot with a reason). Edits are
 * plain JSON so they go to undo snapshots, localStorage and the project file
 * unchanged. Every change returns a new value; nothing is edited in place.
 */
import { assignColumnRole } from '../../../shared/import/assignColumnRole';
import {
  type ColumnMapping,
  type ColumnReading,
  type HeaderUnit,
  type MappedRole,
  type SheetMapping,
} from '../../../shared/import/columnMapping';
import { mapSheetFromHeaderRow } from '../../../shared/import/detectColumns';
import type { ImportSettings } from '../../../shared/import/importSettings';
import type { RawWorkbook } from '../../../shared/import/rawWorkbook';
import type { Correction, Plot, PlotTable } from '../../../shared/table/plotTable';

/** What the user decided about one plot. */
export interface PlotDecision {
  action: 'exclude' | 'keep';
  reason: string;
}

/** A value the user typed for a plot's rate or yield, kg/ha, and why (the cell's text is kept). */
export interface ValueCorrection {
  toKgHa: number;
  reason: string;
}

export interface Edits {
  /** File name → its column mapping. */
  mappings: Record<string, ColumnMapping>;
  settings: ImportSettings;
  /** Plot id → decision. */
  decisions: Record<string, PlotDecision>;
  /** Plot id → its corrected rate and/or yield; absent in sessions from before corrections. */
  corrections?: Record<string, Partial<Record<Correction['role'], ValueCorrection>>>;
}

function updateSheet(
  mapping: ColumnMapping,
  sheet: string,
  change: (s: SheetMapping) => SheetMapping,
): ColumnMapping {
  if (!mapping.sheets.some((s) => s.sheet === sheet)) {
    throw new RangeError(`The mapping has no sheet called "${sheet}".`);
  }
  return { ...mapping, sheets: mapping.sheets.map((s) => (s.sheet === sheet ? change(s) : s)) };
}

/**
 * Gives a column a new role. A role that takes one column in a sheet (rate,
 * yield, site, block, notes…; `roleTakesOneColumn`) moves: the column that had
 * it becomes "ignore", so the table never reads two yields.
 * @param mapping - the file's mapping
 * @param sheet - sheet name
 * @param col - 1-based column number
 * @param role - the new role
 * @returns the changed mapping
 * @throws {RangeError} when the sheet or column is not in the mapping
 */
export function setColumnRole(
  mapping: ColumnMapping,
  sheet: string,
  col: number,
  role: MappedRole,
): ColumnMapping {
  return updateSheet(mapping, sheet, (s) => {
    if (!s.columns.some((c) => c.col === col)) {
      throw new RangeError(`Sheet "${sheet}" has no mapped column ${col}.`);
    }
    const columns = assignColumnRole(s.columns, col, role, {
      chosen: (was) => `set by you (was ${was})`,
      setAside: `set aside: column ${col} now holds the ${role}`,
    });
    // A site column given by hand is where the sites come from, as detection and --map decide.
    const site: SheetMapping['site'] = role === 'site' ? { from: 'column' } : s.site;
    return { ...s, columns, site };
  });
}

/**
 * Changes the unit a column's values are in.
 * @param mapping - the file's mapping
 * @param sheet - sheet name
 * @param col - 1-based column number
 * @param unit - the unit, or null for none
 * @returns the changed mapping
 */
export function setColumnUnit(
  mapping: ColumnMapping,
  sheet: string,
  col: number,
  unit: HeaderUnit | null,
): ColumnMapping {
  return updateSheet(mapping, sheet, (s) => ({
    ...s,
    columns: s.columns.map((c) => (c.col === col ? { ...c, unit } : c)),
  }));
}

/**
 * Answers a column's open question (plot weights or yields?) with one of its readings: the
 * column takes that role and unit, and the question is closed (assignColumnRole).
 * @param mapping - the file's mapping
 * @param sheet - sheet name
 * @param col - 1-based column number
 * @param reading - the role and unit the user chose
 * @returns the changed mapping
 */
export function answerColumnQuestion(
  mapping: ColumnMapping,
  sheet: string,
  col: number,
  reading: Pick<ColumnReading, 'role' | 'unit'>,
): ColumnMapping {
  return setColumnUnit(setColumnRole(mapping, sheet, col, reading.role), sheet, col, reading.unit);
}

/**
 * Changes whether yields in a column were weighed at harvest moisture or are already at standard.
 * @param mapping - the file's mapping
 * @param sheet - sheet name
 * @param col - 1-based column number
 * @param basis - 'harvest' or 'standard'
 * @returns the changed mapping
 */
export function setMoistureBasis(
  mapping: ColumnMapping,
  sheet: string,
  col: number,
  basis: 'harvest' | 'standard',
): ColumnMapping {
  return updateSheet(mapping, sheet, (s) => ({
    ...s,
    columns: s.columns.map((c) => (c.col === col ? { ...c, moistureBasis: basis } : c)),
  }));
}

/**
 * Changes what a sheet is used for (plots, treatment key, or ignore).
 * @param mapping - the file's mapping
 * @param sheet - sheet name
 * @param use - the new use
 * @returns the changed mapping
 */
export function setSheetUse(
  mapping: ColumnMapping,
  sheet: string,
  use: SheetMapping['use'],
): ColumnMapping {
  return updateSheet(mapping, sheet, (s) => ({ ...s, use, evidence: `set by you (was ${s.use})` }));
}

/**
 * Reads a sheet's headers from the row the user chose (mapSheetFromHeaderRow): the columns and
 * their roles are read afresh, and the sheet is read as plots unless its headers make it a
 * treatment key (giving a header row says the sheet matters; its roles can then be given).
 * @param mapping - the file's mapping
 * @param raw - the file as read
 * @param sheet - sheet name
 * @param headerRow - the 1-based header row
 * @returns the changed mapping
 */
export function setHeaderRow(
  mapping: ColumnMapping,
  raw: RawWorkbook,
  sheet: string,
  headerRow: number,
): ColumnMapping {
  const fresh = mapSheetFromHeaderRow(raw, sheet, headerRow);
  return updateSheet(mapping, sheet, () => ({
    ...fresh,
    use: fresh.use === 'ignore' ? 'plots' : fresh.use,
  }));
}

/**
 * Records a decision on plots (or withdraws it with null).
 * @param decisions - current decisions
 * @param plotIds - the plots
 * @param decision - exclude/keep with a reason, or null to return to the sheet's own state
 * @returns the new decisions
 */
export function decide(
  decisions: Readonly<Record<string, PlotDecision>>,
  plotIds: readonly string[],
  decision: PlotDecision | null,
): Record<string, PlotDecision> {
  const next = { ...decisions };
  for (const id of plotIds) {
    if (decision) next[id] = decision;
    else delete next[id];
  }
  return next;
}

/**
 * The table with the user's decisions applied: "exclude" marks the plot
 * excluded by the user with the reason; "keep" clears an exclusion the sheet
 * made. Plots are never removed.
 * @param table - the table as built from the files
 * @param decisions - plot id → decision
 * @returns a new table (plots without a decision are shared, not copied)
 */
export function applyDecisions(
  table: PlotTable,
  decisions: Readonly<Record<string, PlotDecision>>,
  corrections: Edits['corrections'] = {},
): PlotTable {
  const plots = table.plots.map((plot): Plot => {
    const decision = decisions[plot.id];
    const own = corrections[plot.id];
    const corrected = own || plot.corrections ? correctedPlot(plot, own ?? {}) : plot;
    if (!decision) return corrected;
    if (decision.action === 'exclude') {
      return { ...corrected, excluded: { reason: decision.reason, by: 'user' } };
    }
    return { ...corrected, excluded: null };
  });
  return { ...table, plots };
}

/**
 * A plot with the user's corrected values in place and each correction recorded beside the value
 * it replaced. A table that already carries corrections (a project saved with them) is taken back
 * to the sheet's values first, so the edits alone decide: applying the same correction twice
 * changes nothing, and a correction undone restores the sheet's value.
 */
function correctedPlot(
  plot: Plot,
  byRole: Partial<Record<Correction['role'], ValueCorrection>>,
): Plot {
  const { corrections: earlier = [], ...next } = plot;
  for (const e of earlier) {
    if (e.role === 'rate') next.rateKgHa = e.fromKgHa;
    else next.yieldKgHa = e.fromKgHa;
  }
  const made: Correction[] = [];
  for (const role of ['rate', 'yield'] as const) {
    const c = byRole[role];
    if (!c) continue;
    made.push({ role, fromKgHa: next[`${role}KgHa`], toKgHa: c.toKgHa, reason: c.reason });
    next[`${role}KgHa`] = c.toKgHa;
  }
  return made.length > 0 ? { ...next, corrections: made } : next;
}

/**
 * Sets or clears the correction of one value of one plot.
 * @param corrections - the current corrections
 * @param plotId - the plot
 * @param role - "rate" or "yield"
 * @param correction - the new value (kg/ha) and reason, or null to restore the sheet's value
 * @returns the new corrections
 */
export function correct(
  corrections: Edits['corrections'],
  plotId: string,
  role: Correction['role'],
  correction: ValueCorrection | null,
): NonNullable<Edits['corrections']> {
  const next = { ...corrections };
  const own = { ...next[plotId] };
  if (correction) own[role] = correction;
  else delete own[role];
  if (Object.keys(own).length > 0) next[plotId] = own;
  else delete next[plotId];
  return next;
}
