/**
 * The report workbook, written with exceljs to bytes (no file system here):
 * Overview (with the cautions), one sheet per site, Across sites, Economics,
 * Price ratio and risk, Recommendations (print-ready grower pages) and Provenance. Numbers are in
 * the report's display units, converted from canonical kg/ha.
 */
import { paperSize } from './paperSize';
import ExcelJS from 'exceljs';
import { reportGrowerPages } from './reportGrowerPages';
import type { TrialReport } from './trialReport';
import { unitScale } from './unitScale';
import { workbookAcrossSites } from './workbookAcrossSites';
import { workbookRegionalModel } from './workbookRegionalModel';
import { workbookEconomics } from './workbookEconomics';
import { sheetName } from './workbookFormat';
import { workbookGrowerSheet } from './workbookGrowerSheet';
import { levelsSheetTitle, workbookLevels } from './workbookLevels';
import { workbookOverview } from './workbookOverview';
import { workbookProvenance } from './workbookProvenance';
import { SENSITIVITY_SHEET, workbookSensitivity } from './workbookSensitivity';
import { workbookSite, type SheetImage } from './workbookSite';

/** A picture, or one still being drawn (the command line draws them while sheets are written). */
export type Eventually<T> = T | PromiseLike<T>;

export interface WorkbookOptions {
  /** Chart pictures by site name (PNG bytes drawn by the caller); each sheet waits for its own. */
  siteCharts?: Record<string, Eventually<SheetImage>>;
  /** The regional return chart picture. */
  acrossChart?: Eventually<SheetImage | null>;
  /** Each rate × factor site's levels chart (levelCurvesChart), by levelChartKey(site, factor). */
  levelCharts?: Record<string, Eventually<SheetImage>>;
  /** Deflate level 1–9 for the zip (exceljs's default when omitted). */
  zipLevel?: number;
}

// Re-exported for callers that import it from here; it lives apart so the PDF needs no exceljs.
export { reportGrowerPages };

/**
 * Called with each finished sheet, in order. exceljs's streaming writer commits the sheet
 * here (its rows leave memory); the in-memory workbook needs nothing.
 */
export type SheetFinished = (sheet: ExcelJS.Worksheet) => Promise<void> | void;

/**
 * Fills a workbook with the report's sheets, one at a time: the in-memory `ExcelJS.Workbook`
 * (the workspace) or exceljs's streaming writer, which the command line supplies with its file
 * (no file system here). Each sheet is complete (widths, views, print setup, picture) before
 * `finished` is called with it, so a streaming writer may write it out and forget it.
 * @param wb - the workbook to fill (a streaming `WorkbookWriter` has the same calls)
 * @param report - the assembled analysis (canonical units inside)
 * @param options - chart pictures to embed
 * @param finished - called with each sheet once it is complete
 * @example
 * await fillWorkbook(new ExcelJS.Workbook(), report, { siteCharts });
 */
export async function fillWorkbook(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  options: Omit<WorkbookOptions, 'zipLevel'> = {},
  finished: SheetFinished = () => undefined,
): Promise<void> {
  wb.creator = `${report.tool.name} ${report.tool.version}`;
  // A fixed time from the report (not "now") keeps the file the same for the same analysis.
  const when = new Date(report.createdAt);
  wb.created = when;
  wb.modified = when;
  const u = unitScale(report.settings.units, report.crop);
  const paper = report.settings.paper ?? paperSize(report.settings.units);
  const taken = new Set([
    'overview',
    'across sites',
    'regional model',
    'economics',
    SENSITIVITY_SHEET.toLowerCase(),
    'recommendations',
    'provenance',
  ]);
  await finished(workbookOverview(wb, report, u, paper));
  for (const s of report.sites) {
    const charts = options.siteCharts;
    const chart = charts && Object.hasOwn(charts, s.site) ? await charts[s.site] : null;
    await finished(workbookSite(wb, sheetName(s.site, taken), s, report, u, paper, chart));
  }
  const levelCharts = options.levelCharts
    ? Object.fromEntries(
        await Promise.all(
          Object.entries(options.levelCharts).map(async ([k, v]) => [k, await v] as const),
        ),
      )
    : undefined;
  // One sheet per treatment factor (rate × source, rate × timing), after the site sheets.
  for (const factor of new Set(report.levels.map((l) => l.factor)))
    await finished(
      workbookLevels(
        wb,
        sheetName(levelsSheetTitle(factor), taken),
        factor,
        report,
        u,
        paper,
        levelCharts,
      ),
    );
  await finished(workbookAcrossSites(wb, report, u, paper, (await options.acrossChart) ?? null));
  await finished(workbookRegionalModel(wb, report, u, paper));
  await finished(workbookEconomics(wb, report, paper));
  await finished(workbookSensitivity(wb, report, u, paper));
  await finished(workbookGrowerSheet(wb, reportGrowerPages(report), paper));
  await finished(workbookProvenance(wb, report, paper));
}

/**
 * Writes the report workbook in memory (the workspace's path; the command line streams it
 * with {@link fillWorkbook}).
 * @param report - the assembled analysis (canonical units inside)
 * @param options - chart pictures to embed
 * @returns .xlsx bytes
 * @example
 * const bytes = await writeWorkbook(report, { siteCharts });
 */
export async function writeWorkbook(
  report: TrialReport,
  options: WorkbookOptions = {},
): Promise<Uint8Array> {
  const wb = new ExcelJS.Workbook();
  await fillWorkbook(wb, report, options);
  const buf = await wb.xlsx.writeBuffer(
    // Level 1: the bulk is chart PNGs, already compressed, so harder deflating only costs time.
    options.zipLevel === undefined
      ? undefined
      : ({
          zip: { compression: 'DEFLATE', compressionOptions: { level: options.zipLevel } },
        } as never),
  );
  return new Uint8Array(buf as ArrayBuffer);
}
