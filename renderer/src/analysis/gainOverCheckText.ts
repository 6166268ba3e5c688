/**
 * The one-site step's sentence on the gain over the check: the slope of the
 * gains over each block's zero-rate plot (shared/analysis/siteResponseOverCheck)
 * in the unit the price ratio is shown in (bu/lb N, kg/kg N), so a reader can
 * hold the two side by side, then what the gains say: they bend (a response that
 * levels off), they do not start from zero, or they start from zero. The
 * numbers all come from the pipeline; this only words and formats them.
 */
import type { ResponseOverCheckOutcome } from '../../../shared/analysis/siteResponseOverCheck';
import type { CropId } from '../../../shared/table/plotTable';
import {
  displayUnits,
  formatNumber,
  formatSignificant,
  formatYield,
  type UnitSystem,
} from '../lib/format';
import { priceRatioDisplay } from './priceInputs';

/**
 * A p-value as the intercept panel writes it after "p": "< 0.001" or "= 0.041".
 * @param p - the p-value
 * @param locale - a BCP 47 tag
 * @returns the comparison and the value
 */
function pText(p: number, locale?: string): string {
  return p < 0.001 ? '< 0.001' : `= ${formatSignificant(p, 2, locale)}`;
}

/**
 * The sentence, in display units: the response through the origin first, then what the gains
 * say at rate zero and about their shape, in plain words.
 * @param g - the site's response over the check (kg grain per kg N, kg/ha)
 * @param system - 'us' (bu/lb N, bu/ac) or 'metric' (kg/kg N, t/ha)
 * @param crop - the crop, for the bushel weight
 * @param locale - a BCP 47 tag
 * @returns one or two sentences, e.g. "Gain over each block's check: 0.213 bu/lb N (95 %
 *   interval 0.196 to 0.230). The gains bend (F = 9.12, p < 0.001): a response that levels off,
 *   so a curve describes it better than this straight line."
 * @example
 * gainOverCheckSentence(site.responseOverCheck, 'metric', 'corn', 'en-US')
 */
export function gainOverCheckSentence(
  g: ResponseOverCheckOutcome,
  system: UnitSystem,
  crop: CropId,
  locale?: string,
): string {
  const slope = (kgPerKg: number) => priceRatioDisplay(kgPerKg, system, crop);
  const unit = slope(1).unit;
  // Three significant digits of the slope, and the interval's ends to the same decimals.
  const size = Math.abs(slope(g.slopeKgPerKg).value);
  const decimals = size > 0 ? Math.min(Math.max(2 - Math.floor(Math.log10(size)), 0), 6) : 3;
  const s = (kgPerKg: number) => formatNumber(slope(kgPerKg).value, decimals, locale);
  const [low, high] = g.slopeCiKgPerKg;
  const level = formatNumber(g.confidenceLevel * 100, 0, locale);
  const head = `Gain over each block’s check: ${s(g.slopeKgPerKg)} ${unit} (${level} % interval ${s(low)} to ${s(high)}).`;
  const atZero = formatYield(g.gainAtZeroKgHa, displayUnits(system).yield, crop, locale);
  const tStats = `t = ${formatNumber(g.t, 2, locale)}, p ${pText(g.p, locale)}`;
  switch (g.reading) {
    case 'bends': {
      const c = g.curvature!;
      return `${head} The gains bend (F = ${formatNumber(c.F, 2, locale)}, p ${pText(c.p, locale)}): a response that levels off, so a curve describes it better than this straight line.`;
    }
    case 'gain-at-zero':
      // Straight gains that meet the axis above zero: the check plots sit low against the
      // fertilized ones, or a bend the test is too weak to see (most of the response by the
      // lowest rate); below zero: the checks sit high, or the response starts slowly.
      return `${head} The gains do not start from zero: ${atZero} at rate zero (${tStats}), with no clear bend: ${
        g.gainAtZeroKgHa > 0
          ? 'the check plots yielded low, or most of the response came by the lowest rate.'
          : 'the check plots yielded high, or the response starts slowly.'
      }`;
    case 'from-zero':
      return `${head} The gains start from zero (${tStats}) and follow a straight line.`;
  }
}
