/**
 * Does a site respond to N the same way every year? For each site seen in several years, its
 * site-years (shared/table/siteYear) are put through the same nested tests as the sites of a
 * region (sharedResponse: the linear, proportional and quadratic chains of
 * commonResponseTests and the pooled-versus-separate plateau fits of pooledCurveTest), with the
 * years as the parts.
 *
 * The headline is the quadratic chain, because it is an exact F test (linear least squares)
 * while the plateau comparisons are approximate (pooledCurveTest's header):
 *
 *   level:    y = a + b·x + c·x²               against  y = a_year + b·x + c·x²
 *   response: y = a_year + b·x + c·x²          against  y = a_year + b_year·x + c_year·x²
 *
 * "Response" asks whether the years differ in their response to rate beyond a shift in yield
 * level (seasons nearly always differ in level; what matters for a rate is whether the curve's
 * shape does). Each F uses the year-specific curves' residual mean square, as R's
 * anova(lm(y ~ x + I(x^2)), lm(y ~ year + x + I(x^2)), lm(y ~ year * (x + I(x^2)))) does
 * (checked against R in tests/analysis.yearsCompared.test.ts).
 */
import type { SiteAnalysis } from './analyzeSite';
import type { PoolingQuestion, PoolingTest } from './commonResponseTests';
import { describeFTest, type TestReadings } from './describeFTest';
import type { AcrossSiteSettings } from './planAcrossSites';
import { sharedResponse, type SharedResponseTests } from './sharedResponse';
import type { SitePlots } from './sitePlots';

/** The years of one site compared. */
export interface YearComparison {
  /** The site's own name, the same in every year. */
  site: string;
  /** Its site-years in table order: display name and year (null: plots with no year). */
  siteYears: { site: string; year: number | null }[];
  /** Quadratic, each year its own level: one response to rate for all years, or one per year? */
  response: PoolingTest;
  /** Quadratic: one yield level for all years, or one per year (same response)? */
  level: PoolingTest;
  /** Every shared-response test with the years as parts (linear models and plateau fits). */
  tests: SharedResponseTests;
  /** The two headline results in plain words, for the screen and the summary. */
  sentence: string;
}

function quadraticTest(tests: SharedResponseTests, question: PoolingQuestion): PoolingTest {
  // testCommonResponse always reports the three questions of the quadratic (or says why not).
  return tests.quadratic.tests.find((t) => t.question === question)!;
}

function differs(t: PoolingTest, alpha: number): boolean {
  return t.result.kind === 'f-test' && t.result.p < alpha;
}

function yearList(years: readonly (number | null)[]): string {
  const words = years.map((y) => (y === null ? 'no year' : String(y)));
  return words.length === 2
    ? `${words[0]} and ${words[1]}`
    : `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/**
 * The comparison of the years of every site seen in more than one year.
 * @param plots - every site-year's plots (kg/ha), with any problem carried in (acrossSites)
 * @param analyses - each site-year's analysis by display name
 * @param o - the analysis settings (alpha, level terms)
 * @returns one comparison per site with several site-years, in table order; none otherwise
 * @example
 * yearsCompared(plots, analyses, o)[0].sentence
 * // "Alder Flats, 2024 and 2025: one quadratic per year against … p = 0.003; at the 5% level
 * //  the response to N differs between the years. …"
 */
export function yearsCompared(
  plots: readonly SitePlots[],
  analyses: ReadonlyMap<string, SiteAnalysis>,
  o: AcrossSiteSettings,
): YearComparison[] {
  const bySite = new Map<string, SitePlots[]>();
  for (const p of plots) {
    const list = bySite.get(p.siteName);
    if (list) list.push(p);
    else bySite.set(p.siteName, [p]);
  }
  return [...bySite.entries()]
    .filter(([, years]) => years.length > 1)
    .map(([site, years]) => {
      const tests = sharedResponse(years, analyses, o);
      const response = quadraticTest(tests, 'levels-vs-site-curves');
      const level = quadraticTest(tests, 'common-vs-levels');
      const when = yearList(years.map((y) => y.year));
      const responseWords: TestReadings = {
        comparison: `${site}, ${when}: one quadratic per year against one response to N shared by the years, each year keeping its own yield level`,
        significant: 'the response to N differs between the years',
        notSignificant: 'the years do not differ detectably in their response to N',
      };
      const levelWords: TestReadings = {
        comparison: 'One yield level per year against one for all years (same response)',
        significant: 'the yield level differs between the years',
        notSignificant: 'the years do not differ detectably in yield level',
      };
      return {
        site,
        siteYears: years.map((y) => ({ site: y.site, year: y.year })),
        response,
        level,
        tests,
        sentence: [
          describeFTest(response.result, responseWords, o.alpha),
          describeFTest(level.result, levelWords, o.alpha),
          // A rate averaged over years that respond differently fits neither year.
          differs(response, o.alpha)
            ? "Read each year's curve on its own: a rate across these years averages responses that differ."
            : '',
        ]
          .filter((t) => t !== '')
          .join(' '),
      };
    });
}
