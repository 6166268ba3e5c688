/**
 * The rows of a delimited text file in one pass over its characters: each field's hash taken
 * while scanning it and its cell found by place (SharedCells), so a repeated text costs neither
 * a string nor a record array; rows come out as readDelimited gives them (trailing blank fields
 * left off, null for an empty field).
 *
 * Fields follow RFC 4180 as DelimitedRecords reads them (double quotes, "" for a quote inside,
 * line breaks inside quotes; text after a closing quote up to the separator kept; CR, LF or
 * CR LF end a record). A file that meets a cap or a quote never closed is not this reader's to
 * explain: it says where the record that meets it starts, and the caller reads on from there with
 * DelimitedRecords, which names the cell and says what to do, in the same words as ever (the
 * records before it were read under every cap, so the plain reading would have come this far).
 */
import type { ImportLimits } from './importLimits';
import type { RawCell } from './rawWorkbook';
import { hashStep, SharedCells } from './sharedCells';

const QUOTE = 34; // "
const LF = 10;
const CR = 13;

/** Where a record starts: its offset in the text, the records and the filled cells before it. */
export interface RecordStart {
  at: number;
  row: number;
  filled: number;
}

/**
 * Reads every row of `text`.
 * @param text - the decoded file
 * @param separator - one of , ; and tab
 * @param decimalComma - numbers are written with a decimal comma
 * @param limits - rows, fields per line, characters per field and filled cells
 * @returns `rows`: rows[r - 1][c - 1] as readDelimited builds them (trailing blank lines kept);
 *   or `stoppedAt`: the start of the record that exceeds a cap or holds a quote never closed
 * @example
 * scanDelimitedRows('a,b\n1,', ',', false, importLimits).rows
 * // [[{ text: 'a', … }, { text: 'b', … }], [{ text: '1', value: 1, kind: 'number' }]]
 */
export function scanDelimitedRows(
  text: string,
  separator: string,
  decimalComma: boolean,
  limits: Pick<ImportLimits, 'maxRows' | 'maxColumns' | 'maxCellChars' | 'maxCells'>,
): { rows: (RawCell | null)[][] } | { stoppedAt: RecordStart } {
  const { maxRows, maxColumns, maxCellChars, maxCells } = limits;
  const sep = separator.charCodeAt(0);
  const n = text.length;
  const cells = new SharedCells(decimalComma);
  const rows: (RawCell | null)[][] = [];
  let filled = 0;
  // The record being read, copied at its end into an array of its own width (one allocation).
  const fields: (RawCell | null)[] = [];
  let at = 0;
  while (at < n) {
    const recordAt = at;
    const filledBefore = filled;
    if (rows.length >= maxRows) return stoppedAt(recordAt, rows.length, filledBefore);
    let width = 0;
    // Empty fields not yet written: written only when a filled one follows them.
    let blanks = 0;
    for (let column = 1; ; column++) {
      let cell: RawCell | null;
      if (text.charCodeAt(at) === QUOTE) {
        const f = quotedField(text, at, sep, maxCellChars);
        if (f === null) return stoppedAt(recordAt, rows.length, filledBefore);
        cell = f.text === '' ? null : cells.of(f.text);
        at = f.end;
      } else {
        const stop = Math.min(n, at + maxCellChars + 1);
        let h = 0;
        let i = at;
        for (; i < stop; i++) {
          const c = text.charCodeAt(i);
          if (c === sep || c === LF || c === CR) break;
          h = hashStep(h, c);
        }
        if (i - at > maxCellChars) return stoppedAt(recordAt, rows.length, filledBefore);
        cell = i === at ? null : cells.inText(text, at, i, h);
        at = i;
      }
      if (cell === null) blanks++;
      else {
        if (column > maxColumns || ++filled > maxCells)
          return stoppedAt(recordAt, rows.length, filledBefore);
        for (; blanks > 0; blanks--) fields[width++] = null;
        fields[width++] = cell;
      }
      const c = at < n ? text.charCodeAt(at) : LF;
      at++;
      if (c === sep && at < n) continue;
      if (c === CR && text.charCodeAt(at) === LF) at++;
      break;
    }
    rows.push(fields.slice(0, width));
  }
  return { rows };
}

function stoppedAt(at: number, row: number, filled: number): { stoppedAt: RecordStart } {
  return { stoppedAt: { at, row, filled } };
}

/**
 * The quoted field starting at `start`: its text (quotes removed, "" read as one, any text after
 * the closing quote up to the separator or line end kept) and where it ends; null when its quote
 * is never closed or its text is longer than `maxChars`.
 */
function quotedField(
  text: string,
  start: number,
  sep: number,
  maxChars: number,
): { text: string; end: number } | null {
  const n = text.length;
  let q = start;
  for (;;) {
    q = text.indexOf('"', q + 1);
    if (q < 0) return null;
    if (text.charCodeAt(q + 1) !== QUOTE) break;
    q++;
  }
  // Each "" inside is one character: a field of more than twice the cap is over it whatever it holds.
  if (q - start - 1 > 2 * maxChars) return null;
  let j = q + 1;
  const stop = Math.min(n, j + maxChars + 1);
  while (j < stop) {
    const c = text.charCodeAt(j);
    if (c === sep || c === LF || c === CR) break;
    j++;
  }
  const inside = text.slice(start + 1, q);
  const f = (inside.includes('"') ? inside.replaceAll('""', '"') : inside) + text.slice(q + 1, j);
  return f.length > maxChars ? null : { text: f, end: j };
}
