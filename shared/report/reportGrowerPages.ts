/**
 * The grower pages a report prints, in print order. Its own module, apart from
 * the workbook writer, so the PDF can be made without loading exceljs.
 */
import { growerPage, type GrowerPage } from './growerPage';
import type { TrialReport } from './trialReport';

/**
 * The grower pages a report prints: one per site with a recommendation, then the region.
 * @param report - the analysis
 * @returns the pages in print order
 * @example
 * reportGrowerPages(report).length // sites + 1 when the report has an across-site rate
 */
export function reportGrowerPages(report: TrialReport): GrowerPage[] {
  const pages = report.sites.map((s) => growerPage(report, s.site));
  if (report.acrossSites) pages.push(growerPage(report, 'region'));
  return pages;
}
