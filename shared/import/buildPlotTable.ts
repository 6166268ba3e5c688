/**
 * Turns read workbooks and their mappings into the PlotTable: canonical units
 * (nutrient kg/ha; yield kg/ha at standard moisture), the original cell kept
 * beside every value, the sheet's exclude column as exclusions with reasons.
 *
 * Yield: from the yield column in its unit (bu/ac with the crop's bushel
 * weight), or from plot weight ÷ plot area (or length × width); weighed-wet
 * yields are adjusted: adjusted = wet × (100 − M_wet)/(100 − M_standard).
 * Rate: from the rate column or the treatment key; product rates × analysis %.
 */
import type {
  CellRef,
  ColumnRole,
  CropId,
  OriginalCell,
  Plot,
  PlotTable,
  SourceFile,
} from '../table/plotTable';
import { adjustMoisture } from '../units/adjustMoisture';
import { convertRate, type RateUnit } from '../units/convertRate';
import {
  areaToM2,
  convertYield,
  lengthToM,
  plotWeightToKgHa,
  type AreaUnit,
  type LengthUnit,
  type MassUnit,
  type YieldUnit,
} from '../units/convertYield';
import { crops, isCropId } from '../units/crops';
import { productFromText, productIds, products, type FertilizerProduct } from '../units/products';
import type { QualityFinding } from '../quality/qualityFinding';
import { cellNumber } from './cellNumber';
import type { ColumnAssignment, ColumnMapping, SheetMapping } from './columnMapping';
import { ImportError } from './importError';
import type { ImportSettings } from './importSettings';
import { isMissingMarker } from './parseNumberText';
import { validateMapping } from './validateMapping';
import type { RawCell, RawSheet, RawWorkbook } from './rawWorkbook';

interface KeyEntry {
  rate: number | null;
  rateUnit: RateUnit;
  basis: 'product' | 'nutrient' | null;
  product: FertilizerProduct | null;
  productText: string;
  timing: string;
  rateCell: OriginalCell | null;
}

function ref(file: string, sheet: string, cell: RawCell | null, row: number, col: number): CellRef {
  return { file, sheet, cell: cell?.address ?? `${colLetter(col)}${row}`, row };
}

function colLetter(col: number): string {
  let s = '';
  for (let n = col; n > 0; n = Math.floor((n - 1) / 26))
    s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

function textOf(cell: RawCell | null | undefined): string {
  return cell ? cell.text.trim() : '';
}

function labelOf(cell: RawCell | null | undefined): string | null {
  if (!cell) return null;
  if (cell.kind === 'number' && typeof cell.value === 'number') return String(cell.value);
  const t = cell.text.trim();
  return t === '' || isMissingMarker(t) ? null : t;
}

const noExclusionWords = new Set(['', 'no', 'n', '0', 'false', 'keep', 'ok', 'include', 'use']);

function validate(settings: ImportSettings): number {
  if (!settings || !isCropId(String(settings.crop))) {
    throw new ImportError(
      'bad-settings',
      `The import settings name no known crop ("${String(settings?.crop)}"); choose one of corn, wheat, soybean, barley, sorghum, oats, canola.`,
    );
  }
  const std = settings.standardMoisturePct ?? crops(settings.crop).standardMoisturePct;
  if (!(std >= 0 && std < 50)) {
    throw new ImportError(
      'bad-settings',
      `The standard moisture must be between 0 % and 50 %; got ${std} %. The usual value for ${settings.crop} is ${crops(settings.crop).standardMoisturePct} %.`,
    );
  }
  if (settings.rateBasis !== 'product' && settings.rateBasis !== 'nutrient') {
    throw new ImportError(
      'bad-settings',
      `The rate basis must be "product" or "nutrient"; got "${String(settings.rateBasis)}".`,
    );
  }
  if (settings.product !== undefined && !productIds.includes(settings.product)) {
    throw new ImportError(
      'bad-settings',
      `The import settings name the product "${String(settings.product)}", which Plotrate does not know; choose one of ${productIds.join(', ')}.`,
    );
  }
  if (settings.plotAreaM2 !== undefined && !(settings.plotAreaM2 > 0)) {
    throw new ImportError(
      'bad-settings',
      `The plot area must be a positive number of m²; got ${settings.plotAreaM2}.`,
    );
  }
  return std;
}

function readKey(
  raw: RawWorkbook,
  sheet: RawSheet,
  m: SheetMapping,
  findings: QualityFinding[],
): Map<string, KeyEntry> {
  const key = new Map<string, KeyEntry>();
  const col = (role: string) => m.columns.find((c) => c.role === role);
  const trt = col('treatment');
  const rate = col('rate');
  const product = col('product');
  const timing = col('timing');
  if (!trt) return key;
  for (let r = m.headerRow + 1; r <= sheet.rows.length; r++) {
    const row = sheet.rows[r - 1] ?? [];
    const t = labelOf(row[trt.col - 1]);
    if (t === null) continue;
    const rc = rate ? row[rate.col - 1] : null;
    const n = rate
      ? cellNumber(rc, sheet.decimalComma)
      : { value: null, status: 'missing' as const };
    if (n.status === 'number-as-text' && rc) {
      findings.push({
        code: 'number-as-text',
        severity: 'info',
        message: `The rate in ${sheet.name} ${rc.address} is a number stored as text ("${rc.text}"); it was read as ${n.value}.`,
        refs: [ref(raw.file.name, sheet.name, rc, r, rate!.col)],
      });
    }
    const pText = product ? textOf(row[product.col - 1]) : '';
    key.set(t, {
      rate: n.value,
      rateUnit: (rate?.unit as RateUnit) ?? 'kg/ha',
      basis: rate?.basis ?? null,
      product: pText ? productFromText(pText) : null,
      productText: pText,
      timing: timing ? textOf(row[timing.col - 1]) : '',
      rateCell: rate
        ? { text: rc?.text ?? '', ref: ref(raw.file.name, sheet.name, rc ?? null, r, rate.col) }
        : null,
    });
  }
  return key;
}

/**
 * Builds the plot table from read workbooks and their mappings.
 * @param raws - one or more workbooks from readTrialFile
 * @param mappings - the mapping of each workbook (one for all, or one per workbook, same order)
 * @param settings - crop, standard moisture (% wet basis), rate basis and product
 * @returns the table in canonical units and findings about single cells (numbers stored as
 *   text, formulas without results, missing moistures, skipped summary rows)
 * @throws {ImportError} "bad-settings" for an unknown crop or impossible moisture; "bad-mapping"
 *   when a sheet has no yield source, product rates lack a product, or plot weights lack an area;
 *   "no-data" when no plot row is found
 * @example
 * const { table } = buildPlotTable(raw, detectColumns(raw), { crop: 'corn', rateBasis: 'nutrient' });
 * table.plots[0].yieldKgHa // e.g. 13 904 (kg/ha at 15.5 %)
 */
export function buildPlotTable(
  raws: RawWorkbook | RawWorkbook[],
  mappings: ColumnMapping | ColumnMapping[],
  settings: ImportSettings,
): { table: PlotTable; findings: QualityFinding[] } {
  const standardMoisturePct = validate(settings);
  const crop: CropId = settings.crop;
  const books = Array.isArray(raws) ? raws : [raws];
  const maps = Array.isArray(mappings) ? mappings : books.map(() => mappings);
  if (maps.length !== books.length) {
    throw new ImportError(
      'bad-mapping',
      `${books.length} files were given with ${maps.length} mappings; give one mapping per file.`,
    );
  }
  const findings: QualityFinding[] = [];
  const plots: Plot[] = [];
  const sources: SourceFile[] = books.map((b) => b.file);
  books.forEach((raw, bi) => {
    const mapping = validateMapping(maps[bi], raw.file.name);
    const sheetOf = (name: string) => raw.sheets.find((s) => s.name === name);
    const keyMaps = mapping.sheets.filter((s) => s.use === 'treatment-key');
    const key = new Map<string, KeyEntry>();
    for (const km of keyMaps) {
      const ks = sheetOf(km.sheet);
      if (ks) for (const [k, v] of readKey(raw, ks, km, findings)) if (!key.has(k)) key.set(k, v);
    }
    // Sheets that name another crop stay out unless chosen by name, or unless nothing else is left.
    const plotsSheets = mapping.sheets.filter((s) => s.use === 'plots');
    const otherCrop = (s: SheetMapping) => !settings.sheets && !!s.cropHint && s.cropHint !== crop;
    const skipOther = plotsSheets.some((s) => !otherCrop(s));
    for (const m of mapping.sheets) {
      if (m.use !== 'plots') continue;
      if (settings.sheets && !settings.sheets.includes(m.sheet)) continue;
      if (skipOther && otherCrop(m)) {
        findings.push({
          code: 'other-crop-sheet-skipped',
          severity: 'info',
          message: `Sheet "${m.sheet}" of "${raw.file.name}" is about ${m.cropHint}, not ${crop}, and was left out of this table; import it with the crop set to ${m.cropHint}, or choose the sheet by name.`,
          refs: [],
        });
        continue;
      }
      const sheet = sheetOf(m.sheet);
      if (!sheet) {
        throw new ImportError(
          'bad-mapping',
          `The mapping names sheet "${m.sheet}", which "${raw.file.name}" does not have; detect the columns again for this file.`,
          { file: raw.file.name, sheet: m.sheet },
        );
      }
      readPlotsSheet(raw, sheet, m, key, settings, crop, standardMoisturePct, plots, findings);
    }
  });
  if (plots.length === 0) {
    const names = books.map((b) => `"${b.file.name}"`).join(', ');
    throw new ImportError(
      'no-data',
      `No plot rows were found in ${names}: no sheet is mapped as plots with a yield or plot-weight column${settings.sheets ? ` among the chosen sheets (${settings.sheets.join(', ')})` : ''}. Check the header row and the column roles.`,
      { file: books[0]?.file.name ?? '' },
    );
  }
  return { table: { crop, standardMoisturePct, plots, sources }, findings };
}

function readPlotsSheet(
  raw: RawWorkbook,
  sheet: RawSheet,
  m: SheetMapping,
  key: Map<string, KeyEntry>,
  settings: ImportSettings,
  crop: CropId,
  standardMoisturePct: number,
  plots: Plot[],
  findings: QualityFinding[],
): void {
  const file = raw.file.name;
  const where = `${file}${sheet.name ? ` › ${sheet.name}` : ''}`;
  const col = (role: ColumnAssignment['role']) => m.columns.find((c) => c.role === role);
  const cols = {
    site: col('site'),
    year: col('year'),
    block: col('block'),
    plot: col('plot'),
    treatment: col('treatment'),
    rate: col('rate'),
    yield: col('yield'),
    plotWeight: col('plotWeight'),
    plotArea: col('plotArea'),
    plotLength: col('plotLength'),
    plotWidth: col('plotWidth'),
    moisture: col('moisture'),
    testWeight: col('testWeight'),
    notes: col('notes'),
    exclude: col('exclude'),
  };
  const groupCols = m.columns.filter(
    (c) => c.role === 'group' || c.role === 'product' || c.role === 'timing',
  );
  if (!cols.yield && !cols.plotWeight) {
    throw new ImportError(
      'bad-mapping',
      `Sheet "${sheet.name}" of "${file}" is mapped as plots but no column is the yield or the plot weight; choose one.`,
      { file, sheet: sheet.name },
    );
  }
  const areaFromSettings = settings.plotAreaM2;
  if (
    !cols.yield &&
    cols.plotWeight &&
    !cols.plotArea &&
    !(cols.plotLength && cols.plotWidth) &&
    areaFromSettings === undefined
  ) {
    throw new ImportError(
      'bad-mapping',
      `Sheet "${sheet.name}" of "${file}" gives plot weights (column ${cols.plotWeight.letter}) but no plot area or length and width; map those columns or enter the plot area in the import settings.`,
      { file, sheet: sheet.name },
    );
  }
  if (!cols.rate && key.size === 0) {
    throw new ImportError(
      'bad-mapping',
      `Sheet "${sheet.name}" of "${file}" has no rate column and the file has no treatment key; map the rate column or the treatment-key sheet.`,
      { file, sheet: sheet.name },
    );
  }
  const hidden = new Set(sheet.hiddenRows);
  const hiddenData: number[] = [];
  let lastSite: string | null = null;
  let filledDown = 0;
  const skippedSummary: number[] = [];
  for (let r = m.headerRow + 1; r <= sheet.rows.length; r++) {
    const row = sheet.rows[r - 1] ?? [];
    if (row.every((c) => !c || (c.kind === 'blank' && !c.formula) || c.text.trim() === ''))
      continue;
    const at = (a: ColumnAssignment | undefined) => (a ? (row[a.col - 1] ?? null) : null);
    // A summary row ("Mean", "CV %", "LSD 0.05") starts with such a word and has no plot,
    // treatment or rate of its own.
    const first = row.find((c) => c && c.text.trim() !== '');
    const hasPlotKeys = [cols.plot, cols.treatment, cols.rate].some((a) => {
      const c = at(a);
      return c !== first && labelOf(c) !== null;
    });
    if (
      !hasPlotKeys &&
      first &&
      first.kind === 'text' &&
      /^(mean|means|average|avg|cv|c\.v\.|lsd|total|sum|std|sd|se|s\.e\.|grand mean)\b/i.test(
        first.text.trim(),
      )
    ) {
      skippedSummary.push(r);
      continue;
    }
    if (hidden.has(r)) hiddenData.push(r);
    const original: Partial<Record<ColumnRole, OriginalCell>> = {};
    const keep = (role: ColumnRole, a: ColumnAssignment | undefined) => {
      const c = at(a);
      if (a && (c || role === 'yield' || role === 'rate'))
        original[role] = { text: c?.text ?? '', ref: ref(file, sheet.name, c, r, a.col) };
      return c;
    };
    const num = (role: ColumnRole, a: ColumnAssignment | undefined): number | null => {
      const c = keep(role, a);
      if (!a) return null;
      const n = cellNumber(c, sheet.decimalComma);
      if (n.status === 'number-as-text' && c && raw.format === 'xlsx') {
        findings.push({
          code: 'number-as-text',
          severity: 'info',
          message: `${where} ${c.address} (${a.header}) holds a number stored as text ("${c.text}"); it was read as ${n.value}.`,
          refs: [ref(file, sheet.name, c, r, a.col)],
        });
      } else if (n.status === 'formula-without-result' && c) {
        findings.push({
          code: 'formula-without-result',
          severity: 'warning',
          message: `${where} ${c.address} (${a.header}) is a formula (=${c.formula}) saved without a calculated result, so it has no value here. Open the file, let it recalculate, save it, and import it again.`,
          refs: [ref(file, sheet.name, c, r, a.col)],
        });
      }
      return n.value;
    };

    // Site
    let site: string;
    if (m.site.from === 'column') {
      const s = labelOf(keep('site', cols.site));
      if (s === null && lastSite !== null) {
        site = lastSite;
        filledDown++;
      } else site = s ?? '(no site)';
    } else
      site =
        m.site.from === 'sheet-name' ? sheet.name : m.site.value || file.replace(/\.[^.]+$/, '');
    lastSite = site;

    const year = num('year', cols.year);
    const block = labelOf(keep('block', cols.block));
    const plotLabel = labelOf(keep('plot', cols.plot));
    const treatment = labelOf(keep('treatment', cols.treatment));

    // Rate: the sheet's own column first, else the treatment key.
    let rateKgHa: number | null = null;
    let rateValue: number | null = null;
    let rateUnit: RateUnit = 'kg/ha';
    let basis: 'product' | 'nutrient' = settings.rateBasis;
    let rowProduct: FertilizerProduct | null = null;
    let productWords = '';
    let entry: KeyEntry | undefined;
    if (cols.rate) {
      rateValue = num('rate', cols.rate);
      rateUnit = (cols.rate.unit as RateUnit) ?? 'kg/ha';
      basis = cols.rate.basis ?? settings.rateBasis;
    }
    if (treatment !== null) entry = key.get(treatment);
    if (rateValue === null && !cols.rate && entry) {
      rateValue = entry.rate;
      rateUnit = entry.rateUnit;
      basis = entry.basis ?? settings.rateBasis;
      if (entry.rateCell) original.rate = entry.rateCell;
    } else if (!cols.rate && treatment !== null && !entry) {
      findings.push({
        code: 'treatment-not-in-key',
        severity: 'warning',
        message: `${where} row ${r}: treatment "${treatment}" is not in the treatment key, so the plot has no rate. Add it to the key or correct the treatment.`,
        refs: cols.treatment
          ? [ref(file, sheet.name, at(cols.treatment), r, cols.treatment.col)]
          : [],
        site,
      });
    }
    const productCol = m.columns.find((c) => c.role === 'product');
    if (productCol) {
      productWords = textOf(at(productCol));
      rowProduct = productWords ? productFromText(productWords) : null;
    }
    if (rateValue !== null) {
      let nutrient = rateValue;
      if (basis === 'product' && rateValue !== 0) {
        const p =
          rowProduct ?? entry?.product ?? (settings.product ? products(settings.product) : null);
        if (!p) {
          const words = productWords || entry?.productText;
          throw new ImportError(
            'bad-mapping',
            `${where} row ${r}: the rate ${rateValue} is a rate of product, but ${words ? `"${words}" is not a product Plotrate knows` : 'no product is named'}. Choose the product (urea 46-0-0, UAN 28 % or 32 %, anhydrous ammonia 82-0-0, ammonium sulfate 21-0-0, ammonium nitrate 34-0-0) in the import settings, or mark the rates as nutrient.`,
            { file, sheet: sheet.name, cell: original.rate?.ref.cell },
          );
        }
        nutrient = (rateValue * p.nitrogenPct) / 100;
      }
      rateKgHa = convertRate(nutrient, rateUnit);
    }

    // Moisture and yield
    const moisturePct = num('moisture', cols.moisture);
    let yieldKgHa: number | null = null;
    let wetBasis = true;
    if (cols.yield) {
      const y = num('yield', cols.yield);
      wetBasis = cols.yield.moistureBasis !== 'standard';
      if (y !== null) yieldKgHa = convertYield(y, (cols.yield.unit as YieldUnit) ?? 'kg/ha', crop);
    } else if (cols.plotWeight) {
      const w = num('plotWeight', cols.plotWeight);
      let areaM2: number | null;
      if (cols.plotArea) {
        const a = num('plotArea', cols.plotArea);
        areaM2 = a !== null && a > 0 ? areaToM2(a, (cols.plotArea.unit as AreaUnit) ?? 'm2') : null;
      } else if (cols.plotLength && cols.plotWidth) {
        const l = num('plotLength', cols.plotLength);
        const wd = num('plotWidth', cols.plotWidth);
        areaM2 =
          l !== null && wd !== null && l > 0 && wd > 0
            ? lengthToM(l, (cols.plotLength.unit as LengthUnit) ?? 'm') *
              lengthToM(wd, (cols.plotWidth.unit as LengthUnit) ?? 'm')
            : null;
      } else areaM2 = areaFromSettings ?? null;
      if (w !== null && areaM2 !== null) {
        yieldKgHa = plotWeightToKgHa(w, (cols.plotWeight.unit as MassUnit) ?? 'kg', areaM2, 'm2');
      }
    }
    if (yieldKgHa !== null && wetBasis && cols.moisture) {
      if (moisturePct !== null && moisturePct >= 0 && moisturePct < 100) {
        yieldKgHa = adjustMoisture(yieldKgHa, moisturePct, standardMoisturePct);
      } else {
        const mc = at(cols.moisture);
        findings.push({
          code: 'moisture-missing',
          severity: 'warning',
          message: `${where} row ${r}: the yield was weighed at harvest moisture but the moisture ${mc && mc.text.trim() ? `"${mc.text}" is not a usable percentage` : 'is missing'}, so it is not adjusted to ${standardMoisturePct} %. Enter the moisture or exclude the plot.`,
          refs: [ref(file, sheet.name, mc, r, cols.moisture.col)],
          site,
        });
      }
    }

    const testWeight = num('testWeight', cols.testWeight);
    const notesCell = keep('notes', cols.notes);
    const notes = notesCell && notesCell.text.trim() !== '' ? notesCell.text.trim() : null;
    const exCell = keep('exclude', cols.exclude);
    const exText = textOf(exCell);
    const excluded =
      cols.exclude && !noExclusionWords.has(exText.toLowerCase())
        ? {
            reason: `${cols.exclude.header} column says "${exText}"${notes ? `; notes: ${notes}` : ''}`,
            by: 'sheet' as const,
          }
        : null;
    const groups: Record<string, string> = {};
    for (const g of groupCols) {
      const t = textOf(at(g));
      if (t !== '') groups[g.header] = t;
    }
    if (!cols.rate && entry) {
      if (entry.productText) groups['Source (treatment key)'] = entry.productText;
      if (entry.timing) groups['Timing (treatment key)'] = entry.timing;
    }
    plots.push({
      id: `${file}|${sheet.name}|${r}`,
      site,
      year: year === null ? null : Math.round(year),
      block,
      plotLabel,
      treatment,
      rateKgHa,
      yieldKgHa,
      moisturePct,
      testWeight,
      notes,
      groups,
      excluded,
      original,
    });
  }
  if (skippedSummary.length > 0) {
    findings.push({
      code: 'summary-row-skipped',
      severity: 'info',
      message: `${where}: row${skippedSummary.length > 1 ? 's' : ''} ${skippedSummary.join(', ')} look${skippedSummary.length > 1 ? '' : 's'} like summary rows (mean, CV, LSD) and were not read as plots.`,
      refs: skippedSummary.map((r) => ({ file, sheet: sheet.name, cell: `A${r}`, row: r })),
    });
  }
  if (hiddenData.length > 0) {
    findings.push({
      code: 'hidden-rows',
      severity: 'warning',
      message: `${where}: row${hiddenData.length > 1 ? 's' : ''} ${hiddenData.slice(0, 10).join(', ')}${hiddenData.length > 10 ? ', …' : ''} ${hiddenData.length > 1 ? 'are hidden in the sheet but were imported as plots; exclude them if they were' : 'is hidden in the sheet but was imported as a plot; exclude it if it was'} hidden on purpose.`,
      refs: hiddenData.map((r) => ({ file, sheet: sheet.name, cell: `A${r}`, row: r })),
    });
  }
  if (filledDown > 0) {
    findings.push({
      code: 'site-filled-down',
      severity: 'info',
      message: `${where}: ${filledDown} row${filledDown > 1 ? 's have' : ' has'} no site; the site of the row above was used.`,
      refs: [],
    });
  }
}
