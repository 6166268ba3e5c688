// The one-pass CSV reader (scanDelimitedRows) against two slower readings of the same text:
// - an RFC 4180 reader written here from the grammar of RFC 4180 section 2 (fields separated by
//   the separator, records by CRLF; a field in double quotes may hold separators, line breaks and
//   "" for one quote), with the two extensions Plotrate documents in delimitedRecords.ts (a bare
//   CR or LF also ends a record; text after a closing quote up to the separator is kept, as
//   spreadsheet programs read it);
// - the record-by-record reading (recordRows over DelimitedRecords), which names the cell when
//   a cap is met.
// Inputs: the header corpus (tests/fixtures/import/headers/) and CSV files written here from the
// synthetic trial with quoted fields, embedded line breaks, "" quotes, a BOM, CRLF line ends,
// semicolons and decimal commas.
import { originalAddress } from '../shared/table/originalCell';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { syntheticRows } from '../shared/demo';
import { buildPlotTable } from '../shared/import/buildPlotTable';
import { decodeText } from '../shared/import/decodeText';
import { detectColumns } from '../shared/import/detectColumns';
import { importLimits, type ImportLimits } from '../shared/import/importLimits';
import type { RawCell, RawWorkbook } from '../shared/import/rawWorkbook';
import { readDelimited, recordRows, type Separator } from '../shared/import/readDelimited';
import { readTrialFile } from '../shared/import/readTrialFile';
import { scanDelimitedRows } from '../shared/import/scanDelimitedRows';

type Limits = Pick<ImportLimits, 'maxRows' | 'maxColumns' | 'maxCellChars' | 'maxCells'>;
const file = { name: 'trial.csv', bytes: 0, sha256: '' };

/**
 * RFC 4180 section 2, read one character at a time: record = field *(separator field), records
 * separated by line breaks; a field starting with a double quote runs to the quote not followed
 * by another, "" inside standing for one quote (with the two extensions above).
 */
function rfc4180Records(text: string, sep: string): string[][] {
  const records: string[][] = [];
  const n = text.length;
  const ends = (c: string) => c === sep || c === '\r' || c === '\n';
  let i = 0;
  while (i < n) {
    const fields: string[] = [];
    for (;;) {
      let field = '';
      if (text[i] === '"') {
        for (i++; ;) {
          if (i >= n) throw new Error('a quoted field is never closed');
          if (text[i] === '"' && text[i + 1] === '"') {
            field += '"';
            i += 2;
          } else if (text[i] === '"') {
            i++;
            break;
          } else field += text[i++];
        }
      }
      while (i < n && !ends(text[i])) field += text[i++];
      fields.push(field);
      if (i < n && text[i] === sep) {
        i++;
        if (i < n) continue;
        fields.push('');
        break;
      }
      i += text[i] === '\r' && text[i + 1] === '\n' ? 2 : 1;
      break;
    }
    records.push(fields);
  }
  return records;
}

/** The texts of rows of cells, empty cells as "" and trailing empty fields left off. */
function texts(rows: (RawCell | null)[][]): string[][] {
  return rows.map((row) => Array.from(row, (c) => c?.text ?? ''));
}

function trimmed(records: string[][]): string[][] {
  return records.map((r) => {
    let w = r.length;
    while (w > 0 && r[w - 1] === '') w--;
    return r.slice(0, w);
  });
}

/** One field written per RFC 4180: quoted when it holds the separator, a quote or a line break. */
function csvField(value: string, sep: string): string {
  return value.includes(sep) || /["\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

const notes = [
  '',
  'lodged, after storm',
  'said "wet" spot',
  'two\nlines',
  'ends with CR LF\r\nhere',
  'NA',
  '""',
  ' spaced ',
];

/**
 * The synthetic trial with a notes column, written as a CSV file by the rules of RFC 4180.
 * @returns the text and the fields written, row by row
 */
function writtenCsv(options: {
  sites: number;
  sep: ',' | ';' | '\t';
  decimalComma: boolean;
  lineEnd: '\n' | '\r\n';
}): { text: string; fields: string[][] } {
  const num = (x: number) => (options.decimalComma ? String(x).replace('.', ',') : String(x));
  const header = ['Site', 'Year', 'Block', 'Plot', 'N rate (kg N/ha)', 'Yield (t/ha)', 'Notes'];
  const fields = [header];
  syntheticRows({ sites: options.sites, seed: 5 }).forEach((r, i) =>
    fields.push([
      r.site,
      String(r.year),
      String(r.block),
      String(r.plot),
      num(r.rateLbAc),
      num(Math.round(r.yieldBuAc * 0.628) / 10),
      notes[i % notes.length],
    ]),
  );
  const text =
    fields
      .map((f) => f.map((v) => csvField(v, options.sep)).join(options.sep))
      .join(options.lineEnd) + options.lineEnd;
  return { text, fields };
}

const variants = [
  { sep: ',', decimalComma: false, lineEnd: '\n' },
  { sep: ',', decimalComma: false, lineEnd: '\r\n' },
  { sep: ';', decimalComma: true, lineEnd: '\r\n' },
  { sep: '\t', decimalComma: true, lineEnd: '\n' },
] as const;

const corpusDir = path.join(__dirname, 'fixtures', 'import', 'headers');
const corpus = readdirSync(corpusDir)
  .filter((f) => f.endsWith('.csv'))
  .map((f) => ({ name: f, bytes: new Uint8Array(readFileSync(path.join(corpusDir, f))) }));

describe('scanDelimitedRows', () => {
  it.each(variants)(
    'reads a CSV written per RFC 4180 (separator %#) back to the fields written, as the RFC 4180 reader does',
    (v) => {
      const { text, fields } = writtenCsv({ sites: 3, ...v });
      // The reader written from the RFC recovers what was written (a check of the check).
      expect(rfc4180Records(text, v.sep)).toEqual(fields);
      const scan = scanDelimitedRows(text, v.sep, v.decimalComma, importLimits);
      expect('rows' in scan && texts(scan.rows)).toEqual(trimmed(fields));
    },
  );

  it.each(variants)('gives the same cells as the record-by-record reading (variant %#)', (v) => {
    const { text } = writtenCsv({ sites: 3, ...v });
    expect(scanDelimitedRows(text, v.sep, v.decimalComma, importLimits)).toEqual({
      rows: recordRows(file, text, v.sep, v.decimalComma, importLimits),
    });
  });

  it('reads decimal commas as numbers when the file writes them', () => {
    const { text, fields } = writtenCsv({ sites: 1, sep: ';', decimalComma: true, lineEnd: '\n' });
    const rows = readDelimited(file, text).sheets[0].rows;
    // Row 2, column F: the yield written with a decimal comma, read back by replacing it.
    expect(rows[1][5]?.value).toBe(Number(fields[1][5].replace(',', '.')));
    expect(rows[1][5]?.kind).toBe('number');
  });

  it.each(corpus)('reads %s of the header corpus as RFC 4180 and the plain reading do', (f) => {
    const text = decodeText(f.bytes).text;
    const sep = (readDelimited(file, text).separator ?? ',') as Separator;
    const decimalComma = readDelimited(file, text).sheets[0].decimalComma;
    const scan = scanDelimitedRows(text, sep, decimalComma, importLimits);
    expect('rows' in scan && texts(scan.rows)).toEqual(trimmed(rfc4180Records(text, sep)));
    expect(scan).toEqual({ rows: recordRows(file, text, sep, decimalComma, importLimits) });
  });

  it('stops at the record where the plain reading meets a cap or an unclosed quote', () => {
    const { text } = writtenCsv({ sites: 2, sep: ',', decimalComma: false, lineEnd: '\n' });
    const quotes = `a,"b""c""d"x,e\n`; // the second field is b"c"dx: 6 characters
    // [text, caps, whether the plain reading refuses it]
    const cases: [string, Partial<Limits>, boolean][] = [
      [text, { maxRows: 20 }, true],
      [text, { maxRows: 49 }, false], // header + 48 plots
      [text, { maxColumns: 6 }, true], // the notes are in column G
      [text, { maxCellChars: 8 }, true],
      [text, { maxCellChars: 21 }, false], // the longest note: 21 characters with its CR LF
      [text, { maxCellChars: 20 }, true],
      [text, { maxCells: 100 }, true],
      [`${text}Site 9,2025,1,"open`, {}, true],
      [quotes, { maxCellChars: 6 }, false],
      [quotes, { maxCellChars: 5 }, true],
    ];
    for (const [t, caps, refused] of cases) {
      const limits = { ...importLimits, ...caps };
      const scan = scanDelimitedRows(t, ',', false, limits);
      let plain: unknown;
      try {
        plain = recordRows(file, t, ',', false, limits);
      } catch (e) {
        plain = e;
      }
      expect(plain instanceof Error).toBe(refused);
      if (plain instanceof Error) {
        expect('stoppedAt' in scan).toBe(true);
        if (!('stoppedAt' in scan)) continue;
        // Read on from the record that stopped the pass: the same error as reading it all.
        expect(() => recordRows(file, t, ',', false, limits, scan.stoppedAt)).toThrow(
          plain.message,
        );
        expect(() => readDelimited(file, t, limits)).toThrow(plain.message);
      } else expect(scan).toEqual({ rows: plain });
    }
  });
});

describe('import through the one-pass reader', () => {
  it.each(variants)(
    'builds the same plot table as from the record-by-record rows (variant %#), BOM and all',
    async (v) => {
      const { text } = writtenCsv({ sites: 4, ...v });
      const bytes = new TextEncoder().encode(`\ufeff${text}`);
      const raw = await readTrialFile({ name: 'trial.csv', bytes });
      const sheet = raw.sheets[0];
      const plain: RawWorkbook = {
        ...raw,
        sheets: [
          { ...sheet, rows: recordRows(raw.file, text, v.sep, sheet.decimalComma, importLimits) },
        ],
      };
      const settings = { crop: 'wheat', rateBasis: 'nutrient' } as const;
      const fast = buildPlotTable(raw, detectColumns(raw), settings);
      const slow = buildPlotTable(plain, detectColumns(plain), settings);
      expect(fast).toEqual(slow);
      expect(fast.table.plots).toHaveLength(4 * 24);
      // The notes written with a line break inside quotes come back whole, pointing at column G.
      const twoLines = fast.table.plots.find((p) => p.notes === 'two\nlines');
      expect(originalAddress(twoLines!.original.notes!)).toMatch(/^G\d+$/);
    },
  );
});
