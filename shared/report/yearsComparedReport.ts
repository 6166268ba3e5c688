/**
 * The years of each site seen in several years, as the report's views print them: the
 * quadratic's response and level F tests (shared/analysis/yearsCompared) and their sentence.
 */
import type { AcrossSiteAnalysis } from '../analysis/acrossSites';
import type { PoolingTest } from '../analysis/commonResponseTests';
import type { FTestNumbers, YearComparisonReport } from './trialReport';

function numbers(t: PoolingTest): FTestNumbers | null {
  return t.result.kind === 'f-test'
    ? { F: t.result.f, df1: t.result.df1, df2: t.result.df2, p: t.result.p }
    : null;
}

/**
 * The year comparisons of the across-site analysis, for the report.
 * @param across - the priced across-site analysis (its alpha reads each test)
 * @returns one entry per site with several site-years; empty when there is none
 * @example
 * yearsComparedReport(priced.across)[0]?.responseDiffers // true, false, or null without a test
 */
export function yearsComparedReport(across: AcrossSiteAnalysis): YearComparisonReport[] {
  return across.yearsCompared.map((c) => {
    const response = numbers(c.response);
    return {
      site: c.site,
      siteYears: c.siteYears.map((s) => s.site),
      years: c.siteYears.map((s) => s.year),
      response,
      level: numbers(c.level),
      responseDiffers: response ? response.p < across.options.alpha : null,
      sentence: c.sentence,
    };
  });
}
