/**
 * The plain words about a rate × factor site's levels that the grower page and the command-line
 * summary print: whether the levels respond differently, and which level returns the most at
 * its own recommended rate, with how sure the resamples are. Numbers go through the caller's
 * formatters, so each output speaks its own units.
 *
 * How sure, in words, from the share of paired resamples in which the best level returned the
 * most (common practice for plain-language uncertainty; the thresholds are ours): 95 % or more
 * "almost every", 80 % or more "most", else "only about half/some of", with the advice to treat
 * the levels as alike.
 */
import { formatP } from '../analysis/describeFTest';
import type { LevelMixedReport, SiteLevelsReport } from './trialReport';

/** Formatters of the caller's units: a rate (kg/ha in) and money per area (currency/ha in). */
export interface LevelFormat {
  rate: (kgHa: number) => string;
  money: (perHa: number) => string;
}

/** How sure the resamples are that the best level returns most, in words. */
export function sureWords(share: number): string {
  if (share >= 0.95) return 'in almost every resample';
  if (share >= 0.8) return 'in most resamples';
  return 'in only some resamples, so treat the levels as returning about the same';
}

/**
 * Whether the levels respond differently, in one sentence.
 * @param f - the site's levels report
 * @returns e.g. "The response to N differs between the Timing levels (p = 0.002)."
 * @example
 * levelTestSentence(report.levels[0]) // 'The Timing levels do not differ detectably in their response to N (p = 0.50).'
 */
export function levelTestSentence(f: SiteLevelsReport): string {
  const r = f.test.quadratic.result;
  if (r.kind !== 'f-test')
    return `Whether the ${f.factor} levels respond differently could not be tested (${r.reason}).`;
  return r.p < f.test.alpha
    ? `The response to N differs between the ${f.factor} levels (quadratic curves compared, ${formatP(r.p)}).`
    : `The ${f.factor} levels do not differ detectably in their response to N (quadratic curves compared, ${formatP(r.p)}).`;
}

/**
 * Which level returns most, by how much and how sure, in one or two sentences.
 * @param f - the site's levels report
 * @param fmt - the caller's rate and money formatters
 * @returns the sentences, or a sentence saying no level has a return to compare
 * @example
 * bestLevelSentence(report.levels[0], fmt)
 * // 'Split returns the most at its own rate (130 lb N/ac): 18 $/ac more than At planting
 * //  (90 % interval 2 to 35 $/ac); it returned the most in most resamples (84 %).'
 */
export function bestLevelSentence(f: SiteLevelsReport, fmt: LevelFormat): string {
  const c = f.comparison;
  const best = f.levels.find((l) => l.level === c.best);
  if (!best) return `No ${f.factor} level has a recommended rate to compare returns at.`;
  const rate = best.report.recommendation.rateKgHa;
  const head = `${best.level} returns the most at its own recommended rate${rate === null ? '' : ` (${fmt.rate(rate)})`}`;
  const others = c.differences
    .filter((d) => d.returnDifferencePerHa !== null)
    .map((d) => {
      const ci = d.returnDifferenceIntervalPerHa;
      // The interval is of the other level minus the best; said as the best's lead.
      const lead = ci
        ? ` (${Math.round(c.level * 100)} % interval ${fmt.money(-ci[1])} to ${fmt.money(-ci[0])})`
        : '';
      return `${fmt.money(-d.returnDifferencePerHa!)} more than ${d.level}${lead}`;
    });
  const sure =
    c.bestShare === null
      ? 'no resamples were drawn, so how sure this is cannot be said'
      : `it returned the most ${sureWords(c.bestShare)} (${Math.round(c.bestShare * 100)} %)`;
  const r = f.test.quadratic.result;
  // The resamples hold the curves fixed in shape; the F test asks whether they differ at all.
  const caution =
    r.kind === 'f-test' && r.p >= f.test.alpha
      ? ` The curves themselves do not differ detectably (${formatP(r.p)}), so this lead may be chance: take it with caution.`
      : '';
  return `${head}${others.length ? `: ${others.join('; ')}` : ''}; ${sure}.${caution}`;
}

/**
 * What the regional model by level says across the site-years, in plain sentences: whether the
 * levels share one regional curve (the likelihood-ratio test, with its caution for few
 * site-years) and each level's regional rate at its own price with its interval.
 * @param m - the factor's regional model by level
 * @param fmt - the caller's rate formatter (kg/ha in)
 * @returns the sentences; without a model, why there is none
 * @example
 * levelMixedSentence(report.levelMixed[0], fmt)
 * // 'Across 12 site-years, the regional curves of the Timing levels differ (likelihood ratio
 * //  χ² = 84.6 on 2 df, p < 0.001). Regional rate at each level's own price: …'
 */
export function levelMixedSentence(m: LevelMixedReport, fmt: Pick<LevelFormat, 'rate'>): string {
  const fit = m.fit;
  if (fit === null) return `No regional model by ${m.factor}: ${m.reason ?? 'no site-years'}`;
  const t = fit.likelihoodRatio;
  const stat = `likelihood ratio χ² = ${t.statistic.toPrecision(3)} on ${t.df} df, ${formatP(t.p)}`;
  const head =
    t.p < m.alpha
      ? `Across ${fit.siteYears} site-years, the regional curves of the ${m.factor} levels differ (${stat}).`
      : `Across ${fit.siteYears} site-years, the ${m.factor} levels do not differ detectably in their regional curve (${stat}).`;
  // Pinheiro & Bates (2000, §2.4.2): the likelihood-ratio test of fixed effects is liberal with
  // few groups. Measured (`npm run validate`, 400 regions of equal timings): 6.5 % declared
  // different at 5 % with 4 site-years, 5.0 % with 8.
  const few =
    fit.siteYears < 8
      ? ' With this few site-years the test finds differences a little too readily.'
      : '';
  const rates = m.levels.map((l) => {
    const o = l.optimum;
    const level = Math.round(o.level * 100);
    const ci = o.interval
      ? ` (${level} % interval ${fmt.rate(o.interval.lowKgHa)} to ${fmt.rate(o.interval.highKgHa)})`
      : ' (no optimum of its own within the tested rates)';
    return `${l.level} ${fmt.rate(o.rateKgHa)}${ci}`;
  });
  const priced = rates.length
    ? ` Regional rate at each level's own price: ${rates.join('; ')}. These are regional averages; one field's best rate in one season varies more.`
    : '';
  return `${head}${few}${priced}`;
}
