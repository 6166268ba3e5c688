/**
 * The desktop project file and the workspace: what the page writes into a
 * project (shared/project format) and reads back. The spreadsheets are not
 * copied into a project, so a reopened project carries its plot table (with
 * every original cell text) and the user's edits; the column review needs the
 * files themselves and asks for them.
 */
import type { JsonValue, PlotrateProject } from '../../../shared/project/projectFormat';
import { createProject } from '../../../shared/project/createProject';
import { ANALYSIS_DEFAULTS } from '../../../shared/analysis/analysisSettings';
import type { Session } from './session';
import { checkSession } from './session';
import type { PlotTable } from '../../../shared/table/plotTable';
import type { Prices } from '../../../shared/economics/priceRatio';

/**
 * A project holding the current work.
 * @param session - the workspace session (file bytes are left out)
 * @param table - the plot table with the user's decisions applied, or null
 * @param prices - canonical prices, or null when they cannot be used
 * @param now - the save time
 * @param appVersion - Plotrate's version
 * @returns the project to hand to the shell
 */
export function projectFromWorkspace(
  session: Session,
  table: PlotTable | null,
  prices: Prices | null,
  units: { rate: string; yield: string },
  now: Date,
  appVersion: string,
): PlotrateProject {
  const project = createProject(now, appVersion);
  const { files: _files, ...view } = session;
  return {
    ...project,
    sources: table?.sources ?? [],
    table,
    mapping: JSON.parse(JSON.stringify({ files: session.edits.mappings })) as {
      [k: string]: JsonValue;
    },
    units,
    prices: {
      currency: session.prices.currency,
      nutrientPerKg: prices?.nutrientPricePerKg ?? null,
      grainPerKg: prices?.grainPricePerKg ?? null,
    },
    bootstrap: {
      resamples: ANALYSIS_DEFAULTS.resamples,
      seed: ANALYSIS_DEFAULTS.seed,
      confidenceLevel: ANALYSIS_DEFAULTS.intervalLevel,
    },
    view: JSON.parse(JSON.stringify({ workspace: view })) as { [k: string]: JsonValue },
  };
}

/**
 * The workspace session kept in a project's view, with no files (the table stands in for them).
 * @param project - an opened project
 * @returns the session, or null when the project was written by another program or build
 */
export function sessionFromProject(project: PlotrateProject): Session | null {
  const view = project.view.workspace;
  if (typeof view !== 'object' || view === null || Array.isArray(view)) return null;
  return checkSession({ ...view, files: [] });
}
