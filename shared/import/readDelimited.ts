/**
 * A CSV, TSV or semicolon-separated text file as a one-sheet RawWorkbook.
 * Rows are read in one pass by scanDelimitedRows; from a record that meets a cap (rows, fields
 * per line, characters per field, filled cells) or an unclosed quote on, by DelimitedRecords,
 * which names the cell (both: RFC 4180 quoting, caps checked while reading). The separator is
 * the one of comma, semicolon and tab that splits the first lines into the same number of fields
 * most often; a decimal comma is recognized when the separator is not a comma.
 */
import { cellAddress } from '../table/cellAddress';
import type { SourceFile } from '../table/plotTable';
import { ImportError } from './importError';
import { importLimits, type ImportLimits } from './importLimits';
import { DelimitedRecords } from './delimitedRecords';
import { tooManyCells } from './limitErrors';
import type { RawCell, RawWorkbook } from './rawWorkbook';
import { scanDelimitedRows, type RecordStart } from './scanDelimitedRows';
import { SharedCells } from './sharedCells';

export type Separator = ',' | ';' | '\t';

type Limits = Pick<ImportLimits, 'maxRows' | 'maxColumns' | 'maxCellChars' | 'maxCells'>;

/** How much of the file the separator is guessed from: its first lines, however long they are. */
const SEPARATOR_SAMPLE_CHARS = 256 * 1024;

function chooseSeparator(text: string, fileName: string): Separator {
  const lines = text
    .slice(0, SEPARATOR_SAMPLE_CHARS)
    .split(/\r\n|\n|\r/, 60)
    .filter((l) => l.trim() !== '');
  let best: Separator = ',';
  let bestScore = -1;
  const candidates: Separator[] = fileName.toLowerCase().endsWith('.tsv')
    ? ['\t', ';', ',']
    : ['\t', ';', ','];
  for (const sep of candidates) {
    const counts = lines.map((l) => {
      let k = 0;
      let inQuote = false;
      for (const ch of l) {
        if (ch === '"') inQuote = !inQuote;
        else if (ch === sep && !inQuote) k++;
      }
      return k;
    });
    const freq = new Map<number, number>();
    for (const k of counts) if (k > 0) freq.set(k, (freq.get(k) ?? 0) + 1);
    // Score: lines sharing the most common non-zero count, weighted a little by the count.
    let score = 0;
    for (const [k, f] of freq) score = Math.max(score, f * 1000 + k);
    if (score > bestScore) {
      bestScore = score;
      best = sep;
    }
  }
  return best;
}

/** Whether numbers in the first 500 records are written with a decimal comma ("12,5"). */
function writesDecimalComma(records: DelimitedRecords): boolean {
  let commaDecimals = 0;
  let dotDecimals = 0;
  for (let r = 0, rec = records.next(); rec && r < 500; r++, rec = records.next()) {
    for (const f of rec) {
      if (/^\s*-?\d+,\d+\s*$/.test(f)) commaDecimals++;
      else if (/^\s*-?\d+\.\d+\s*$/.test(f)) dotDecimals++;
    }
  }
  return commaDecimals > dotDecimals;
}

/**
 * The rows of the file read record by record with DelimitedRecords: the plain reading, which
 * throws the error that names the cell when a cap is met (scanDelimitedRows gives the same rows
 * for every file this reads without an error; tests/import.csvFastPath.test.ts checks it).
 * @param file - name, size and hash of the file
 * @param text - its decoded text
 * @param separator - one of , ; and tab
 * @param decimalComma - numbers are written with a decimal comma
 * @param limits - caps on rows, fields per line, characters per field and filled cells
 * @param from - the record to start at (its offset, the records and filled cells before it)
 * @returns rows[r - 1][c - 1] from that record on, trailing blank fields left off (trailing
 *   blank lines kept)
 * @throws {ImportError} as {@link readDelimited}
 * @example
 * recordRows(file, 'a;b', ';', true, importLimits)[0][1]?.text // 'b'
 */
export function recordRows(
  file: SourceFile,
  text: string,
  separator: Separator,
  decimalComma: boolean,
  limits: Limits,
  from: RecordStart = { at: 0, row: 0, filled: 0 },
): (RawCell | null)[][] {
  const shared = new SharedCells(decimalComma);
  const records = new DelimitedRecords(text, separator, file.name, limits, from);
  const rows: (RawCell | null)[][] = [];
  let filled = from.filled;
  for (let rec = records.next(); rec; rec = records.next()) {
    // Trailing blank fields carry nothing; they are left off so they cannot look like missing plots.
    let width = rec.length;
    while (width > 0 && rec[width - 1] === '') width--;
    const row: (RawCell | null)[] = [];
    for (let c = 0; c < width; c++) {
      const f = rec[c];
      if (f === '') {
        row.push(null);
        continue;
      }
      if (++filled > limits.maxCells)
        throw tooManyCells(
          { file: file.name },
          cellAddress(from.row + rows.length + 1, c + 1),
          limits.maxCells,
        );
      row.push(shared.of(f));
    }
    rows.push(row);
  }
  return rows;
}

/**
 * Reads a delimited text file.
 * @param file - name, size and hash of the file
 * @param text - its decoded text
 * @param limits - caps on rows, fields per line, characters per field and filled cells
 * @returns a RawWorkbook with one sheet named ""
 * @throws {ImportError} "bad-text" for an unclosed quote (naming the row); "too-many-rows",
 *   "too-many-columns", "cell-too-long" and "too-many-cells" (naming the cell); "no-data"
 * @example
 * readDelimited(file, 'plot;yield\n1;12,5').sheets[0].rows[1][1].value // 12.5
 */
export function readDelimited(
  file: SourceFile,
  text: string,
  limits: Limits = importLimits,
): RawWorkbook {
  if (!/\S/.test(text)) {
    throw new ImportError('no-data', `"${file.name}" holds no text; choose the saved trial file.`, {
      file: file.name,
    });
  }
  const separator = chooseSeparator(text, file.name);
  const decimalComma =
    separator !== ',' &&
    writesDecimalComma(new DelimitedRecords(text, separator, file.name, limits));
  // One pass over the text. A file that meets a cap or holds an unclosed quote is read on record
  // by record from the record that stopped the pass, which names the cell; the pass read the
  // records before it under every cap, so nothing is read twice.
  const scan = scanDelimitedRows(text, separator, decimalComma, limits);
  let rows: (RawCell | null)[][];
  if ('rows' in scan) rows = scan.rows;
  else {
    recordRows(file, text, separator, decimalComma, limits, scan.stoppedAt);
    // Reached only if the two readings disagreed about that record: the plain reading is kept.
    rows = recordRows(file, text, separator, decimalComma, limits);
  }
  // Trailing blank lines carry nothing either (trailing blank fields are left off by the readers).
  while (rows.length > 0 && rows[rows.length - 1].length === 0) rows.pop();
  return {
    file,
    format: 'csv',
    separator,
    sheets: [{ name: '', hidden: false, hiddenRows: [], rows, decimalComma }],
  };
}
