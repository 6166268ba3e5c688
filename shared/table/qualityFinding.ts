/**
 * A finding about the data: something the user should look at, with the
 * cells it is about so the screen can take them there. Findings never change
 * the table; the user decides (exclude a plot, fix the file, carry on).
 *
 * Both the import (cells it could not read) and the quality checks write findings, so the type
 * lives here with the table's cell references rather than in either of them.
 */
import type { CellRef } from './plotTable';

export type FindingSeverity = 'error' | 'warning' | 'info';

export type FindingCode =
  | 'number-as-text'
  | 'formula-without-result'
  | 'not-a-number'
  | 'missing-value'
  | 'moisture-missing'
  | 'summary-row-skipped'
  | 'hidden-rows'
  | 'site-filled-down'
  | 'treatment-not-in-key'
  | 'other-crop-sheet-skipped'
  | 'crop-differs'
  | 'second-yield-column'
  | 'crop-from-files'
  | 'duplicate-plot'
  | 'site-in-several-years'
  | 'year-from-file-name'
  | 'site-year-from-sheet-name'
  | 'missing-plot'
  | 'unequal-replication'
  | 'negative-value'
  | 'impossible-value'
  | 'implausible-yield'
  | 'moisture-out-of-range'
  | 'outlier'
  | 'trial-cv'
  | 'high-cv'
  | 'model-not-fitted';

export interface QualityFinding {
  code: FindingCode;
  severity: FindingSeverity;
  /** One or two sentences for the user: what, where, and what they might do. */
  message: string;
  /** The cells concerned (may be empty for a site-level finding). */
  refs: CellRef[];
  /** The site concerned, when there is one. */
  site?: string;
  /** Ids of the plots concerned (Plot.id). */
  plotIds?: string[];
  /** A number behind the finding (studentized residual, CV %), for sorting and display. */
  value?: number;
}

/**
 * Writes a cell reference the way messages show it: file › sheet › cell.
 * @param ref - the cell
 * @returns e.g. "trial.xlsx › North › D7"
 * @example
 * describeRef({ file: 'a.csv', sheet: '', cell: 'B3', row: 3 }) // 'a.csv › B3'
 */
export function describeRef(ref: CellRef): string {
  return [ref.file, ref.sheet, ref.cell].filter((s) => s !== '').join(' › ');
}

/** Most characters of a cell's text a message quotes; the rest is cut with an ellipsis. */
const QUOTED_TEXT_CHARS = 60;

/**
 * A cell's text the way a message quotes it: on one line (line breaks and tabs as spaces) and
 * at most 60 characters, so a cell of notes, or of lines joined by a stray quote, cannot turn
 * one message into a page.
 * @param text - the cell's text
 * @returns the text to put between quotes
 * @example
 * quoteCellText('12\n5') // '12 5'
 */
export function quoteCellText(text: string): string {
  const flat = text.replace(/[\r\n\t]+/g, ' ').trim();
  return flat.length > QUOTED_TEXT_CHARS ? `${flat.slice(0, QUOTED_TEXT_CHARS - 1)}…` : flat;
}
