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
  const ordered: PlotrateProject = {
    format: project.format,
    version: project.version,
    createdAt: project.createdAt,
    savedAt: savedAt.toISOString(),
    appVersion: project.appVersion,
    sources: project.sources,
    table: project.table,
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
