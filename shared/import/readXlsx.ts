/**
 * An .xlsx workbook as a RawWorkbook, through exceljs. Called only after
 * guardZip has checked the unzipped size. Keeps what the user saw: the cached
 * result of a formula (flagging a formula saved without one), the top-left
 * value of a merged range, hidden sheets and rows, dates as dates.
 */
import ExcelJS from 'exceljs';
import type { SourceFile } from '../table/plotTable';
import { ImportError } from './importError';
import { importLimits, type ImportLimits } from './importLimits';
import {
  cellAddress,
  type RawCell,
  type RawSheet,
  type RawValue,
  type RawWorkbook,
} from './rawWorkbook';

function isoDate(d: Date): string {
  return Number.isNaN(d.getTime()) ? '' : d.toISOString().slice(0, 10);
}

function numberText(v: number, numFmt: string | undefined): string {
  // Fixed-decimal formats ("0.0", "#,##0.00") are shown as the sheet shows them.
  const m = numFmt ? /^[#,]*0(?:\.(0+))?$/.exec(numFmt.trim()) : null;
  if (m) return v.toFixed(m[1] ? m[1].length : 0);
  return String(v);
}

type Plain = { kind: RawCell['kind']; value: RawValue; text: string };

function plain(v: unknown, numFmt: string | undefined): Plain {
  if (v === null || v === undefined) return { kind: 'blank', value: null, text: '' };
  if (typeof v === 'number') return { kind: 'number', value: v, text: numberText(v, numFmt) };
  if (typeof v === 'string')
    return { kind: v === '' ? 'blank' : 'text', value: v === '' ? null : v, text: v };
  if (typeof v === 'boolean') return { kind: 'boolean', value: v, text: v ? 'TRUE' : 'FALSE' };
  if (v instanceof Date) return { kind: 'date', value: v, text: isoDate(v) };
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    if (Array.isArray(o.richText)) {
      const text = (o.richText as { text?: string }[]).map((r) => r.text ?? '').join('');
      return { kind: text === '' ? 'blank' : 'text', value: text || null, text };
    }
    if ('error' in o) return { kind: 'error', value: null, text: String(o.error) };
    if ('hyperlink' in o || 'text' in o) {
      const inner = o.text;
      return typeof inner === 'object' ? plain(inner, numFmt) : plain(String(inner ?? ''), numFmt);
    }
  }
  return { kind: 'text', value: String(v), text: String(v) };
}

/**
 * Reads an .xlsx workbook.
 * @param file - name, size and hash of the file
 * @param bytes - the file (already checked by guardZip)
 * @param limits - row cap per sheet
 * @returns every sheet with its cells
 * @throws {ImportError} "corrupt" when exceljs cannot read it; "too-many-rows" naming the sheet
 * @example
 * (await readXlsx(file, bytes)).sheets.map((s) => s.name) // ['Key', 'North Field', …]
 */
export async function readXlsx(
  file: SourceFile,
  bytes: Uint8Array,
  limits: Pick<ImportLimits, 'maxRows'> = importLimits,
): Promise<RawWorkbook> {
  const wb = new ExcelJS.Workbook();
  try {
    // exceljs's types ask for a Buffer; a plain ArrayBuffer copy works in Node and in the browser.
    const ab = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
    await wb.xlsx.load(ab as ArrayBuffer as never);
  } catch (e) {
    const why = e instanceof Error ? e.message.split('\n')[0].slice(0, 160) : String(e);
    throw new ImportError(
      'corrupt',
      `"${file.name}" could not be read as an .xlsx workbook (${why}). Open it in your spreadsheet program, save a fresh copy as .xlsx and import that.`,
      { file: file.name },
    );
  }
  const sheets: RawSheet[] = [];
  for (const ws of wb.worksheets) {
    if (ws.rowCount > limits.maxRows) {
      throw new ImportError(
        'too-many-rows',
        `Sheet "${ws.name}" in "${file.name}" has ${ws.rowCount.toLocaleString('en-US')} rows, more than the limit of ${limits.maxRows.toLocaleString('en-US')}; split it by site or year.`,
        { file: file.name, sheet: ws.name },
      );
    }
    const rows: (RawCell | null)[][] = [];
    const hiddenRows: number[] = [];
    ws.eachRow({ includeEmpty: false }, (row, r) => {
      if (row.hidden) hiddenRows.push(r);
      const cells: (RawCell | null)[] = [];
      row.eachCell({ includeEmpty: false }, (cell, c) => {
        const address = cellAddress(r, c);
        let raw: RawCell;
        if (cell.isMerged && cell.master && cell.master.address !== cell.address) {
          const m = plain(cell.master.value, cell.master.numFmt);
          const mv = cell.master.value as { result?: unknown } | null;
          const value =
            mv && typeof mv === 'object' && 'formula' in mv
              ? plain(mv.result, cell.master.numFmt)
              : m;
          raw = { address, ...value, mergedFrom: cell.master.address };
        } else {
          const v = cell.value as unknown;
          if (v && typeof v === 'object' && ('formula' in v || 'sharedFormula' in v)) {
            const f = v as { formula?: string; sharedFormula?: string; result?: unknown };
            const res = f.result;
            const formula = f.formula ?? f.sharedFormula ?? '';
            if (res === undefined || res === null) {
              raw = {
                address,
                kind: 'blank',
                value: null,
                text: '',
                formula,
                formulaMissingResult: true,
              };
            } else {
              const p = plain(
                typeof res === 'object' && res && 'error' in res ? res : res,
                cell.numFmt,
              );
              raw = { address, ...p, formula };
            }
          } else {
            raw = { address, ...plain(v, cell.numFmt) };
          }
        }
        if (raw.kind === 'blank' && !raw.formula && !raw.mergedFrom) return;
        while (cells.length < c - 1) cells.push(null);
        cells[c - 1] = raw;
      });
      while (rows.length < r - 1) rows.push([]);
      rows[r - 1] = cells;
    });
    while (rows.length > 0 && rows[rows.length - 1].every((c) => c === null)) rows.pop();
    sheets.push({
      name: ws.name,
      hidden: ws.state === 'hidden' || ws.state === 'veryHidden',
      hiddenRows,
      rows,
      decimalComma: false,
    });
  }
  return { file, format: 'xlsx', sheets };
}
