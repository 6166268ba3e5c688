import { originalRef } from '../table/originalCell';
import type { CellRef, PlotTable } from '../table/plotTable';
import type { PlotrateProject } from './projectFormat';

/**
 * The text of a project file: JSON indented by two spaces with a final
 * newline, so files diff well and a person can read them. `savedAt` is set
 * here from the caller's clock; everything else is written as given.
 *
 * @param project the project to write
 * @param savedAt the moment of saving (caller's clock)
 * @returns UTF-8 text to write to a `.plotrate` file
 * @example serializeProject(p, new Date()).startsWith('{\n  "format": "plotrate-project"') // true
 */
export function serializeProject(project: PlotrateProject, savedAt: Date): string {
  // Written field by field so the identifying fields come first and nothing
  // outside the format (a stray property on the object) reaches the file.
  const ordered: Record<keyof PlotrateProject, unknown> = {
    format: project.format,
    version: project.version,
    createdAt: project.createdAt,
    savedAt: savedAt.toISOString(),
    appVersion: project.appVersion,
    sources: project.sources,
    table: project.table && plotTableForFile(project.table),
    mapping: project.mapping,
    units: project.units,
    prices: project.prices,
    models: project.models,
    bootstrap: project.bootstrap,
    notes: project.notes,
    view: project.view,
  };
  return `${JSON.stringify(ordered, null, 2)}\n`;
}

/**
 * The table as the file holds it: each original cell as its text and its reference spelled out
 * (`{ text, ref: { file, sheet, cell, row } }`), for a person reading the file; in memory the
 * cell is kept flat with its column as a number (OriginalCell). readPlotTable reads it back.
 * @param table - the table in memory
 * @returns the table to write as JSON
 */
export function plotTableForFile(table: PlotTable): unknown {
  return {
    ...table,
    plots: table.plots.map((p) => {
      const original: Record<string, { text: string; ref: CellRef }> = {};
      for (const [role, o] of Object.entries(p.original))
        if (o) original[role] = { text: o.text, ref: originalRef(o) };
      return { ...p, original };
    }),
  };
}
