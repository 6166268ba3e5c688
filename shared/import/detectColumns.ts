/**
 * Finds, for every sheet, the header row (below any title and blank rows),
 * what each column holds and in which unit, and whether the sheet holds plots,
 * a treatment key or nothing to import. Every choice carries evidence text for
 * the user, and the result is plain data the user can change.
 */
import { fileSite } from './fileSite';
import { columnLetters } from '../table/cellAddress';
import { NUMERIC_COLUMN_ROLES, type ColumnRole } from '../table/plotTable';
import {
  UNITS_BY_ROLE,
  type ColumnAssignment,
  type ColumnMapping,
  type MappedRole,
  type SheetMapping,
  roleTakesOneColumn,
} from './columnMapping';
import { cellNumber } from './cellNumber';
import { normalizeHeader, rateHeaderBasis, roleFromHeader, unitFromHeader } from './headerWords';
import type { RawSheet, RawWorkbook } from './rawWorkbook';
import { shapeSignature } from './shapeSignature';
import { cropFromText } from './cropFromText';
import { weightOrYield } from './weightOrYield';
import { sampleMedian } from '../stats/quantile';
import type { CropId } from '../table/plotTable';
import { areaToM2, lengthToM, type AreaUnit, type LengthUnit } from '../units/convertYield';
import { products } from '../units/products';

/** How many rows from the top are searched for the header. */
export const headerSearchRows = 30;

/**
 * Headers the user gave a role (the command line's --map), normalized, with that role: they
 * count as known words, so a sheet whose headers Plotrate does not know (another language, a
 * house style) is still found and read.
 */
export type NamedHeaders = ReadonlyMap<string, Exclude<MappedRole, 'ignore'>>;

/** The role a header names: its own words, else the role the user gave it. */
function headerRole(
  text: string,
  named: NamedHeaders,
): { role: Exclude<MappedRole, 'ignore'>; word: string; byUser?: true } | null {
  const role = named.get(normalizeHeader(text));
  if (role) return { role, word: text.trim(), byUser: true };
  return roleFromHeader(text);
}

function headerScore(sheet: RawSheet, r: number, named: NamedHeaders): number {
  const row = sheet.rows[r - 1] ?? [];
  const roles = new Set<string>();
  let texts = 0;
  for (const c of row) {
    if (!c || c.kind !== 'text') continue;
    texts++;
    const m = headerRole(c.text, named);
    if (m) roles.add(m.role);
  }
  // A title row is one long cell; a header has several short labelled cells.
  return roles.size >= 2 ? roles.size * 10 + Math.min(texts, 9) : 0;
}

function findHeaderRow(sheet: RawSheet, named: NamedHeaders): number {
  let best = 0;
  let bestScore = 0;
  const last = Math.min(sheet.rows.length, headerSearchRows);
  for (let r = 1; r <= last; r++) {
    const s = headerScore(sheet, r, named);
    if (s > bestScore) {
      bestScore = s;
      best = r;
    }
  }
  return best;
}

interface ColumnValues {
  numbers: number[];
  texts: number;
  filled: number;
}

function columnValues(sheet: RawSheet, headerRow: number, col: number): ColumnValues {
  const out: ColumnValues = { numbers: [], texts: 0, filled: 0 };
  const end = Math.min(sheet.rows.length, headerRow + 500);
  for (let r = headerRow + 1; r <= end; r++) {
    const cell = sheet.rows[r - 1]?.[col - 1];
    if (!cell) continue;
    const n = cellNumber(cell, sheet.decimalComma);
    if (n.status === 'missing') continue;
    out.filled++;
    if (n.value !== null) out.numbers.push(n.value);
    else out.texts++;
  }
  return out;
}

function valuesEvidence(v: ColumnValues): string {
  return v.filled === 0
    ? 'no values below the header'
    : `${v.numbers.length} of ${v.filled} values are numbers`;
}

const numericRoles = new Set<MappedRole>(NUMERIC_COLUMN_ROLES);

/**
 * The crop a sheet names, with where: its name, the title rows above its header, a crop column
 * whose values name one crop, or the file's name, in that order; null when none names exactly one.
 */
function sheetCrop(
  sheet: RawSheet,
  headerRow: number,
  fileName: string,
): { crop: CropId; evidence: string } | null {
  const fromName = cropFromText(sheet.name);
  if (fromName) return { crop: fromName, evidence: `the sheet name "${sheet.name}"` };
  for (const row of sheet.rows.slice(0, headerRow - 1)) {
    const text = row
      .map((c) => (c && c.kind === 'text' ? c.text : ''))
      .join(' ')
      .trim();
    const crop = cropFromText(text);
    if (crop) return { crop, evidence: `the title row "${text}"` };
  }
  const header = sheet.rows[headerRow - 1] ?? [];
  const cropCol = header.findIndex((c) => !!c && /^\s*crop\b/i.test(c.text));
  if (cropCol >= 0) {
    const named = new Set<CropId | null>();
    const end = Math.min(sheet.rows.length, headerRow + 500);
    for (let r = headerRow; r < end; r++) {
      const cell = sheet.rows[r]?.[cropCol];
      if (cell && cell.text.trim()) named.add(cropFromText(cell.text));
    }
    const [only] = [...named];
    if (named.size === 1 && only)
      return { crop: only, evidence: `the "${header[cropCol]!.text}" column` };
  }
  const fromFile = cropFromText(fileName.replace(/\.[^.]+$/, '').replace(/[_-]+/g, ' '));
  return fromFile ? { crop: fromFile, evidence: `the file name "${fileName}"` } : null;
}

/** The median plot area of the sheet's area column, or of its length × width columns, m². */
function medianPlotAreaM2(
  sheet: RawSheet,
  headerRow: number,
  taken: ReadonlyMap<MappedRole, ColumnAssignment>,
): number | null {
  const numbers = (a: ColumnAssignment | undefined) =>
    a
      ? columnValues(sheet, headerRow, a.col).numbers.filter((v) => v > 0 && Number.isFinite(v))
      : [];
  const area = taken.get('plotArea');
  const areas = numbers(area);
  if (area && areas.length > 0)
    return areaToM2(sampleMedian(areas), (area.unit as AreaUnit) ?? 'm2');
  const length = taken.get('plotLength');
  const width = taken.get('plotWidth');
  const ls = numbers(length);
  const ws = numbers(width);
  if (length && width && ls.length > 0 && ws.length > 0)
    return (
      lengthToM(sampleMedian(ls), (length.unit as LengthUnit) ?? 'm') *
      lengthToM(sampleMedian(ws), (width.unit as LengthUnit) ?? 'm')
    );
  return null;
}

/**
 * Settles each yield or plot-weight column by weightOrYield: its role, its unit, and a question
 * when the evidence leaves both open. A column whose decided role another column already holds
 * keeps the role its header gave it.
 */
function decideWeightOrYield(
  sheet: RawSheet,
  headerRow: number,
  columns: readonly ColumnAssignment[],
  taken: Map<MappedRole, ColumnAssignment>,
  weighed: ReadonlyMap<ColumnAssignment, number[]>,
  usHints: boolean,
  crop: CropId | null,
): void {
  const plotAreaM2 = medianPlotAreaM2(sheet, headerRow, taken);
  for (const a of columns) {
    if (a.role !== 'yield' && a.role !== 'plotWeight') continue;
    const d = weightOrYield({
      header: a.header,
      values: weighed.get(a) ?? [],
      plotAreaM2,
      usHints,
      crop,
    });
    const holder = taken.get(d.role);
    if (d.role !== a.role && holder && holder !== a) continue;
    if (d.role !== a.role) {
      taken.delete(a.role);
      taken.set(d.role, a);
      if (d.role === 'plotWeight') delete a.moistureBasis;
    }
    a.role = d.role;
    a.unit = d.unit;
    if (d.question) a.question = d.question;
    // After the header's word, before the values' count.
    const parts = a.evidence.split('; ');
    a.evidence = [parts[0], ...d.evidence, ...parts.slice(1)].filter(Boolean).join('; ');
  }
}

/** A sheet left out of the import, with the reason the user sees. */
function ignoredSheet(sheet: RawSheet, evidence: string): SheetMapping {
  return {
    sheet: sheet.name,
    use: 'ignore',
    headerRow: 0,
    site: { from: 'sheet-name' },
    columns: [],
    evidence,
  };
}

/**
 * On a plots sheet a timing column is a treatment factor (rate × timing): its values are the
 * levels, each with its own curve from the shared check. A timing column matters only there or
 * in a treatment key, so the change loses nothing; one factor column per sheet.
 */
function timingAsFactor(columns: ColumnAssignment[]): void {
  if (columns.some((c) => c.role === 'factor')) return;
  const timing = columns.find((c) => c.role === 'timing');
  if (!timing) return;
  timing.role = 'factor';
  timing.evidence +=
    '; a timing column on a plots sheet is a treatment factor: each timing gets its own response curve, the zero-rate check shared';
}

function mapSheet(
  sheet: RawSheet,
  multipleSheets: boolean,
  fileName: string,
  userRoles: NamedHeaders,
  headerRowGiven?: number,
): SheetMapping {
  if (sheet.hidden && headerRowGiven === undefined)
    return ignoredSheet(sheet, 'hidden sheet; include it by hand if it holds plots');
  const headerRow = headerRowGiven ?? findHeaderRow(sheet, userRoles);
  if (headerRow === 0) {
    return ignoredSheet(
      sheet,
      `no row in the first ${headerSearchRows} names two or more known columns (plot, block, rate, yield, …)`,
    );
  }
  const header = sheet.rows[headerRow - 1];
  const usHints = header.some((c) => c && /\b(bu|lbs?|ac|acre)\b/.test(normalizeHeader(c.text)));
  const columns: ColumnAssignment[] = [];
  const taken = new Map<MappedRole, ColumnAssignment>();
  /** Yield and plot-weight columns with their numbers, for weightOrYield once all are known. */
  const weighed = new Map<ColumnAssignment, number[]>();
  // Columns with data under a blank header cell are listed too, so nothing is dropped unseen.
  let width = header.length;
  const end = Math.min(sheet.rows.length, headerRow + 500);
  for (let r = headerRow + 1; r <= end; r++)
    width = Math.max(width, sheet.rows[r - 1]?.length ?? 0);
  const headerCells = Array.from({ length: width }, (_, i) => header[i] ?? null);
  headerCells.forEach((cell, i) => {
    const col = i + 1;
    const letter = columnLetters(col);
    const text = cell ? cell.text.trim() : '';
    if (text === '') {
      const v = columnValues(sheet, headerRow, col);
      if (v.filled > 0) {
        columns.push({
          col,
          letter,
          header: '',
          role: 'ignore',
          unit: null,
          evidence: `column ${letter} has no header but holds values (${valuesEvidence(v)}); give it a role by hand if it matters`,
        });
      }
      return;
    }
    const found = headerRole(text, userRoles);
    const values = columnValues(sheet, headerRow, col);
    const a: ColumnAssignment = {
      col,
      letter,
      header: text,
      role: 'ignore',
      unit: null,
      evidence: '',
    };
    if (!found) {
      a.evidence = `header "${text}" names no known column; ${valuesEvidence(values)}`;
      columns.push(a);
      return;
    }
    a.role = found.role;
    const why: string[] = [found.byUser ? 'role given by the user' : `header word "${found.word}"`];
    const u = unitFromHeader(text);
    const allowed = UNITS_BY_ROLE[a.role];
    if (u && allowed?.includes(u.unit)) {
      a.unit = u.unit;
      why.push(`unit "${u.text}"`);
    } else if (allowed) {
      // No usable unit in the header: read it from the values. Yields and plot weights are
      // decided together once the sheet's plot size is known (weightOrYield, below).
      if (a.role === 'rate') {
        a.unit = usHints ? 'lb/ac' : 'kg/ha';
        why.push(
          `no unit in the header; ${usHints ? 'US units elsewhere, so lb/ac' : 'taken as kg/ha'}`,
        );
      } else if (a.role === 'moisture') {
        a.unit = '%';
      } else if (a.role === 'plotArea') {
        a.unit = usHints ? 'ft2' : 'm2';
        why.push(`no unit in the header; taken as ${a.unit}`);
      } else if (a.role === 'plotLength' || a.role === 'plotWidth') {
        a.unit = usHints ? 'ft' : 'm';
        why.push(`no unit in the header; taken as ${a.unit}`);
      } else if (a.role === 'testWeight') {
        a.unit = usHints ? 'lb/bu' : 'kg/hl';
      }
    }
    if (a.role === 'rate') {
      const said = rateHeaderBasis(text);
      a.basis = said.basis;
      if (said.product) a.product = said.product;
      why.push(
        a.basis === null
          ? 'product or nutrient not stated; the import settings decide'
          : a.basis === 'nutrient'
            ? 'rates of nutrient (N)'
            : `rates of product${said.product ? ` (${products(said.product).label})` : ''}`,
      );
    }
    if (a.role === 'yield' || a.role === 'plotWeight') weighed.set(a, values.numbers);
    if (numericRoles.has(a.role)) {
      why.push(valuesEvidence(values));
      if (values.filled > 0 && values.numbers.length < values.filled / 2) {
        why.push('most values are not numbers: check that this is the right column');
      }
      if (a.role === 'moisture' && values.numbers.length > 0 && Math.max(...values.numbers) <= 1) {
        why.push('the values are at most 1, so they may be fractions rather than percentages');
      }
    }
    // A second column of a one-column role is left for the user to choose.
    if (roleTakesOneColumn(a.role)) {
      const first = taken.get(a.role);
      if (first) {
        const h = normalizeHeader(text);
        const std = /\b(dry|adj|adjusted|std|standard)\b|@|\bat\s*\d/.test(h);
        if (a.role === 'yield' && std && first.moistureBasis !== 'standard') {
          // An adjusted yield beats a wet one: no moisture arithmetic needed.
          first.role = 'ignore';
          first.evidence = `a second yield column ("${text}", ${letter}) is already at standard moisture and is used instead`;
          taken.set(a.role, a);
        } else {
          const role = a.role;
          a.role = 'ignore';
          a.evidence = `another "${role}" column (${first.letter}, "${first.header}") comes first; choose this one by hand if it is the right one`;
          columns.push(a);
          return;
        }
      } else {
        taken.set(a.role, a);
      }
    }
    if (a.role === 'yield') {
      const h = normalizeHeader(text);
      if (/\b(dry|adj|adjusted|std|standard)\b|@|\bat\s*\d/.test(h)) a.moistureBasis = 'standard';
      else if (/\b(wet|harvest|as is|field|fresh)\b/.test(h)) a.moistureBasis = 'harvest';
    }
    a.evidence = why.join('; ');
    columns.push(a);
  });
  const named = sheetCrop(sheet, headerRow, fileName);
  decideWeightOrYield(sheet, headerRow, columns, taken, weighed, usHints, named?.crop ?? null);
  // Whether yields are wet follows from the header, or from the presence of a moisture column.
  const hasMoisture = taken.has('moisture');
  for (const a of columns) {
    if (a.role !== 'yield' || a.moistureBasis) continue;
    a.moistureBasis = hasMoisture ? 'harvest' : 'standard';
    a.evidence += hasMoisture
      ? '; a moisture column is present, so yields are taken as weighed at harvest moisture (set "standard" if already adjusted)'
      : '; no moisture column, so yields are taken as already at standard moisture';
  }
  for (const a of columns) {
    if (a.role === 'plotWeight')
      a.evidence += '; plot weights are taken as weighed at harvest moisture';
  }
  const has = (r: ColumnRole | 'product') => taken.has(r);
  let use: SheetMapping['use'] = 'ignore';
  let evidence: string;
  if (has('yield') || has('plotWeight')) {
    use = 'plots';
    evidence = `header in row ${headerRow} with a ${has('yield') ? 'yield' : 'plot weight'} column`;
  } else if (has('treatment') && (has('rate') || has('product'))) {
    use = 'treatment-key';
    evidence = `header in row ${headerRow} with treatment and ${has('rate') ? 'rate' : 'product'} columns and no yield: a treatment key`;
  } else {
    evidence = `header in row ${headerRow} but no yield, plot weight or treatment key columns`;
  }
  if (use === 'plots') timingAsFactor(columns);
  const generic = /^(sheet\s*\d*|data|plots?|yields?|results?|raw|)$/i.test(sheet.name.trim());
  const site: SheetMapping['site'] = has('site')
    ? { from: 'column' }
    : multipleSheets || !generic
      ? { from: 'sheet-name' }
      : { from: 'fixed', value: '' };
  return {
    sheet: sheet.name,
    use,
    headerRow,
    site,
    columns,
    evidence,
    cropHint: use === 'plots' ? (named?.crop ?? null) : null,
    ...(use === 'plots' && named ? { cropEvidence: named.evidence } : {}),
  };
}

/**
 * One sheet mapped again from a header row the user chose: each header read as detection reads
 * it, the others listed with no role for the user to give one. For a sheet whose header row was
 * not found (headers in words Plotrate does not know) or was found in the wrong row.
 * @param raw - the workbook
 * @param sheetName - the sheet
 * @param headerRow - the 1-based row holding the headers
 * @returns the sheet's mapping
 * @throws {RangeError} for a sheet the workbook lacks or a row outside the sheet
 * @example
 * mapSheetFromHeaderRow(raw, 'Versuch', 3).columns.map((c) => c.header)
 */
export function mapSheetFromHeaderRow(
  raw: RawWorkbook,
  sheetName: string,
  headerRow: number,
): SheetMapping {
  const sheet = raw.sheets.find((s) => s.name === sheetName);
  if (!sheet) throw new RangeError(`"${raw.file.name}" has no sheet called "${sheetName}".`);
  if (!(Number.isInteger(headerRow) && headerRow >= 1 && headerRow <= sheet.rows.length))
    throw new RangeError(`Row ${headerRow} is outside the sheet's ${sheet.rows.length} rows.`);
  const multiple = raw.sheets.filter((s) => !s.hidden).length > 1;
  const m = mapSheet(sheet, multiple, raw.file.name, new Map(), headerRow);
  const site: SheetMapping['site'] =
    m.site.from === 'fixed' && !m.site.value
      ? { from: 'fixed', value: fileSite(raw.file.name) }
      : m.site;
  return { ...m, site, evidence: `header row ${headerRow} set by you; ${m.evidence}` };
}

/**
 * Detects the layout of a workbook.
 * @param raw - a workbook from readTrialFile
 * @param named - headers the user gave a role (normalized header → role), read as known words
 * @returns a mapping per sheet: header row, column roles and units with evidence, site source,
 *   and the shape signature for reuse
 * @example
 * const m = detectColumns(raw);
 * m.sheets.find((s) => s.use === 'treatment-key')?.sheet // 'Treatments'
 */
export function detectColumns(raw: RawWorkbook, named: NamedHeaders = new Map()): ColumnMapping {
  const plotsLike = raw.sheets.filter((s) => !s.hidden).length;
  const sheets = raw.sheets.map((s) => mapSheet(s, plotsLike > 1, raw.file.name, named));
  const plotSheets = sheets.filter((s) => s.use === 'plots');
  // One plots sheet without a site column in a file: the site is the file's name.
  if (plotSheets.length === 1 && plotSheets[0].site.from === 'fixed') {
    plotSheets[0].site = { from: 'fixed', value: fileSite(raw.file.name) };
  }
  if (plotSheets.length > 1) {
    for (const s of plotSheets) {
      if (s.site.from === 'sheet-name')
        s.evidence += '; the site is the sheet name (one sheet per site)';
    }
  }
  return { version: 1, shapeSignature: shapeSignature(sheets), sheets };
}
