/**
 * The one-site step's sentence on the gain over the check: the slope of the
 * gains over each block's zero-rate plot (shared/sites siteResponseOverCheck)
 * in the unit the price ratio is shown in (bu/lb N, kg/kg N), so a reader can
 * hold the two side by side, and whether a gain at rate zero is present. The
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
 * The sentence, in display units.
 * @param g - the site's response over the check (kg grain per kg N, kg/ha)
 * @param system - 'us' (bu/lb N, bu/ac) or 'metric' (kg/kg N, t/ha)
 * @param crop - the crop, for the bushel weight
 * @param locale - a BCP 47 tag
 * @returns one sentence, e.g. "Gain over each block's check: 0.467 bu/lb N (95 % interval 0.377
 *   to 0.557), and a gain of 42.3 bu/ac at rate zero is present (t = 4.33, p < 0.001), …"
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
  const stats = `t = ${formatNumber(g.t, 2, locale)}, p ${pText(g.p, locale)}`;
  const head = `Gain over each block’s check: ${s(g.slopeKgPerKg)} ${unit} (${level} % interval ${s(low)} to ${s(high)})`;
  if (!g.biasPresent) {
    return `${head}, and no gain at rate zero is evident (${stats}): the gains start from zero.`;
  }
  const atZero = formatYield(g.gainAtZeroKgHa, displayUnits(system).yield, crop, locale);
  // A straight line through gains that level off also meets the axis above zero, so say both.
  return `${head}, and a gain of ${atZero} at rate zero is present (${stats}): a bias at the check plots, or a response that levels off.`;
}
