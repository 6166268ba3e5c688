/**
 * An .xlsx workbook as a RawWorkbook, read straight from its XML (ECMA-376 Part 1, §18) so that
 * the caps hold while reading: the zip is unzipped under its size, ratio and checksum checks
 * (unzipChecked), a sheet's declared size and every row number are checked against the row cap
 * and every cell against the column cap before anything is kept, and a row keeps only its cells
 * (a stray value in the last column does not pad every row to 16,384 cells).
 *
 * Keeps what the user saw: the cached result of a formula (flagging a formula saved without
 * one), the top-left value of a merged range in each of its cells, hidden sheets and rows,
 * dates as dates, fixed-decimal numbers as shown.
 */
import { cellAddress, parseAddress } from '../table/cellAddress';
import type { SourceFile } from '../table/plotTable';
import { ImportError } from './importError';
import { importLimits, type ImportLimits } from './importLimits';
import { cellTooLong, tooManyCells, tooManyColumns, tooManyRows } from './limitErrors';
import { type RawCell, type RawSheet, type RawValue, type RawWorkbook } from './rawWorkbook';
import {
  attributes,
  formatCode,
  isDateFormat,
  serialDate,
  stringItemText,
  unescapeXml,
  unescapeXstring,
} from './xlsxXml';
import { unzipChecked } from './zipGuard';

type Limits = Pick<
  ImportLimits,
  | 'maxRows'
  | 'maxColumns'
  | 'maxCellChars'
  | 'maxCells'
  | 'maxUncompressedBytes'
  | 'maxZipEntries'
  | 'maxCompressionRatio'
>;

/** Most cells the merged ranges of one sheet may fill, beyond the cells the sheet holds. */
const MAX_MERGED_CELLS = 1_000_000;

const utf8 = new TextDecoder('utf-8');

function isoDate(d: Date): string {
  return Number.isNaN(d.getTime()) ? '' : d.toISOString().slice(0, 10);
}

function numberText(v: number, numFmt: string | undefined): string {
  // Fixed-decimal formats ("0.0", "#,##0.00") are shown as the sheet shows them.
  const m = numFmt ? /^[#,]*0(?:\.(0+))?$/.exec(numFmt.trim()) : null;
  if (m) return v.toFixed(m[1] ? m[1].length : 0);
  return String(v);
}

/** The namespace prefix a part's root element uses ("" or e.g. "x:"), so tags can be found. */
function prefixOf(xml: string, root: string): string {
  const m = new RegExp(`<(\\w+:)?${root}\\b`).exec(xml);
  return m?.[1] ?? '';
}

/** Every start tag <name …> (or <name …/>) of a part, as attribute maps. */
function tags(xml: string, name: string): Record<string, string>[] {
  const out: Record<string, string>[] = [];
  const re = new RegExp(`<(?:\\w+:)?${name}\\b([^>]*?)/?>`, 'g');
  let m: RegExpExecArray | null;
  while ((m = re.exec(xml))) out.push(attributes(m[1]));
  return out;
}

/** A part's path from a relationship target, relative to the folder of the part that names it. */
function resolvePart(from: string, target: string): string {
  if (target.startsWith('/')) return target.slice(1);
  const parts = from.split('/').slice(0, -1);
  for (const piece of target.split('/')) {
    if (piece === '..') parts.pop();
    else if (piece !== '.') parts.push(piece);
  }
  return parts.join('/');
}

/** Relationship id → [type, part path] of a part's .rels file. */
function relationships(
  parts: Map<string, Uint8Array>,
  of: string,
): Map<string, { type: string; path: string }> {
  const slash = of.lastIndexOf('/');
  const relsPath = `${of.slice(0, slash + 1)}_rels/${of.slice(slash + 1)}.rels`;
  const bytes = parts.get(relsPath);
  const out = new Map<string, { type: string; path: string }>();
  if (!bytes) return out;
  for (const r of tags(utf8.decode(bytes), 'Relationship')) {
    if (r.Id && r.Target && r.TargetMode !== 'External')
      out.set(r.Id, { type: r.Type ?? '', path: resolvePart(of, r.Target) });
  }
  return out;
}

function sharedStrings(xml: string): string[] {
  const p = prefixOf(xml, 'sst');
  const out: string[] = [];
  const re = new RegExp(`<${p}si(?:\\s[^>]*)?(?:/>|>([\\s\\S]*?)</${p}si>)`, 'g');
  let m: RegExpExecArray | null;
  while ((m = re.exec(xml))) out.push(m[1] ? stringItemText(m[1], p) : '');
  return out;
}

/** Each cell style's number format code (undefined for General), by style index. */
function styleFormats(xml: string): (string | undefined)[] {
  const custom = new Map<number, string>();
  for (const f of tags(xml, 'numFmt')) custom.set(Number(f.numFmtId), f.formatCode ?? '');
  const p = prefixOf(xml, 'styleSheet');
  const start = xml.indexOf(`<${p}cellXfs`);
  const end = xml.indexOf(`</${p}cellXfs>`, start);
  if (start < 0 || end < 0) return [];
  return tags(xml.slice(start, end), 'xf').map((xf) =>
    formatCode(Number(xf.numFmtId ?? 0), custom),
  );
}

type Plain = Pick<RawCell, 'kind' | 'value' | 'text'>;

const BLANK: Plain = { kind: 'blank', value: null, text: '' };

function textCell(text: string): Plain {
  return text === '' ? BLANK : { kind: 'text', value: text, text };
}

interface SheetContext {
  file: string;
  sheet: string;
  strings: string[];
  /** One cell per shared string, made when first used: cells are values, so equal ones share. */
  stringCells: (Plain | undefined)[];
  formats: (string | undefined)[];
  date1904: boolean;
  limits: Limits;
  /** Filled cells kept so far in the workbook, against `maxCells`. */
  kept: { cells: number };
}

/** A cell's value as shown, from its type, style and stored value (§18.3.1.4, §18.18.11). */
function cellValue(t: string, v: string, style: number, ctx: SheetContext): Plain {
  switch (t) {
    case 's': {
      const i = Number(v);
      const s = ctx.strings[i];
      return s === undefined ? BLANK : (ctx.stringCells[i] ??= textCell(s));
    }
    case 'str':
    case 'inlineStr':
      return textCell(unescapeXstring(unescapeXml(v)));
    case 'b':
      return { kind: 'boolean', value: v === '1', text: v === '1' ? 'TRUE' : 'FALSE' };
    case 'e':
      return { kind: 'error', value: null, text: unescapeXml(v) };
    case 'd': {
      const d = new Date(v);
      return { kind: 'date', value: d, text: isoDate(d) };
    }
    default: {
      const n = Number(v);
      if (v.trim() === '' || !Number.isFinite(n)) return textCell(unescapeXml(v));
      const fmt = ctx.formats[style];
      if (isDateFormat(fmt)) {
        const d = serialDate(n, ctx.date1904);
        return { kind: 'date', value: d, text: isoDate(d) };
      }
      return { kind: 'number', value: n, text: numberText(n, fmt) };
    }
  }
}

/** The inner text of the first <name>…</name> child in a cell's XML, or undefined. */
function child(inner: string, p: string, name: string): string | undefined {
  const open = inner.indexOf(`<${p}${name}`);
  if (open < 0) return undefined;
  const close = inner.indexOf('>', open);
  if (inner[close - 1] === '/') return '';
  const end = inner.indexOf(`</${p}${name}>`, close);
  return end < 0 ? undefined : inner.slice(close + 1, end);
}

/**
 * Puts a cell in its row: gaps of a few cells are filled with null as RawSheet promises; a
 * wide gap (a stray value far right) is left as a hole, which every reader of rows treats as
 * empty (`row[c] ?? null`), so such a row costs its cells and not its width.
 */
function place(cells: (RawCell | null)[], col: number, cell: RawCell): void {
  if (col - 1 - cells.length <= 64) while (cells.length < col - 1) cells.push(null);
  cells[col - 1] = cell;
}

/** One worksheet part's rows of cells, hidden rows and merged ranges. */
function readSheet(xml: string, ctx: SheetContext): Pick<RawSheet, 'rows' | 'hiddenRows'> {
  const p = prefixOf(xml, 'worksheet');
  // The declared extent first: a sheet that says it is too long is refused before any cell.
  const dim = tags(xml.slice(0, 4096), 'dimension')[0]?.ref?.split(':').pop();
  const declared = dim ? parseAddress(dim) : null;
  if (declared && declared.row > ctx.limits.maxRows)
    throw tooManyRows(ctx, ctx.limits.maxRows, declared.row);

  const rows: (RawCell | null)[][] = [];
  const hiddenRows: number[] = [];
  const sharedFormulas = new Map<string, string>();
  const rowOpen = `<${p}row`;
  const rowClose = `</${p}row>`;
  const cellRe = new RegExp(`<${p}c\\b([^>]*?)(/?)>`, 'g');
  const cellClose = `</${p}c>`;
  let at = xml.indexOf(`<${p}sheetData`);
  const dataEnd = xml.indexOf(`</${p}sheetData>`, at);
  let lastRow = 0;
  while (at >= 0) {
    at = xml.indexOf(rowOpen, at);
    if (at < 0 || (dataEnd >= 0 && at > dataEnd)) break;
    const tagEnd = xml.indexOf('>', at);
    if (!/[\s/>]/.test(xml[at + rowOpen.length])) {
      at = tagEnd; // <rowBreaks> or the like
      continue;
    }
    const rowAttrs = attributes(xml.slice(at + rowOpen.length, tagEnd));
    const r = rowAttrs.r ? Number(rowAttrs.r) : lastRow + 1;
    lastRow = r;
    if (r > ctx.limits.maxRows) throw tooManyRows(ctx, ctx.limits.maxRows, r);
    if (rowAttrs.hidden === '1' || rowAttrs.hidden === 'true') hiddenRows.push(r);
    if (xml[tagEnd - 1] === '/') {
      at = tagEnd;
      continue;
    }
    const end = xml.indexOf(rowClose, tagEnd);
    const body = xml.slice(tagEnd + 1, end < 0 ? xml.length : end);
    at = end < 0 ? -1 : end + rowClose.length;
    const cells: (RawCell | null)[] = [];
    let lastCol = 0;
    cellRe.lastIndex = 0;
    let m: RegExpExecArray | null;
    while ((m = cellRe.exec(body))) {
      const a = attributes(m[1]);
      const pos = a.r ? parseAddress(a.r) : null;
      const col = pos ? pos.col : lastCol + 1;
      lastCol = col;
      if (col > ctx.limits.maxColumns)
        throw tooManyColumns(ctx, cellAddress(r, col), ctx.limits.maxColumns);
      let inner = '';
      if (m[2] !== '/') {
        const close = body.indexOf(cellClose, cellRe.lastIndex);
        inner = body.slice(cellRe.lastIndex, close < 0 ? body.length : close);
        cellRe.lastIndex = close < 0 ? body.length : close + cellClose.length;
      }
      const style = Number(a.s ?? 0);
      const t = a.t ?? 'n';
      const fText = child(inner, p, 'f');
      const v = t === 'inlineStr' ? undefined : child(inner, p, 'v');
      let raw: RawCell;
      if (fText !== undefined) {
        // A shared formula's other cells hold only its id; the first holds the text (§18.3.1.40).
        const fOpen = inner.indexOf(`<${p}f`);
        const fa = attributes(inner.slice(fOpen + p.length + 2, inner.indexOf('>', fOpen)));
        let formula = unescapeXml(fText);
        if (fa.t === 'shared' && fa.si !== undefined) {
          if (formula) sharedFormulas.set(fa.si, formula);
          else formula = sharedFormulas.get(fa.si) ?? '';
        }
        raw =
          v === undefined
            ? { ...BLANK, formula, formulaMissingResult: true }
            : { ...cellValue(t, v, style, ctx), formula };
      } else if (t === 'inlineStr') {
        const is = child(inner, p, 'is');
        raw = textCell(is ? stringItemText(is, p) : '');
      } else {
        raw = v === undefined ? BLANK : cellValue(t, v, style, ctx);
      }
      if (raw.kind === 'blank' && !raw.formula) continue;
      if (raw.text.length > ctx.limits.maxCellChars) {
        throw cellTooLong(
          ctx,
          cellAddress(r, col),
          ctx.limits.maxCellChars,
          'shorten the text in that cell (notes belong in a notes sheet or column of short entries) and save again',
        );
      }
      if (++ctx.kept.cells > ctx.limits.maxCells)
        throw tooManyCells(ctx, cellAddress(r, col), ctx.limits.maxCells);
      place(cells, col, raw);
    }
    while (rows.length < r - 1) rows.push([]);
    rows[r - 1] = cells;
  }
  fillMerges(xml, p, rows, ctx);
  while (rows.length > 0 && rows[rows.length - 1].every((c) => c === null)) rows.pop();
  return { rows, hiddenRows };
}

/**
 * Gives every cell of a merged range the value of its top-left cell, marked as merged, as a
 * spreadsheet shows it. Ranges are clipped to the rows and columns the sheet uses.
 */
function fillMerges(xml: string, p: string, rows: (RawCell | null)[][], ctx: SheetContext): void {
  const start = xml.indexOf(`<${p}mergeCells`);
  if (start < 0) return;
  let filled = 0;
  const width = rows.reduce((w, r) => Math.max(w, r.length), 0);
  for (const { ref } of tags(xml.slice(start), 'mergeCell')) {
    const [from, to] = (ref ?? '').split(':').map(parseAddress);
    if (!from || !to) continue;
    const master = rows[from.row - 1]?.[from.col - 1] ?? null;
    const shown: Plain = master
      ? { kind: master.kind, value: master.value as RawValue, text: master.text }
      : BLANK;
    const masterAddress = cellAddress(from.row, from.col);
    const lastRow = Math.min(to.row, rows.length, ctx.limits.maxRows);
    const lastCol = Math.min(to.col, Math.max(width, from.col), ctx.limits.maxColumns);
    for (let r = from.row; r <= lastRow; r++) {
      for (let c = from.col; c <= lastCol; c++) {
        if (r === from.row && c === from.col) continue;
        if (++filled > MAX_MERGED_CELLS) {
          throw new ImportError(
            'too-many-rows',
            `Sheet "${ctx.sheet}" in "${ctx.file}" merges more than ${MAX_MERGED_CELLS.toLocaleString('en-US')} cells; unmerge them and save again.`,
            { file: ctx.file, sheet: ctx.sheet },
          );
        }
        place((rows[r - 1] ??= []), c, { ...shown, mergedFrom: masterAddress });
      }
    }
  }
}

function corrupt(file: string, why: string): ImportError {
  return new ImportError(
    'corrupt',
    `"${file}" could not be read as an .xlsx workbook (${why}). Open it in your spreadsheet program, save a fresh copy as .xlsx and import that.`,
    { file },
  );
}

/**
 * Reads an .xlsx workbook.
 * @param file - name, size and hash of the file
 * @param bytes - the file
 * @param limits - caps on rows and columns per sheet and on the unzipped contents
 * @returns every worksheet with its cells, in the workbook's order
 * @throws {ImportError} "corrupt" for a damaged or foreign zip; "uncompressed-too-large" for a
 *   zip bomb; "too-many-rows" or "too-many-columns" naming the sheet (and cell)
 * @example
 * (await readXlsx(file, bytes)).sheets.map((s) => s.name) // ['Key', 'North Field', …]
 */
export async function readXlsx(
  file: SourceFile,
  bytes: Uint8Array,
  limits: Limits = importLimits,
): Promise<RawWorkbook> {
  const { parts } = unzipChecked(
    file.name,
    bytes,
    (n) => n.endsWith('.xml') || n.endsWith('.rels'),
    limits,
  );
  const root = relationships(parts, '');
  const workbookPath =
    [...root.values()].find((r) => r.type.endsWith('/officeDocument'))?.path ?? 'xl/workbook.xml';
  const workbookBytes = parts.get(workbookPath);
  if (!workbookBytes) throw corrupt(file.name, 'it has no workbook part');
  const workbookXml = utf8.decode(workbookBytes);
  if (!/<(\w+:)?workbook\b/.test(workbookXml))
    throw corrupt(file.name, 'its workbook part is not a workbook');
  const rels = relationships(parts, workbookPath);
  const partOf = (suffix: string) => [...rels.values()].find((r) => r.type.endsWith(suffix))?.path;
  const stringsBytes = parts.get(partOf('/sharedStrings') ?? 'xl/sharedStrings.xml');
  const stylesBytes = parts.get(partOf('/styles') ?? 'xl/styles.xml');
  const pr = tags(workbookXml, 'workbookPr')[0];
  const base = {
    file: file.name,
    strings: stringsBytes ? sharedStrings(utf8.decode(stringsBytes)) : [],
    stringCells: [],
    kept: { cells: 0 },
    formats: stylesBytes ? styleFormats(utf8.decode(stylesBytes)) : [],
    date1904: pr?.date1904 === '1' || pr?.date1904 === 'true',
    limits,
  };
  const sheets: RawSheet[] = [];
  for (const s of tags(workbookXml, 'sheet')) {
    const rel = rels.get(s['r:id'] ?? s.id ?? '');
    // Chart sheets and dialog sheets hold no cells.
    if (!rel || !rel.type.endsWith('/worksheet')) continue;
    const sheetBytes = parts.get(rel.path);
    if (!sheetBytes) throw corrupt(file.name, `the sheet "${s.name}" is missing`);
    const read = readSheet(utf8.decode(sheetBytes), { ...base, sheet: s.name ?? '' });
    sheets.push({
      name: s.name ?? '',
      hidden: s.state === 'hidden' || s.state === 'veryHidden',
      decimalComma: false,
      ...read,
    });
  }
  if (sheets.length === 0) throw corrupt(file.name, 'it has no worksheets');
  return { file, format: 'xlsx', sheets };
}
