/**
 * Reads one sheet mapped as plots into Plot rows: the mapping's columns checked against what a
 * yield and a rate need, then each row in turn (blank and summary rows skipped, the site filled
 * down when its cell is empty), the rate from the sheet or the treatment key, the yield in
 * kg/ha adjusted to standard moisture, the exclude column as an exclusion with its reason, and
 * the original cell kept beside every value. What the sheet needed to be read (numbers stored
 * as text, missing moistures, hidden rows) goes to the findings.
 */
import { cellRef } from '../table/cellAddress';
import type { SheetNameSiteYear } from './fileYears';
import { originalAddress } from '../table/originalCell';
import { fileSite } from './fileSite';
import { sheetOfFile } from './sheetOfFile';
import type { CropId, Plot } from '../table/plotTable';
import { adjustMoisture } from '../units/adjustMoisture';
import type { RateUnit } from '../units/convertRate';
import { sheetYieldToKgHa, type SheetYieldUnit } from '../units/convertYield';
import { productFromText, products, type FertilizerProduct } from '../units/products';
import type { QualityFinding } from '../table/qualityFinding';
import { cellLabel, cellText } from './cellLabel';
import { columnForRole, type ColumnAssignment, type SheetMapping } from './columnMapping';
import { ImportError } from './importError';
import type { ImportSettings } from './importSettings';
import { nutrientRateKgHa } from './nutrientRateKgHa';
import { plotWeightYieldKgHa } from './plotWeightYieldKgHa';
import { PlotRowCells } from './plotRowCells';
import type { RawCell, RawSheet, RawWorkbook } from './rawWorkbook';
import type { TreatmentKeyEntry } from './readTreatmentKey';

/** Values of the exclude column that mean "keep the plot". */
const noExclusionWords = new Set(['', 'no', 'n', '0', 'false', 'keep', 'ok', 'include', 'use']);

/** Whether a row has nothing in it: no cell, or only blank cells without formulas and spaces. */
function isBlankRow(row: readonly (RawCell | null)[]): boolean {
  for (const c of row) {
    if (!c || (c.kind === 'blank' && !c.formula) || c.text.trim() === '') continue;
    return false;
  }
  return true;
}

/** The row's first cell with text in it (a summary row's label), or undefined. */
function firstFilledCell(row: readonly (RawCell | null)[]): RawCell | null | undefined {
  for (const c of row) if (c && c.text.trim() !== '') return c;
  return undefined;
}

/** Whether a cell holds a plot's own key (plot, treatment or rate), not the row's first label. */
function isPlotKey(c: RawCell | null, first: RawCell | null | undefined): boolean {
  return c !== first && cellLabel(c) !== null;
}

/** The columns no role reads, for a message asking which holds the rate: ' (not read: C "Urea")'. */
function unreadColumns(m: SheetMapping): string {
  const unread = m.columns.filter((c) => c.role === 'ignore' && c.header.trim() !== '');
  if (unread.length === 0) return '';
  const listed = unread.slice(0, 6).map((c) => `${c.letter} "${c.header}"`);
  return ` (not read: ${listed.join(', ')}${unread.length > 6 ? ', …' : ''})`;
}

/**
 * Reads the plots of one sheet into `plots`.
 * @param raw - the workbook the sheet belongs to
 * @param sheet - the sheet, mapped as plots
 * @param m - its mapping (header row, column roles and units, where the site comes from)
 * @param key - the file's treatment key (readTreatmentKey), empty when there is none
 * @param settings - the import settings (rate basis, product, plot area in m²)
 * @param crop - the crop, for bushel weights
 * @param standardMoisturePct - the moisture yields are adjusted to, % wet basis
 * @param plots - receives one Plot per data row (rates in kg N/ha, yields in kg/ha)
 * @param findings - receives the findings about single cells and rows
 * @param sheetSiteYear - the site and year the sheet's name holds (sheetNameSiteYears), for a
 *   sheet whose site is its name and one of several seasons of that site
 * @throws {ImportError} "bad-mapping" when the sheet has no yield source, plot weights have no
 *   area, there is no rate and no key, or a product rate names no known product
 * @example
 * readPlotsSheet(raw, raw.sheets[0], mapping.sheets[0], new Map(), settings, 'corn', 15.5, plots, findings);
 */
export function readPlotsSheet(
  raw: RawWorkbook,
  sheet: RawSheet,
  m: SheetMapping,
  key: Map<string, TreatmentKeyEntry>,
  settings: ImportSettings,
  crop: CropId,
  standardMoisturePct: number,
  plots: Plot[],
  findings: QualityFinding[],
  sheetSiteYear?: SheetNameSiteYear,
): void {
  const file = raw.file.name;
  const where = `${file}${sheet.name ? ` › ${sheet.name}` : ''}`;
  const col = (role: ColumnAssignment['role']) => columnForRole(m.columns, role);
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
    (c) => c.role === 'group' || c.role === 'product' || c.role === 'timing' || c.role === 'factor',
  );
  if (!cols.yield && !cols.plotWeight) {
    throw new ImportError(
      'bad-mapping',
      `${sheetOfFile(file, sheet.name)} is mapped as plots but no column is the yield or the plot weight; choose one.`,
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
      `${sheetOfFile(file, sheet.name)} gives plot weights (column ${cols.plotWeight.letter}) but no plot area or length and width; map those columns, or give every plot's area (the import's plot area setting; --plot-area on the command line).`,
      { file, sheet: sheet.name },
    );
  }
  if (!cols.rate && key.size === 0) {
    throw new ImportError(
      'bad-mapping',
      `${sheetOfFile(file, sheet.name)} has no rate column and the file has no treatment key; map the rate column${unreadColumns(m)} or the treatment-key sheet.`,
      { file, sheet: sheet.name },
    );
  }
  const productCol = columnForRole(m.columns, 'product');
  const hidden = new Set(sheet.hiddenRows);
  const hiddenData: number[] = [];
  let lastSite: string | null = null;
  let filledDown = 0;
  const skippedSummary: number[] = [];
  const cells = new PlotRowCells(raw, sheet, where, findings);
  const num = cells.num;
  // The site of every row when it does not come from a column.
  const sheetSite =
    m.site.from === 'column'
      ? ''
      : m.site.from === 'sheet-name'
        ? (sheetSiteYear?.site ?? sheet.name)
        : m.site.value || fileSite(file);
  // A sheet names a few products in thousands of rows: each text is matched once.
  const productsByText = new Map<string, FertilizerProduct | null>();
  for (let r = m.headerRow + 1; r <= sheet.rows.length; r++) {
    const row = sheet.rows[r - 1] ?? [];
    if (isBlankRow(row)) continue;
    cells.start(row, r);
    // A summary row ("Mean", "CV %", "LSD 0.05") starts with such a word and has no plot,
    // treatment or rate of its own.
    const first = firstFilledCell(row);
    const hasPlotKeys =
      isPlotKey(cells.at(cols.plot), first) ||
      isPlotKey(cells.at(cols.treatment), first) ||
      isPlotKey(cells.at(cols.rate), first);
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
    const original = cells.original;

    // Site
    let site: string;
    if (m.site.from === 'column') {
      const s = cellLabel(cells.keep('site', cols.site));
      if (s === null && lastSite !== null) {
        site = lastSite;
        filledDown++;
      } else site = s ?? '(no site)';
    } else site = sheetSite;
    lastSite = site;

    const year = num('year', cols.year) ?? sheetSiteYear?.year ?? null;
    const block = cellLabel(cells.keep('block', cols.block));
    const plotLabel = cellLabel(cells.keep('plot', cols.plot));
    const treatment = cellLabel(cells.keep('treatment', cols.treatment));

    // Rate: the sheet's own column first, else the treatment key.
    let rateKgHa: number | null = null;
    let rateValue: number | null = null;
    let rateUnit: RateUnit = 'kg/ha';
    let basis: 'product' | 'nutrient' = settings.rateBasis;
    let rowProduct: FertilizerProduct | null = null;
    let productWords = '';
    let entry: TreatmentKeyEntry | undefined;
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
        refs: cols.treatment ? [cellRef(file, sheet.name, r, cols.treatment.col)] : [],
        site,
      });
    }
    if (productCol) {
      productWords = cellText(cells.at(productCol));
      if (productWords) {
        let known = productsByText.get(productWords);
        if (known === undefined) {
          known = productFromText(productWords);
          productsByText.set(productWords, known);
        }
        rowProduct = known;
      } else rowProduct = null;
    }
    if (rateValue !== null) {
      rateKgHa = nutrientRateKgHa(rateValue, rateUnit, basis, {
        product:
          rowProduct ??
          entry?.product ??
          (cols.rate?.product ? products(cols.rate.product) : null) ??
          (settings.product ? products(settings.product) : null),
        productWords: productWords || entry?.productText,
        where: `${where} row ${r}`,
        ref: { file, sheet: sheet.name, cell: original.rate && originalAddress(original.rate) },
      });
    }

    // Moisture and yield
    const moisturePct = num('moisture', cols.moisture);
    let yieldKgHa: number | null = null;
    let wetBasis = true;
    if (cols.yield) {
      const y = num('yield', cols.yield);
      wetBasis = cols.yield.moistureBasis !== 'standard';
      if (y !== null)
        yieldKgHa = sheetYieldToKgHa(y, (cols.yield.unit as SheetYieldUnit) ?? 'kg/ha', crop);
    } else if (cols.plotWeight) {
      yieldKgHa = plotWeightYieldKgHa(cols, num, areaFromSettings);
    }
    if (yieldKgHa !== null && wetBasis && cols.moisture) {
      if (moisturePct !== null && moisturePct >= 0 && moisturePct < 100) {
        yieldKgHa = adjustMoisture(yieldKgHa, moisturePct, standardMoisturePct);
      } else {
        const mc = cells.at(cols.moisture);
        findings.push({
          code: 'moisture-missing',
          severity: 'warning',
          message: `${where} row ${r}: the yield was weighed at harvest moisture but the moisture ${mc && mc.text.trim() ? `"${mc.text}" is not a usable percentage` : 'is missing'}, so it is not adjusted to ${standardMoisturePct} %. Enter the moisture or exclude the plot.`,
          refs: [cellRef(file, sheet.name, r, cols.moisture.col)],
          site,
        });
      }
    }

    const testWeight = num('testWeight', cols.testWeight);
    const notesCell = cells.keep('notes', cols.notes);
    const notes = notesCell && notesCell.text.trim() !== '' ? notesCell.text.trim() : null;
    const exCell = cells.keep('exclude', cols.exclude);
    const exText = cellText(exCell);
    const excluded =
      cols.exclude && !noExclusionWords.has(exText.toLowerCase())
        ? {
            reason: `${cols.exclude.header} column says "${exText}"${notes ? `; notes: ${notes}` : ''}`,
            by: 'sheet' as const,
          }
        : null;
    const groups: Record<string, string> = {};
    for (const g of groupCols) {
      const t = cellText(cells.at(g));
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
