// The command line's streamed workbook (cli/streamedWorkbook.ts: exceljs's streaming writer,
// with the pictures and late sheet heads it lacks added) against the workspace's in-memory
// workbook of the same report: read back by SheetJS, an independent .xlsx reader (every cell's
// value, type and number format, merges, column widths, filters, print areas and titles), and
// by exceljs (frozen panes, page setup, footers, fonts and fills, every picture and its anchor).
// Nothing may differ: the streamed file is the same workbook written a sheet at a time.
import { Writable } from 'node:stream';
import ExcelJS from 'exceljs';
import { beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { streamWorkbook } from '../cli/streamedWorkbook';
import type { TrialReport } from '../shared/report/trialReport';
import { writeWorkbook, type WorkbookOptions } from '../shared/report/workbook';
import { demoReport } from './report.fixture';

// Two different small valid PNGs (1×1 white, 1×1 black), so a picture swapped between sheets shows.
const png = (b64: string): Uint8Array => Uint8Array.from(Buffer.from(b64, 'base64'));
const white = png(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8/5+hHgAHggJ/PchI7wAAAABJRU5ErkJggg==',
);
const black = png(
  'iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==',
);

/** The streamed workbook's bytes, collected from the stream it is written into. */
async function streamed(report: TrialReport, options: WorkbookOptions): Promise<Uint8Array> {
  const chunks: Buffer[] = [];
  const sink = new Writable({
    write(chunk: Buffer, _encoding, done) {
      chunks.push(chunk);
      done();
    },
  });
  await streamWorkbook(sink, report, options);
  return new Uint8Array(Buffer.concat(chunks));
}

const cases: [string, 'us' | 'metric', boolean][] = [
  ['US units with a chart on every site sheet and across sites', 'us', true],
  ['metric units without charts', 'metric', false],
];

const books: Record<string, { memory: Uint8Array; stream: Uint8Array; report: TrialReport }> = {};

beforeAll(async () => {
  for (const [name, units, charts] of cases) {
    const report = await demoReport(units);
    const options: WorkbookOptions = charts
      ? {
          siteCharts: Object.fromEntries(
            report.sites.map((s, i) => [
              s.site,
              { png: i % 2 ? black : white, widthPx: 800, heightPx: 560 },
            ]),
          ),
          acrossChart: { png: black, widthPx: 800, heightPx: 460 },
        }
      : {};
    books[name] = {
      report,
      memory: await writeWorkbook(report, options),
      stream: await streamed(report, { ...options, zipLevel: 1 }),
    };
  }
});

/** What SheetJS reads of a sheet: every cell (value, type, format), merges, widths, filter. */
function sheetJsView(ws: XLSX.WorkSheet): unknown {
  const cells: Record<string, unknown> = {};
  for (const [address, c] of Object.entries(ws)) {
    if (address.startsWith('!')) continue;
    const cell = c as XLSX.CellObject;
    cells[address] = { t: cell.t, v: cell.v, z: cell.z };
  }
  return {
    ref: ws['!ref'],
    cells,
    merges: ws['!merges'],
    cols: ws['!cols']?.map((c) => c?.wch),
    autofilter: ws['!autofilter'],
  };
}

describe.each(cases.map(([name]) => name))('streamWorkbook, %s', (name) => {
  it('holds what the in-memory workbook holds, read by SheetJS', () => {
    const { memory, stream } = books[name];
    const a = XLSX.read(memory, { cellNF: true, cellStyles: true });
    const b = XLSX.read(stream, { cellNF: true, cellStyles: true });
    expect(b.SheetNames).toEqual(a.SheetNames);
    expect(a.SheetNames.length).toBeGreaterThan(8);
    for (const sheet of a.SheetNames)
      expect(sheetJsView(b.Sheets[sheet]), sheet).toEqual(sheetJsView(a.Sheets[sheet]));
    // Print areas and print titles are defined names, one per sheet that has them.
    expect(b.Workbook?.Names).toEqual(a.Workbook?.Names);
    expect(a.Workbook?.Names?.length).toBeGreaterThan(0);
  });

  it('has the same panes, page setup, styles and pictures, read by exceljs', async () => {
    const { memory, stream, report } = books[name];
    const a = new ExcelJS.Workbook();
    const b = new ExcelJS.Workbook();
    await a.xlsx.load(Buffer.from(memory) as never);
    await b.xlsx.load(Buffer.from(stream) as never);
    expect(b.creator).toBe(a.creator);
    expect(b.created).toEqual(a.created);
    let pictures = 0;
    for (const wa of a.worksheets) {
      const wb = b.getWorksheet(wa.name)!;
      expect(wb, wa.name).toBeDefined();
      expect(wb.views, wa.name).toEqual(wa.views);
      expect(wb.pageSetup, wa.name).toEqual(wa.pageSetup);
      expect(wb.headerFooter, wa.name).toEqual(wa.headerFooter);
      const styles = (ws: ExcelJS.Worksheet) => {
        const out: unknown[] = [];
        // Empty text ("") shows nothing: the in-memory writer keeps it as a cell, the streaming
        // writer (inline strings) leaves it out, and a styled row styles its empty cells anyway.
        // So cells are compared where they hold something, rows by their own style.
        ws.eachRow((row, r) => {
          out.push([r, row.font, row.height]);
          row.eachCell((c, k) => {
            if (c.value !== null && c.value !== '')
              out.push([r, k, c.value, c.font, c.fill, c.border, c.alignment, c.numFmt]);
          });
        });
        return out;
      };
      expect(styles(wb), wa.name).toEqual(styles(wa));
      const pics = (book: ExcelJS.Workbook, ws: ExcelJS.Worksheet) =>
        ws.getImages().map((im) => ({
          range: {
            tl: im.range.tl.nativeCol + im.range.tl.nativeColOff / 1e9,
            row: im.range.tl.nativeRow,
            ext: (im.range as unknown as { ext: unknown }).ext,
          },
          bytes: Buffer.from(book.getImage(Number(im.imageId)).buffer as never).toString('base64'),
        }));
      expect(pics(b, wb), wa.name).toEqual(pics(a, wa));
      pictures += wa.getImages().length;
    }
    // One picture per site sheet and one across sites, or none.
    expect(pictures).toBe(name.includes('without') ? 0 : report.sites.length + 1);
  });
});
