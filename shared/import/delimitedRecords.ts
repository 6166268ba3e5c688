/**
 * The records of a delimited text file, one at a time, with the caps checked while reading:
 * fields per line (`maxColumns`: empty fields past it are dropped, a value past it is refused),
 * characters per field (`maxCellChars`) and records (`maxRows`). A file of one 50 MB line stops
 * at the first value past 1,024 fields or 32,767 characters instead of being split whole.
 * Quoting follows RFC 4180 (double quotes, "" for a quote inside, line breaks allowed inside
 * quotes); text after a closing quote up to the separator is kept, as spreadsheet programs do.
 *
 * Unquoted fields are cut from the text with `slice`, never built a character at a time: a
 * long field costs one copy, and the reader stays linear in the file.
 */
import { cellAddress } from '../table/cellAddress';
import { ImportError } from './importError';
import type { ImportLimits } from './importLimits';
import { cellTooLong, tooManyColumns, tooManyRows } from './limitErrors';

export type DelimitedLimits = Pick<ImportLimits, 'maxRows' | 'maxColumns' | 'maxCellChars'>;

const QUOTE = 34; // "
const LF = 10;
const CR = 13;

/**
 * Reads records from `text` under the caps; `next()` gives each in turn, then null. Rows are
 * counted in records, as the cells' addresses are (a line break inside quotes stays in its row).
 */
export class DelimitedRecords {
  private at = 0;
  private row = 0;
  private readonly sep: number;

  /**
   * @param text - the decoded file
   * @param separator - one of , ; and tab
   * @param file - the file's name, for messages
   * @param limits - the caps checked while reading
   * @param from - where to start: a record's offset in the text and the records before it
   *   (readDelimited reads on from where scanDelimitedRows stopped)
   */
  constructor(
    private readonly text: string,
    separator: string,
    private readonly file: string,
    private readonly limits: DelimitedLimits,
    from: { at: number; row: number } = { at: 0, row: 0 },
  ) {
    this.sep = separator.charCodeAt(0);
    this.at = from.at;
    this.row = from.row;
  }

  /**
   * The next record's fields, or null after the last.
   * @returns the fields as written (quotes removed), in order
   * @throws {ImportError} "too-many-rows", "too-many-columns" or "cell-too-long" naming the row
   *   or cell; "bad-text" for a quote never closed
   */
  next(): string[] | null {
    const { text, sep } = this;
    const n = text.length;
    if (this.at >= n) return null;
    this.row++;
    if (this.row > this.limits.maxRows) throw tooManyRows({ file: this.file }, this.limits.maxRows);
    const fields: string[] = [];
    for (let column = 1; ; column++) {
      const field = text.charCodeAt(this.at) === QUOTE ? this.quoted(column) : this.plain(column);
      if (column <= this.limits.maxColumns) fields.push(field);
      else if (field !== '') {
        // Empty fields past the cap (a sheet saved with trailing separators) cost nothing and
        // are dropped; a value there is refused, as the .xlsx reader refuses a cell there.
        throw tooManyColumns(
          { file: this.file },
          cellAddress(this.row, column),
          this.limits.maxColumns,
        );
      }
      const c = this.at < n ? text.charCodeAt(this.at) : LF;
      this.at++;
      if (c === sep) {
        // A separator at the very end of the file still ends a (last, empty) field.
        if (this.at >= n && column < this.limits.maxColumns) fields.push('');
        if (this.at < n) continue;
      }
      if (c === CR && text.charCodeAt(this.at) === LF) this.at++;
      return fields;
    }
  }

  /** A field without quotes: up to the separator or the line's end. */
  private plain(column: number): string {
    const { text, sep } = this;
    const start = this.at;
    const stop = Math.min(text.length, start + this.limits.maxCellChars + 1);
    let i = start;
    for (; i < stop; i++) {
      const c = text.charCodeAt(i);
      if (c === sep || c === LF || c === CR) break;
    }
    if (i - start > this.limits.maxCellChars) throw this.tooLong(column, false);
    this.at = i;
    return text.slice(start, i);
  }

  /** A field in double quotes, with "" read as one quote and any text after the closing quote kept. */
  private quoted(column: number): string {
    const { text, sep } = this;
    const n = text.length;
    const pieces: string[] = [];
    let length = 0;
    let i = this.at + 1;
    for (;;) {
      const q = text.indexOf('"', i);
      const end = q < 0 ? n : q;
      length += end - i;
      if (length > this.limits.maxCellChars) throw this.tooLong(column, true);
      pieces.push(text.slice(i, end));
      if (q < 0) {
        throw new ImportError(
          'bad-text',
          `"${this.file}", row ${this.row}: a quoted field starts there and is never closed; check for a stray double quote (") in that row and save the file again.`,
          { file: this.file, cell: `row ${this.row}` },
        );
      }
      if (text.charCodeAt(q + 1) === QUOTE) {
        pieces.push('"');
        length++;
        i = q + 2;
        continue;
      }
      i = q + 1;
      break;
    }
    let j = i;
    while (j < n) {
      const c = text.charCodeAt(j);
      if (c === sep || c === LF || c === CR) break;
      j++;
    }
    if (length + (j - i) > this.limits.maxCellChars) throw this.tooLong(column, true);
    if (j > i) pieces.push(text.slice(i, j));
    this.at = j;
    return pieces.length === 1 ? pieces[0] : pieces.join('');
  }

  private tooLong(column: number, quoted: boolean): ImportError {
    return cellTooLong(
      { file: this.file },
      cellAddress(this.row, column),
      this.limits.maxCellChars,
      quoted
        ? 'a quoted field that runs on usually means a stray double quote (") joined it to the lines below; check that cell'
        : 'check that this is the trial table, saved with line breaks between rows',
    );
  }
}
