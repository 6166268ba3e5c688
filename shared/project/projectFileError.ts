/** What went wrong with a project file, for the screen to word its message. */
export type ProjectFileProblem =
  /** The text is not JSON at all (truncated, another kind of file). */
  | 'not-json'
  /** Valid JSON but not a Plotrate project (no or wrong `format`). */
  | 'not-a-project'
  /** Written by a newer Plotrate than this one. */
  | 'future-version'
  /** A field is missing or has the wrong type or value. */
  | 'invalid';

/**
 * A project file that cannot be opened. `where` names the file, `field` the
 * JSON path of the offending value (e.g. "table.plots[3].rateKgHa"), so the
 * message says exactly what and where.
 */
export class ProjectFileError extends Error {
  override readonly name = 'ProjectFileError';

  /**
   * @param problem kind of problem
   * @param where the file name as the user knows it
   * @param field JSON path of the bad value, "" for the whole file
   * @param detail what is wrong, in plain words
   */
  constructor(
    readonly problem: ProjectFileProblem,
    readonly where: string,
    readonly field: string,
    readonly detail: string,
  ) {
    super(`${where}: ${field ? `${field}: ` : ''}${detail}`);
  }
}
