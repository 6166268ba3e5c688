/**
 * The grower pages a report prints, in print order. Its own module, apart from
 * the workbook writer, so the PDF can be made without loading exceljs.
 */
import { groupPages, growerPage, type GrowerPage } from './growerPage';
import type { TrialReport } from './trialReport';

/**
 * The grower pages a report prints: one per site, then the region, then one per group of
 * sites (groupPages, the workspace page picker's list), so the printed packet and the
 * workbook hold every page the workspace can show.
 * @param report - the analysis
 * @returns the pages in print order
 * @example
 * reportGrowerPages(report).length // sites + 1 + groupPages(report).length with an across-site rate
 */
export function reportGrowerPages(report: TrialReport): GrowerPage[] {
  const pages = report.sites.map((s) => growerPage(report, s.site));
  if (!report.acrossSites) return pages;
  pages.push(growerPage(report, 'region'));
  for (const g of groupPages(report)) pages.push(growerPage(report, g.id));
  return pages;
}
