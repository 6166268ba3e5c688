/**
 * The messages of the import caps (importLimits), for the .xlsx and the text reader alike: what
 * is too large, where (file, sheet, cell) and what to do. The caps themselves live in
 * importLimits; the readers check them while reading and throw these.
 */
import { ImportError } from './importError';

/** The file, and the sheet for a workbook (absent for a text file). */
export interface LimitPlace {
  file: string;
  sheet?: string;
}

const count = (n: number): string => n.toLocaleString('en-US');

/** `Sheet "Plots" in "trial.xlsx"` or `"trial.csv"`. */
function placeName(at: LimitPlace): string {
  return at.sheet !== undefined ? `Sheet "${at.sheet}" in "${at.file}"` : `"${at.file}"`;
}

function where(at: LimitPlace, cell?: string) {
  return {
    file: at.file,
    ...(at.sheet !== undefined ? { sheet: at.sheet } : {}),
    ...(cell ? { cell } : {}),
  };
}

/**
 * More rows than `maxRows`.
 * @param at - file and sheet
 * @param limit - the cap
 * @param rows - the rows found or declared, when known
 * @returns the error to throw
 * @example
 * tooManyRows({ file: 'a.csv' }, 20).message // '"a.csv" has more than 20 rows, the limit for one file; split it by site or year.'
 */
export function tooManyRows(at: LimitPlace, limit: number, rows?: number): ImportError {
  return new ImportError(
    'too-many-rows',
    rows === undefined
      ? `${placeName(at)} has more than ${count(limit)} rows, the limit for one file; split it by site or year.`
      : `${placeName(at)} has ${count(rows)} rows, more than the limit of ${count(limit)}; split it by site or year.`,
    where(at),
  );
}

/**
 * A cell beyond `maxColumns`.
 * @param at - file and sheet
 * @param address - the first cell beyond the cap, e.g. "AMK7"
 * @param limit - the cap
 * @returns the error to throw, naming the cell
 * @example
 * tooManyColumns({ file: 'a.csv' }, 'AMK2', 1024).where?.cell // 'AMK2'
 */
export function tooManyColumns(at: LimitPlace, address: string, limit: number): ImportError {
  const text = at.sheet === undefined;
  return new ImportError(
    'too-many-columns',
    `${placeName(at)} has a ${text ? 'field' : 'cell'} at ${address}, beyond the ${count(limit)} columns Plotrate reads; ${
      text
        ? 'check that the file uses one separator (comma, semicolon or tab) and that its lines end where rows end, or delete the columns right of the trial data, and save again.'
        : 'delete the columns right of the trial data (they may look empty) and save again.'
    }`,
    where(at, address),
  );
}

/**
 * A cell holding more than `maxCellChars` characters.
 * @param at - file and sheet
 * @param address - the cell
 * @param limit - the cap
 * @param hint - what usually causes it in this kind of file, and what to check
 * @returns the error to throw, naming the cell
 * @example
 * cellTooLong({ file: 'a.csv' }, 'A1', 32767, 'check it').code // 'cell-too-long'
 */
export function cellTooLong(
  at: LimitPlace,
  address: string,
  limit: number,
  hint: string,
): ImportError {
  return new ImportError(
    'cell-too-long',
    `${placeName(at)}: cell ${address} holds more than ${count(limit)} characters, the most a spreadsheet cell holds (a trial cell holds a few); ${hint}.`,
    where(at, address),
  );
}

/**
 * More filled cells than `maxCells` in one file.
 * @param at - file and sheet where the cap was passed
 * @param address - the first cell past the cap
 * @param limit - the cap
 * @returns the error to throw, naming the cell
 * @example
 * tooManyCells({ file: 'a.csv' }, 'T250001', 5e6).code // 'too-many-cells'
 */
export function tooManyCells(at: LimitPlace, address: string, limit: number): ImportError {
  return new ImportError(
    'too-many-cells',
    `${placeName(at)} holds more than ${count(limit)} filled cells (passed at ${address}), the limit for one file; delete the columns the trial does not need, or split the file by site or year, and save again.`,
    where(at, address),
  );
}
