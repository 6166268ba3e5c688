// Files that are not trial sheets, or that fight back, get an ImportError whose
// message says what the file is and what to do. Legacy .xls, .ods and the
// encrypted container are written by SheetJS (an independent writer); the zip
// bombs are hand-built deflate streams (tests/fixtures/import/zipBomb.ts).
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { unzipSync, zipSync } from 'fflate';
import { ImportError, readTrialFile, guardZip } from '../shared/import';
import { zipBombXlsx } from './fixtures/import/zipBomb';
import { writeZip } from './fixtures/import/writeZip';

const demo = new Uint8Array(
  readFileSync(path.join(__dirname, '..', 'demo', 'wrenhollow-n-trials-2025.xlsx')),
);

async function refusal(name: string, bytes: Uint8Array, limits = {}): Promise<ImportError> {
  try {
    await readTrialFile({ name, bytes }, limits);
  } catch (e) {
    expect(e).toBeInstanceOf(ImportError);
    return e as ImportError;
  }
  throw new Error(`${name} was accepted`);
}

function sheetjsBook(bookType: 'xls' | 'ods' | 'xlsx'): Uint8Array {
  const wb = XLSX.utils.book_new();
  XLSX.utils.book_append_sheet(
    wb,
    XLSX.utils.aoa_to_sheet([
      ['Plot', 'Yield (bu/ac)'],
      [101, 201.5],
    ]),
    'Trial',
  );
  return new Uint8Array(XLSX.write(wb, { type: 'buffer', bookType }));
}

describe('readTrialFile refuses files it cannot read, saying what to do', () => {
  it('a legacy Excel 97–2003 workbook', async () => {
    const e = await refusal('old trial.xls', sheetjsBook('xls'));
    expect(e.code).toBe('legacy-xls');
    expect(e.message).toBe(
      '"old trial.xls" is a legacy Excel 97–2003 file (.xls); open it and save as .xlsx (Excel Workbook), then import the .xlsx.',
    );
  });

  it('a legacy workbook renamed to .xlsx is still recognized by its bytes', async () => {
    expect((await refusal('renamed.xlsx', sheetjsBook('xls'))).code).toBe('legacy-xls');
  });

  it('an OpenDocument spreadsheet', async () => {
    const e = await refusal('trial.ods', sheetjsBook('ods'));
    expect(e.code).toBe('ods');
    expect(e.message).toMatch(
      /^"trial\.ods" is an OpenDocument spreadsheet \(\.ods\); open it and save as \.xlsx/,
    );
  });

  it('a password-protected workbook (OLE2 container with an EncryptedPackage stream)', async () => {
    // [MS-OFFCRYPTO] 2.3.4.4: an encrypted OOXML file is a compound file with EncryptionInfo and EncryptedPackage.
    const cfb = XLSX.CFB.utils.cfb_new();
    XLSX.CFB.utils.cfb_add(cfb, '/EncryptionInfo', new Uint8Array(200).fill(4));
    XLSX.CFB.utils.cfb_add(cfb, '/EncryptedPackage', new Uint8Array(6000).fill(7));
    const e = await refusal(
      'locked.xlsx',
      new Uint8Array(XLSX.CFB.write(cfb, { type: 'buffer' }) as Uint8Array),
    );
    expect(e.code).toBe('encrypted');
    expect(e.message).toMatch(
      /^"locked\.xlsx" is protected with a password\. .*remove the password/,
    );
  });

  it('an empty file, a PDF, a Word document and random binary', async () => {
    expect((await refusal('empty.csv', new Uint8Array())).message).toBe(
      '"empty.csv" is empty (0 bytes); choose the saved trial file.',
    );
    expect((await refusal('x.xlsx', new TextEncoder().encode('%PDF-1.7\n...'))).message).toMatch(
      /is a PDF/,
    );
    const docx = zipSync({
      '[Content_Types].xml': new Uint8Array(3),
      'word/document.xml': new Uint8Array(3),
    });
    expect((await refusal('notes.xlsx', docx)).message).toBe(
      '"notes.xlsx" is a Word document, not a trial workbook; import an .xlsx, .csv or .tsv file.',
    );
    const bin = new Uint8Array(512).map((_, i) => (i * 37) % 256);
    expect((await refusal('blob.csv', bin)).code).toBe('not-a-workbook');
  });

  it('a workbook cut short', async () => {
    const e = await refusal('cut.xlsx', demo.subarray(0, Math.floor(demo.length * 0.6)));
    expect(e.code).toBe('corrupt');
    expect(e.message).toMatch(
      /^"cut\.xlsx" looks like an \.xlsx workbook but is damaged \(the zip directory at its end is missing/,
    );
  });

  it('plain text under a workbook name', async () => {
    const e = await refusal('renamed.xlsx', new TextEncoder().encode('Plot,Yield\n101,201.5\n'));
    expect(e.code).toBe('not-a-workbook');
    expect(e.message).toBe(
      '"renamed.xlsx" is named as an .xlsx workbook but holds plain text, not a workbook: it is damaged or was renamed. If it is a CSV export, rename it to .csv; otherwise save it again as .xlsx from your spreadsheet program.',
    );
  });

  it('a workbook with damaged compressed data', async () => {
    const bad = demo.slice();
    for (let i = 2000; i < 2400; i++) bad[i] ^= 0x5a;
    const e = await refusal('damaged.xlsx', bad);
    expect(e.code).toBe('corrupt');
    expect(e.message).toMatch(/damaged|could not be read/);
  });

  it('a workbook whose part does not match its CRC-32', async () => {
    // PKWARE APPNOTE 4.4.7: each central directory entry (signature 0x02014b50) holds the part's
    // CRC-32 at offset 16. One changed bit there must be refused, not read as if all were well.
    const bad = demo.slice();
    const view = new DataView(bad.buffer);
    let at = -1;
    for (let i = bad.length - 22; i >= 0; i--) {
      if (view.getUint32(i, true) === 0x06054b50) {
        at = view.getUint32(i + 16, true); // first central directory entry
        break;
      }
    }
    bad[at + 16] ^= 0x01;
    const e = await refusal('crc.xlsx', bad);
    expect(e.code).toBe('corrupt');
    expect(e.message).toMatch(
      /^"crc\.xlsx" looks like an \.xlsx workbook but is damaged \(the part ".*" does not match its checksum\)/,
    );
  });

  it('a zip with workbook parts that are not XML', async () => {
    const junk = zipSync({
      '[Content_Types].xml': new TextEncoder().encode('not xml'),
      'xl/workbook.xml': new TextEncoder().encode('<<<'),
    });
    const e = await refusal('junk.xlsx', junk);
    expect(e.code).toBe('corrupt');
    expect(e.message).toMatch(
      /^"junk\.xlsx" could not be read as an \.xlsx workbook \(.*\)\. Open it in your spreadsheet program, save a fresh copy as \.xlsx and import that\.$/,
    );
  });
});

describe('limits', () => {
  it('refuses a file above the size cap, naming the cap', async () => {
    const e = await refusal('big.csv', new Uint8Array(2048).fill(0x41), { maxFileBytes: 1024 });
    expect(e.code).toBe('file-too-large');
    expect(e.message).toBe(
      '"big.csv" is 2 KiB, more than the limit of 1 KiB for one file; a trial workbook is usually under 5 MB. Split it by site or year.',
    );
  });

  it('refuses a zip bomb whose declared size is honest, from the directory alone', async () => {
    const bomb = zipBombXlsx(1 << 30, true);
    expect(bomb.length).toBeLessThan(1.1e6); // about 1 MB inflating to 1 GiB
    const e = await refusal('bomb.xlsx', bomb);
    expect(e.code).toBe('uncompressed-too-large');
    expect(e.message).toMatch(
      /^"bomb\.xlsx" declares 1(\.0)? GiB of contents, more than the limit of 96 MiB/,
    );
  });

  it('refuses a zip bomb whose declared sizes lie, while inflating, stopping at the cap', async () => {
    const bomb = zipBombXlsx(1 << 30, false);
    const e = await refusal('liar.xlsx', bomb, {
      maxUncompressedBytes: 32 * 1024 * 1024,
      maxCompressionRatio: 2000,
    });
    expect(e.code).toBe('uncompressed-too-large');
    expect(e.message).toMatch(
      /^"liar\.xlsx" unzips to more than that \(its declared sizes are false\), more than the limit of 32 MiB/,
    );
  });

  it('refuses a lying zip bomb by its expansion ratio after a few MB', async () => {
    const e = await refusal('liar.xlsx', zipBombXlsx(1 << 30, false));
    expect(e.code).toBe('uncompressed-too-large');
    expect(e.message).toBe(
      '"liar.xlsx" has a part ("xl/worksheets/sheet1.xml") that expands more than 400-fold when unzipped, the limit for a workbook part; real sheets expand 5–50-fold, so this file is built to exhaust memory (a "zip bomb"). It was not opened.',
    );
  });

  it('guardZip measures the true unzipped size of a real workbook', () => {
    const size = guardZip('demo.xlsx', demo);
    // Independent count: fflate's one-shot unzip of every part, lengths summed.
    const sum = Object.values(unzipSync(demo)).reduce((t, f) => t + f.length, 0);
    expect(size).toBe(sum);
  });

  it('refuses a zip with too many parts', async () => {
    const entries = Array.from({ length: 30 }, (_, i) => ({
      name: i === 0 ? 'xl/workbook.xml' : `p${i}`,
      data: new Uint8Array(1),
      method: 0 as const,
      declaredSize: 1,
    }));
    const e = await refusal('many.xlsx', writeZip(entries), { maxZipEntries: 20 });
    expect(e.message).toBe(
      '"many.xlsx" holds 30 parts, more than the limit of 20; a trial workbook has a few dozen. Save a copy with only the trial sheets.',
    );
  });

  it('refuses a CSV with more rows than the cap, naming it', async () => {
    const text =
      'Plot,Yield\n' + Array.from({ length: 50 }, (_, i) => `${i},${200 + i}`).join('\n');
    const e = await refusal('long.csv', new TextEncoder().encode(text), { maxRows: 20 });
    expect(e.code).toBe('too-many-rows');
    expect(e.message).toBe(
      '"long.csv" has more than 20 rows, the limit for one file; split it by site or year.',
    );
  });

  it('refuses a CSV line with more fields than the column cap, naming the first cell beyond', async () => {
    const text = 'Plot,Yield\n1,200\n' + '7,'.repeat(2000);
    const e = await refusal('wide.csv', new TextEncoder().encode(text));
    expect(e.code).toBe('too-many-columns');
    expect(e.where).toEqual({ file: 'wide.csv', cell: 'AMK3' });
    expect(e.message).toBe(
      '"wide.csv" has a field at AMK3, beyond the 1,024 columns Plotrate reads; check that the file uses one separator (comma, semicolon or tab) and that its lines end where rows end, or delete the columns right of the trial data, and save again.',
    );
    // 1,024 fields are read, and empty fields past them (trailing separators) are dropped.
    const bytes = new TextEncoder().encode('7,'.repeat(1023) + '7' + ','.repeat(5000) + '\n1,2');
    const rows = (await readTrialFile({ name: 'ok.csv', bytes })).sheets[0].rows;
    expect(rows.map((r) => r.length)).toEqual([1024, 2]);
  });

  // 32,767 characters: the most an Excel worksheet cell holds (Microsoft KB 211878).
  it.each([
    ['a plain field', `Plot,Notes\n1,${'x'.repeat(40_000)}`, /check that this is the trial table/],
    ['a quoted field', `Plot,Notes\n1,"${'x'.repeat(40_000)}"`, /stray double quote/],
    [
      'a quote never closed',
      `Plot,Notes\n1,"oops\n${'2,ok\n'.repeat(10_000)}`,
      /stray double quote/,
    ],
  ])('refuses %s longer than a spreadsheet cell holds, naming the cell', async (_, text, hint) => {
    const e = await refusal('long.csv', new TextEncoder().encode(text));
    expect(e.code).toBe('cell-too-long');
    expect(e.where).toEqual({ file: 'long.csv', cell: 'B2' });
    expect(e.message).toMatch(/^"long\.csv": cell B2 holds more than 32,767 characters/);
    expect(e.message).toMatch(hint);
  });

  it('reads a field of exactly 32,767 characters, plain, quoted or with a doubled quote', async () => {
    const long = 'y'.repeat(32_767);
    for (const [field, text] of [
      [long, long],
      [`"${long}"`, long],
      [`"${long.slice(1)}"""`, `${long.slice(1)}"`],
    ]) {
      const bytes = new TextEncoder().encode(`Plot,Notes\n1,${field}`);
      expect((await readTrialFile({ name: 'ok.csv', bytes })).sheets[0].rows[1][1]?.text).toBe(
        text,
      );
    }
  });

  it('refuses a CSV with more filled cells than the cap, naming the first cell past it', async () => {
    const text =
      'Plot,Yield,Notes\n' + Array.from({ length: 10 }, (_, i) => `${i},${200 + i},`).join('\n');
    const e = await refusal('cells.csv', new TextEncoder().encode(text), { maxCells: 15 });
    expect(e.code).toBe('too-many-cells');
    // Empty fields do not count: 3 headers, then 2 per row; the 16th is the plot of row 8.
    expect(e.where).toEqual({ file: 'cells.csv', cell: 'A8' });
  });

  it('refuses an xlsx sheet with more rows than the cap, naming the sheet', async () => {
    const e = await refusal('demo.xlsx', demo, { maxRows: 20 });
    expect(e.code).toBe('too-many-rows');
    expect(e.message).toMatch(
      /^Sheet "Quillmere North" in "demo\.xlsx" has 28 rows, more than the limit of 20; split it by site or year\.$/,
    );
  });
});
