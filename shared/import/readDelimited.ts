/**
 * A CSV, TSV or semicolon-separated text file as a one-sheet RawWorkbook.
 * Quoting follows RFC 4180 (double quotes, "" for a quote inside, line breaks
 * allowed inside quotes); the separator is the one of comma, semicolon and tab
 * that splits the first lines into the same number of fields most often; a
 * decimal comma is recognized when the separator is not a comma.
 */
import type { SourceFile } from '../table/plotTable';
import { ImportError } from './importError';
import { importLimits, type ImportLimits } from './importLimits';
import { parseNumberText } from '../table/parseNumberText';
import { cellAddress, type RawCell, type RawWorkbook } from './rawWorkbook';

type Separator = ',' | ';' | '\t';

function splitRecords(text: string, sep: string, file: string, maxRows: number): string[][] {
  const records: string[][] = [];
  let field = '';
  let record: string[] = [];
  let i = 0;
  const n = text.length;
  let quoteStartRow: number;
  while (i < n) {
    const c = text[i];
    if (c === '"' && field === '') {
      // Quoted field.
      quoteStartRow = records.length + 1;
      i++;
      let closed = false;
      while (i < n) {
        const d = text[i];
        if (d === '"') {
          if (text[i + 1] === '"') {
            field += '"';
            i += 2;
            continue;
          }
          i++;
          closed = true;
          break;
        }
        field += d;
        i++;
      }
      if (!closed) {
        throw new ImportError(
          'bad-text',
          `"${file}", row ${quoteStartRow}: a quoted field starts there and is never closed; check for a stray double quote (") in that row and save the file again.`,
          { file, cell: `row ${quoteStartRow}` },
        );
      }
      // Text after the closing quote up to the separator is kept, as spreadsheet programs do.
      while (i < n && text[i] !== sep && text[i] !== '\n' && text[i] !== '\r') field += text[i++];
      continue;
    }
    if (c === sep) {
      record.push(field);
      field = '';
      i++;
      continue;
    }
    if (c === '\n' || c === '\r') {
      record.push(field);
      records.push(record);
      if (records.length > maxRows) {
        throw new ImportError(
          'too-many-rows',
          `"${file}" has more than ${maxRows.toLocaleString('en-US')} rows, the limit for one file; split it by site or year.`,
          { file },
        );
      }
      record = [];
      field = '';
      i += c === '\r' && text[i + 1] === '\n' ? 2 : 1;
      continue;
    }
    field += c;
    i++;
  }
  if (field !== '' || record.length > 0) {
    record.push(field);
    records.push(record);
  }
  return records;
}

function chooseSeparator(text: string, fileName: string): Separator {
  const lines = text.split(/\r\n|\n|\r/, 60).filter((l) => l.trim() !== '');
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

/**
 * Reads a delimited text file.
 * @param file - name, size and hash of the file
 * @param text - its decoded text
 * @param limits - row cap
 * @returns a RawWorkbook with one sheet named ""
 * @throws {ImportError} "bad-text" for an unclosed quote (naming the row); "too-many-rows"; "no-data"
 * @example
 * readDelimited(file, 'plot;yield\n1;12,5').sheets[0].rows[1][1].value // 12.5
 */
export function readDelimited(
  file: SourceFile,
  text: string,
  limits: Pick<ImportLimits, 'maxRows'> = importLimits,
): RawWorkbook {
  if (text.trim() === '') {
    throw new ImportError('no-data', `"${file.name}" holds no text; choose the saved trial file.`, {
      file: file.name,
    });
  }
  const separator = chooseSeparator(text, file.name);
  const records = splitRecords(text, separator, file.name, limits.maxRows);
  let commaDecimals = 0;
  let dotDecimals = 0;
  if (separator !== ',') {
    for (const r of records.slice(0, 500)) {
      for (const f of r) {
        if (/^\s*-?\d+,\d+\s*$/.test(f)) commaDecimals++;
        else if (/^\s*-?\d+\.\d+\s*$/.test(f)) dotDecimals++;
      }
    }
  }
  const decimalComma = commaDecimals > dotDecimals;
  const rows: (RawCell | null)[][] = records.map((rec, ri) =>
    rec.map((f, ci): RawCell | null => {
      if (f === '') return null;
      const num = parseNumberText(f, decimalComma);
      const address = cellAddress(ri + 1, ci + 1);
      return num === null
        ? { address, text: f, value: f, kind: 'text' }
        : { address, text: f, value: num, kind: 'number' };
    }),
  );
  // Trailing blank lines and columns carry nothing; drop them so they cannot look like missing plots.
  while (rows.length > 0 && rows[rows.length - 1].every((c) => c === null)) rows.pop();
  for (const r of rows) while (r.length > 0 && r[r.length - 1] === null) r.pop();
  return {
    file,
    format: 'csv',
    separator,
    sheets: [{ name: '', hidden: false, hiddenRows: [], rows, decimalComma }],
  };
}
