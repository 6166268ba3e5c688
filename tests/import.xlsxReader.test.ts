// The workbook reader (shared/import/readXlsx.ts), which reads .xlsx XML itself so that its caps
// hold while reading. Checked three ways:
// - against SheetJS (the `xlsx` package, an independent reader) on the demo workbook (written
//   by exceljs) and on a workbook SheetJS itself wrote: every cell's text and type agree;
// - against ECMA-376 Part 1 on hand-written parts a spreadsheet program may write that neither
//   library above writes: namespace prefixes, shared formulas, rich text with phonetic runs,
//   _xHHHH_ escapes, inline strings, the 1904 date system, custom date formats;
// - against the caps: a cell in column XFD, a sheet that declares too many rows.
import { cellAddress, parseAddress } from '../shared/table/cellAddress';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { zipSync } from 'fflate';
import { describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { ImportError, readTrialFile } from '../shared/import';
import type { RawCell, RawWorkbook } from '../shared/import/rawWorkbook';

const demoBytes = new Uint8Array(
  readFileSync(path.join(__dirname, '..', 'demo', 'wrenhollow-n-trials-2025.xlsx')),
);

/** Every non-empty cell as address → [kind, text], the way both readers can be compared. */
function ours(wb: RawWorkbook, sheet: string): Map<string, [string, string]> {
  const s = wb.sheets.find((x) => x.name === sheet)!;
  const out = new Map<string, [string, string]>();
  s.rows.forEach((row, r) =>
    row.forEach((c, col) => {
      if (c && !c.mergedFrom) out.set(cellAddress(r + 1, col + 1), [c.kind, c.text]);
    }),
  );
  return out;
}

/** The same from SheetJS: its cell type (n, s, b, d, e) mapped to ours, and its value as text. */
function theirs(wb: XLSX.WorkBook, sheet: string): Map<string, [string, string]> {
  const ws = wb.Sheets[sheet];
  const kinds: Record<string, string> = {
    n: 'number',
    s: 'text',
    b: 'boolean',
    d: 'date',
    e: 'error',
  };
  const out = new Map<string, [string, string]>();
  for (const [address, cell] of Object.entries(ws)) {
    if (address.startsWith('!')) continue;
    const c = cell as XLSX.CellObject;
    if (c.t === 'z' || (c.t === 's' && c.v === '')) continue;
    const text =
      c.t === 'd'
        ? (c.v as Date).toISOString().slice(0, 10)
        : c.t === 'b'
          ? c.v
            ? 'TRUE'
            : 'FALSE'
          : c.t === 'e'
            ? String(c.w)
            : String(c.v);
    out.set(address, [kinds[c.t], text]);
  }
  return out;
}

describe('readXlsx agrees with SheetJS', () => {
  it('on every cell of every sheet of the demo workbook (written by exceljs)', async () => {
    const wb = await readTrialFile({ name: 'demo.xlsx', bytes: demoBytes });
    const ref = XLSX.read(demoBytes, { cellDates: true, cellFormula: false });
    expect(wb.sheets.map((s) => s.name)).toEqual(ref.SheetNames);
    let compared = 0;
    for (const name of ref.SheetNames) {
      const a = ours(wb, name);
      const b = theirs(ref, name);
      // Numbers shown with fixed decimals ("0.0") keep the shown text in ours: compare values.
      for (const [address, [kind, text]] of b) {
        const mine = a.get(address);
        expect(mine?.[0], `${name}!${address}`).toBe(kind);
        if (kind === 'number') expect(Number(mine![1])).toBeCloseTo(Number(text), 6);
        else expect(mine![1], `${name}!${address}`).toBe(text);
        compared++;
      }
      expect(a.size).toBe(b.size);
    }
    expect(compared).toBeGreaterThan(500);
  });

  it('on a workbook SheetJS wrote: numbers, text, dates, booleans, a cached formula, a merge, a hidden row and sheet', async () => {
    const ws = XLSX.utils.aoa_to_sheet(
      [
        ['Site', 'Sown', 'N rate (kg N/ha)', 'Yield (t/ha)', 'Checked'],
        ['Fernley Gate', new Date(Date.UTC(2025, 3, 14)), 0, 6.25, true],
        ['', new Date(Date.UTC(2025, 3, 14)), 60, 7.5, false],
      ],
      { cellDates: true },
    );
    ws['D4'] = { t: 'n', v: 8.1, f: 'D3+0.6' };
    ws['!ref'] = 'A1:E4';
    ws['!merges'] = [XLSX.utils.decode_range('A2:A4')];
    ws['!rows'] = [{}, {}, { hidden: true }];
    const book = XLSX.utils.book_new();
    XLSX.utils.book_append_sheet(book, ws, 'Plots');
    XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet([['key']]), 'Notes');
    book.Workbook = { Sheets: [{ Hidden: 0 }, { Hidden: 1 }] };
    const bytes = new Uint8Array(XLSX.write(book, { type: 'array', bookType: 'xlsx' }));
    const wb = await readTrialFile({ name: 'sheetjs.xlsx', bytes });
    const plots = wb.sheets[0];
    const cell = (a: string): RawCell | undefined => {
      const at = parseAddress(a)!;
      return plots.rows[at.row - 1]?.[at.col - 1] ?? undefined;
    };
    expect(wb.sheets.map((s) => [s.name, s.hidden])).toEqual([
      ['Plots', false],
      ['Notes', true],
    ]);
    expect(cell('A1')?.text).toBe('Site');
    expect(cell('B2')).toMatchObject({ kind: 'date', text: '2025-04-14' });
    expect(cell('C3')).toMatchObject({ kind: 'number', value: 60 });
    expect(cell('E2')).toMatchObject({ kind: 'boolean', text: 'TRUE' });
    expect(cell('D4')).toMatchObject({ kind: 'number', value: 8.1, formula: 'D3+0.6' });
    expect(cell('A4')).toMatchObject({ text: 'Fernley Gate', mergedFrom: 'A2' });
    expect(plots.hiddenRows).toEqual([3]);
  });
});

/** An .xlsx zip of hand-written parts (ECMA-376 Part 1 and Part 2 package layout). */
function handWritten(
  sheetXml: string,
  extra: { strings?: string; styles?: string; pr?: string; dimension?: string } = {},
) {
  const enc = (s: string) => new TextEncoder().encode(s);
  const rel = (id: string, type: string, target: string) =>
    `<Relationship Id="${id}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/${type}" Target="${target}"/>`;
  return zipSync({
    '[Content_Types].xml': enc('<?xml version="1.0"?><Types/>'),
    '_rels/.rels': enc(
      `<Relationships>${rel('rId1', 'officeDocument', 'xl/workbook.xml')}</Relationships>`,
    ),
    'xl/workbook.xml': enc(
      `<x:workbook xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="r"><x:workbookPr ${extra.pr ?? ''}/><x:sheets><x:sheet name="Trial &amp; notes" sheetId="1" r:id="rId1"/></x:sheets></x:workbook>`,
    ),
    'xl/_rels/workbook.xml.rels': enc(
      `<Relationships>${rel('rId1', 'worksheet', 'worksheets/sheet1.xml')}${rel('rId2', 'sharedStrings', 'sharedStrings.xml')}${rel('rId3', 'styles', 'styles.xml')}</Relationships>`,
    ),
    'xl/worksheets/sheet1.xml': enc(
      `<x:worksheet xmlns:x="main">${extra.dimension ? `<x:dimension ref="${extra.dimension}"/>` : ''}<x:sheetData>${sheetXml}</x:sheetData></x:worksheet>`,
    ),
    'xl/sharedStrings.xml': enc(`<x:sst xmlns:x="main">${extra.strings ?? ''}</x:sst>`),
    'xl/styles.xml': enc(`<x:styleSheet xmlns:x="main">${extra.styles ?? ''}</x:styleSheet>`),
  });
}

describe('readXlsx reads parts as ECMA-376 Part 1 defines them', () => {
  it('prefixed elements, shared strings with rich text and phonetic runs, escapes, shared formulas and inline strings', async () => {
    const strings =
      '<x:si><x:r><x:t xml:space="preserve">Yield </x:t></x:r><x:r><x:t>(t/ha)</x:t></x:r><x:rPh sb="0" eb="1"><x:t>ignored</x:t></x:rPh></x:si>' +
      '<x:si><x:t>Plot_x000D_</x:t></x:si><x:si><x:t>N &lt; 60</x:t></x:si>';
    const bytes = handWritten(
      '<x:row r="1"><x:c r="A1" t="s"><x:v>0</x:v></x:c><x:c r="B1" t="s"><x:v>1</x:v></x:c><x:c r="C1" t="inlineStr"><x:is><x:t>Note</x:t></x:is></x:c></x:row>' +
        '<x:row r="2"><x:c r="A2"><x:f t="shared" ref="A2:A3" si="0">B2*2</x:f><x:v>12</x:v></x:c><x:c r="B2"><x:v>6</x:v></x:c><x:c r="C2" t="s"><x:v>2</x:v></x:c></x:row>' +
        '<x:row r="3" hidden="1"><x:c r="A3"><x:f t="shared" si="0"/></x:c><x:c r="B3" t="e"><x:v>#DIV/0!</x:v></x:c></x:row>',
      { strings },
    );
    const wb = await readTrialFile({ name: 'hand.xlsx', bytes });
    const s = wb.sheets[0];
    expect(s.name).toBe('Trial & notes');
    expect(s.rows[0].map((c) => c?.text)).toEqual(['Yield (t/ha)', 'Plot\r', 'Note']);
    expect(s.rows[1][0]).toMatchObject({ kind: 'number', value: 12, formula: 'B2*2' });
    expect(s.rows[1][2]?.text).toBe('N < 60');
    // The shared formula's second cell has no cached value: flagged, with the formula's text.
    expect(s.rows[2][0]).toMatchObject({ formulaMissingResult: true, formula: 'B2*2' });
    expect(s.rows[2][1]).toMatchObject({ kind: 'error', text: '#DIV/0!' });
    expect(s.hiddenRows).toEqual([3]);
  });

  it('dates by built-in and custom formats, in the 1900 and the 1904 systems; fixed decimals as shown', async () => {
    // Serial 45658 is 2025-01-01 in the 1900 system (§18.17.4.1); the 1904 system adds 1462 days.
    const styles =
      '<x:numFmts><x:numFmt numFmtId="164" formatCode="dd/mm/yyyy"/><x:numFmt numFmtId="165" formatCode="0.0 &quot;kg&quot;"/></x:numFmts>' +
      '<x:cellXfs><x:xf numFmtId="0"/><x:xf numFmtId="14"/><x:xf numFmtId="164"/><x:xf numFmtId="2"/><x:xf numFmtId="165"/></x:cellXfs>';
    const row =
      '<x:row r="1"><x:c r="A1" s="1"><x:v>45658</x:v></x:c><x:c r="B1" s="2"><x:v>45658.5</x:v></x:c><x:c r="C1" s="3"><x:v>7.5</x:v></x:c><x:c r="D1" s="4"><x:v>7.25</x:v></x:c><x:c r="E1"><x:v>45658</x:v></x:c></x:row>';
    const in1900 = (await readTrialFile({ name: 'd.xlsx', bytes: handWritten(row, { styles }) }))
      .sheets[0].rows[0];
    expect(in1900.map((c) => [c?.kind, c?.text])).toEqual([
      ['date', '2025-01-01'],
      ['date', '2025-01-01'],
      ['number', '7.50'],
      ['number', '7.25'],
      ['number', '45658'],
    ]);
    const in1904 = (
      await readTrialFile({
        name: 'd.xlsx',
        bytes: handWritten(row, { styles, pr: 'date1904="1"' }),
      })
    ).sheets[0].rows[0];
    // 1904-01-01 + 45658 days (Python's datetime, an independent calendar).
    expect(in1904[0]?.text).toBe('2029-01-02');
  });
});

describe('readXlsx holds its caps while reading', () => {
  async function refusal(bytes: Uint8Array, limits = {}): Promise<ImportError> {
    try {
      await readTrialFile({ name: 'capped.xlsx', bytes }, limits);
    } catch (e) {
      return e as ImportError;
    }
    throw new Error('not refused');
  }

  it('refuses a cell in the last column, naming it, instead of widening every row', async () => {
    const rows = Array.from(
      { length: 3 },
      (_, i) =>
        `<x:row r="${i + 1}"><x:c r="A${i + 1}"><x:v>1</x:v></x:c><x:c r="XFD${i + 1}"><x:v>1</x:v></x:c></x:row>`,
    ).join('');
    const e = await refusal(handWritten(rows));
    expect(e.code).toBe('too-many-columns');
    expect(e.where).toEqual({ file: 'capped.xlsx', sheet: 'Trial & notes', cell: 'XFD1' });
    expect(e.message).toMatch(/beyond the 1,024 columns Plotrate reads/);
  });

  it('keeps a sparse row sparse: a far cell within the cap costs one entry, not the gap', async () => {
    const bytes = handWritten(
      '<x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c><x:c r="AMJ1"><x:v>2</x:v></x:c></x:row>',
    );
    const row = (await readTrialFile({ name: 's.xlsx', bytes })).sheets[0].rows[0];
    expect(row.length).toBe(1024);
    expect(Object.keys(row)).toEqual(['0', '1023']);
    expect(row[1023]?.value).toBe(2);
  });

  it('refuses a sheet that declares more rows than the cap before reading its cells', async () => {
    const bytes = handWritten('<x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c></x:row>', {
      dimension: 'A1:D300000',
    });
    const e = await refusal(bytes);
    expect(e.code).toBe('too-many-rows');
    expect(e.message).toMatch(/has 300,000 rows, more than the limit of 250,000/);
  });
  // 32,767 characters: the most an Excel worksheet cell holds (Microsoft KB 211878).
  it.each([
    [
      'a shared string',
      '<x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c><x:c r="B1" t="s"><x:v>0</x:v></x:c></x:row>',
    ],
    [
      'an inline string',
      '<x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c><x:c r="B1" t="inlineStr"><x:is><x:t>LONG</x:t></x:is></x:c></x:row>',
    ],
  ])('refuses %s longer than a spreadsheet cell holds, naming the cell', async (_, row) => {
    const book = (text: string) =>
      handWritten(row.replace('LONG', text), { strings: `<x:si><x:t>${text}</x:t></x:si>` });
    const e = await refusal(book('n'.repeat(32_768)));
    expect(e.code).toBe('cell-too-long');
    expect(e.where).toEqual({ file: 'capped.xlsx', sheet: 'Trial & notes', cell: 'B1' });
    expect(e.message).toMatch(/cell B1 holds more than 32,767 characters/);
    // One character less is a cell like any other.
    const read = await readTrialFile({ name: 'ok.xlsx', bytes: book('n'.repeat(32_767)) });
    expect(read.sheets[0].rows[0][1]?.text).toHaveLength(32_767);
  });

  it('refuses a workbook with more filled cells than the cap, naming the first cell past it', async () => {
    const rows = Array.from(
      { length: 4 },
      (_, i) =>
        `<x:row r="${i + 1}">${['A', 'B', 'C'].map((c) => `<x:c r="${c}${i + 1}"><x:v>${i}</x:v></x:c>`).join('')}</x:row>`,
    ).join('');
    const e = await refusal(handWritten(rows), { maxCells: 10 });
    expect(e.code).toBe('too-many-cells');
    expect(e.where).toEqual({ file: 'capped.xlsx', sheet: 'Trial & notes', cell: 'B4' });
    const read = await readTrialFile(
      { name: 'ok.xlsx', bytes: handWritten(rows) },
      { maxCells: 12 },
    );
    expect(read.sheets[0].rows).toHaveLength(4);
  });

  it('shares one cell among the cells of one shared string', async () => {
    const rows =
      '<x:row r="1"><x:c r="A1" t="s"><x:v>0</x:v></x:c><x:c r="B1" t="s"><x:v>0</x:v></x:c></x:row>';
    const bytes = handWritten(rows, { strings: '<x:si><x:t>Rep</x:t></x:si>' });
    const [a, b] = (await readTrialFile({ name: 's.xlsx', bytes })).sheets[0].rows[0];
    expect(a).toEqual({ kind: 'text', value: 'Rep', text: 'Rep' });
    expect(a).toBe(b);
  });
});
