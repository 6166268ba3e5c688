/**
 * Turns read workbooks and their mappings into the PlotTable: canonical units
 * (nutrient kg/ha; yield kg/ha at standard moisture), the original cell kept
 * beside every value, the sheet's exclude column as exclusions with reasons.
 *
 * Yield: from the yield column in its unit (bu/ac with the crop's bushel
 * weight), or from plot weight ÷ plot area (or length × width); weighed-wet
 * yields are adjusted: adjusted = wet × (100 − M_wet)/(100 − M_standard).
 * Rate: from the rate column or the treatment key; product rates × analysis %.
 *
 * The work is split by step: checkImportSettings, readTreatmentKey (the key sheets),
 * readPlotsSheet (one plot sheet, row by row), nutrientRateKgHa and plotWeightYieldKgHa
 * (the unit conversions of one plot).
 */
import type { CropId, Plot, PlotTable, SourceFile } from '../table/plotTable';
import type { QualityFinding } from '../table/qualityFinding';
import { crops } from '../units/crops';
import { checkImportSettings } from './checkImportSettings';
import {
  openQuestion,
  questionSentence,
  type ColumnMapping,
  type SheetMapping,
} from './columnMapping';
import { ImportError } from './importError';
import type { ImportSettings } from './importSettings';
import type { RawWorkbook } from './rawWorkbook';
import { readPlotsSheet } from './readPlotsSheet';
import { sheetNameSiteYears, yearsFromFileNames } from './fileYears';
import { readTreatmentKey, type TreatmentKeyEntry } from './readTreatmentKey';
import { validateMapping } from './validateMapping';
import { roleFromHeader } from './headerWords';
import { sheetOfFile } from './sheetOfFile';

/**
 * A column set aside that reads as a yield or a plot weight, beside the one used: said, so a
 * second yield (dry and wet, two harvests) is never dropped unseen.
 */
function secondYieldColumns(file: string, m: SheetMapping, findings: QualityFinding[]): void {
  const used = m.columns.find((c) => c.role === 'yield' || c.role === 'plotWeight');
  if (!used) return;
  for (const c of m.columns) {
    if (c.role !== 'ignore' || !c.header) continue;
    const role = roleFromHeader(c.header)?.role;
    if (role !== 'yield' && role !== 'plotWeight') continue;
    findings.push({
      code: 'second-yield-column',
      severity: 'warning',
      message: `${sheetOfFile(file, m.sheet)}: column ${c.letter} "${c.header}" also looks like a ${role === 'yield' ? 'yield' : 'plot weight'} and is not used; yields are read from column ${used.letter} "${used.header}". Give column ${c.letter} the role instead if it is the right one.`,
      refs: [{ file, sheet: m.sheet, cell: `${c.letter}${m.headerRow}`, row: m.headerRow }],
    });
  }
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
  const standardMoisturePct = checkImportSettings(settings);
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
  const perFile: { name: string; plots: Plot[] }[] = [];
  // Headers of the columns given the treatment-factor role: each splits its sites into levels.
  const factorKeys: string[] = [];
  // Sheets that name another crop stay out unless chosen by name, or unless nothing else is left
  // in any of the files (then each is read with a warning that its crop differs).
  const otherCrop = (s: SheetMapping) => !settings.sheets && !!s.cropHint && s.cropHint !== crop;
  const skipOther = maps.some(
    (m) => Array.isArray(m?.sheets) && m.sheets.some((s) => s.use === 'plots' && !otherCrop(s)),
  );
  // Sheets of one site in several seasons named "Ostmere 2025", "Ostmere 2026": site-years of one
  // site (fileYears.ts). Only sheets whose site is their name and that have no year column.
  const validated = books.map((raw, bi) => validateMapping(maps[bi], raw.file.name));
  const named = sheetNameSiteYears(
    books.flatMap((raw, bi) =>
      validated[bi].sheets
        .filter(
          (m) =>
            m.use === 'plots' &&
            m.site.from === 'sheet-name' &&
            !m.columns.some((c) => c.role === 'year') &&
            (!settings.sheets || settings.sheets.includes(m.sheet)) &&
            !(skipOther && otherCrop(m)),
        )
        .map((m) => ({ file: raw.file.name, sheet: m.sheet })),
    ),
  );
  books.forEach((raw, bi) => {
    const first = plots.length;
    const mapping = validated[bi];
    const sheetOf = (name: string) => raw.sheets.find((s) => s.name === name);
    const keyMaps = mapping.sheets.filter((s) => s.use === 'treatment-key');
    const key = new Map<string, TreatmentKeyEntry>();
    for (const km of keyMaps) {
      const ks = sheetOf(km.sheet);
      if (ks)
        for (const [k, v] of readTreatmentKey(raw, ks, km, findings))
          if (!key.has(k)) key.set(k, v);
    }
    for (const m of mapping.sheets) {
      if (m.use !== 'plots') continue;
      if (settings.sheets && !settings.sheets.includes(m.sheet)) continue;
      if (skipOther && otherCrop(m)) {
        findings.push({
          code: 'other-crop-sheet-skipped',
          severity: 'info',
          message: `${sheetOfFile(raw.file.name, m.sheet)} is about ${m.cropHint}, not ${crop}, and was left out of this table; import it with the crop set to ${m.cropHint}, or choose the sheet by name.`,
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
      const asked = openQuestion(m);
      if (asked) {
        throw new ImportError(
          'column-needs-answer',
          `${questionSentence(raw.file.name, m, asked)} by giving the column its role and unit.`,
          { file: raw.file.name, sheet: m.sheet, cell: `${asked.letter}${m.headerRow}` },
        );
      }
      const siteYear = named.get(`${raw.file.name}\u0000${m.sheet}`);
      if (siteYear)
        findings.push({
          code: 'site-year-from-sheet-name',
          severity: 'info',
          message: `${sheetOfFile(raw.file.name, m.sheet)} has no year column; its plots were read as site "${siteYear.site}" in ${siteYear.year} from the sheet's name, because other sheets hold the same site in other years.`,
          refs: [],
        });
      readPlotsSheet(
        raw,
        sheet,
        m,
        key,
        settings,
        crop,
        standardMoisturePct,
        plots,
        findings,
        siteYear,
      );
      for (const c of m.columns)
        if (c.role === 'factor' && !factorKeys.includes(c.header)) factorKeys.push(c.header);
      secondYieldColumns(raw.file.name, m, findings);
      if (m.cropHint && m.cropHint !== crop)
        findings.push({
          code: 'crop-differs',
          severity: 'warning',
          message: `${sheetOfFile(raw.file.name, m.sheet)} names ${crops(m.cropHint).label.toLowerCase()} (${m.cropEvidence ?? 'its title'}), but the analysis is set to ${crops(crop).label.toLowerCase()}: bushel weight, standard moisture and plausible yields are taken from ${crops(crop).label.toLowerCase()}. Set the crop to ${m.cropHint} if the file is right.`,
          refs: [],
        });
    }
    perFile.push({ name: raw.file.name, plots: plots.slice(first) });
  });
  // Files of different seasons with the year only in their names: each season its own site-year.
  yearsFromFileNames(perFile, findings);
  if (plots.length === 0) {
    const names = books.map((b) => `"${b.file.name}"`).join(', ');
    throw new ImportError(
      'no-data',
      `No plot rows were found in ${names}: no sheet is mapped as plots with a yield or plot-weight column${settings.sheets ? ` among the chosen sheets (${settings.sheets.join(', ')})` : ''}. Check the header row and the column roles.`,
      { file: books[0]?.file.name ?? '' },
    );
  }
  const table: PlotTable = { crop, standardMoisturePct, plots, sources };
  if (factorKeys.length > 0) table.factorKeys = factorKeys;
  return { table, findings };
}
