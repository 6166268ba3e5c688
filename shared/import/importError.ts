/**
 * The one error type import throws for a file it cannot use. The message is
 * written for the user: what is wrong, where (file, sheet, cell) and what to
 * do. `code` lets a screen pick an icon or a help page without parsing text.
 */

export type ImportErrorCode =
  | 'empty-file'
  | 'legacy-xls'
  | 'ods'
  | 'encrypted'
  | 'not-a-workbook'
  | 'corrupt'
  | 'file-too-large'
  | 'uncompressed-too-large'
  | 'too-many-rows'
  | 'too-many-columns'
  | 'too-many-cells'
  | 'cell-too-long'
  | 'bad-text'
  | 'no-data'
  | 'bad-mapping'
  | 'column-needs-answer'
  | 'bad-settings';

/** Where in the user's file the problem is, when it is in one place. */
export interface ImportErrorWhere {
  file: string;
  sheet?: string;
  cell?: string;
}

export class ImportError extends Error {
  readonly code: ImportErrorCode;
  readonly where: ImportErrorWhere | null;

  /**
   * @param code - what kind of problem, for screens and tests
   * @param message - the full sentence(s) the user reads
   * @param where - file, sheet and cell, when known
   */
  constructor(code: ImportErrorCode, message: string, where: ImportErrorWhere | null = null) {
    super(message);
    this.name = 'ImportError';
    this.code = code;
    this.where = where;
  }
}

/**
 * Whether a thrown value is an ImportError (also across bundles, by name).
 * @param e - anything caught
 * @returns true for an ImportError
 * @example
 * isImportError(new ImportError('corrupt', 'x')) // true
 */
export function isImportError(e: unknown): e is ImportError {
  return e instanceof ImportError || (e instanceof Error && e.name === 'ImportError');
}
