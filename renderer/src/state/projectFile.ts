// A project file from the workspace and back, for either shell: the desktop saves and opens it
// through its menu and native dialogs, the browser build through a download and a file input.
import type { OpenedProject } from '../../../shared/desktop/desktopContract';
import { parseProject } from '../../../shared/project/parseProject';
import { serializeProject } from '../../../shared/project/serializeProject';
import { projectFromWorkspace, sessionFromProject } from '../lib/projectView';
import type { Workspace } from './workspace.svelte';

/** What the browser and the shell call a project file. */
export const PROJECT_EXTENSION = '.plotrate';

/**
 * The current work as a project.
 * @param ws - the workspace
 * @param appVersion - the version written into the project
 * @returns the project (table, edits, prices, picks, units)
 */
export function currentProject(ws: Workspace, appVersion: string) {
  const priced = ws.prices.canonical;
  return projectFromWorkspace(
    ws.session(),
    ws.trial.table,
    priced.ok ? priced.prices : null,
    ws.settings.units,
    new Date(Date.now()),
    appVersion,
  );
}

/**
 * The current work as the bytes of a project file (UTF-8 JSON).
 * @param ws - the workspace
 * @param appVersion - the version written into the project
 * @returns the file's bytes
 */
export function projectFileBytes(ws: Workspace, appVersion: string): Uint8Array {
  const now = new Date(Date.now());
  return new TextEncoder().encode(serializeProject(currentProject(ws, appVersion), now));
}

/**
 * Reads a project file the user chose.
 * @param name - the file's name, for messages
 * @param bytes - its contents
 * @returns the project in the current format and the version it was migrated from
 * @throws ProjectFileError naming the file and the field when it is not a usable project
 */
export function readProjectFile(name: string, bytes: Uint8Array): OpenedProject {
  const parsed = parseProject(new TextDecoder('utf-8').decode(bytes), name);
  return { name, project: parsed.project, migratedFrom: parsed.migratedFrom };
}

/**
 * Opens a project: its table and edits come back; its spreadsheets are not in it.
 * @param ws - the workspace
 * @param opened - the project read from its file
 */
export async function openProject(ws: Workspace, opened: OpenedProject): Promise<void> {
  const session = sessionFromProject(opened.project);
  for (const file of [...ws.sources.files]) ws.sources.remove(file.name);
  ws.trial.projectTable = opened.project.table;
  if (session) await ws.restore(session);
  ws.messages.add(
    'info',
    `Opened ${opened.name}`,
    (opened.migratedFrom !== null
      ? `It was written by an older Plotrate (format ${opened.migratedFrom}); saving writes the current format. `
      : '') +
      'The plot table and your decisions are back. To change column roles, open the trial files again.',
  );
  if (ws.step === 'files' || ws.step === 'columns') ws.step = 'site';
}
