/**
 * The all-sites view's sentence about the regional mixed model at the current prices, in the
 * display unit: the shared sentence (mixedModelSentence) with the screen's rate formatting, and
 * which regional mixed model form the AIC favours (mixedModelFormsSentence).
 */
import type { PricedTrial } from '../../../shared/analysis/priceTrial';
import { mixedModelFormAics } from '../../../shared/analysis/mixedModelFormAics';
import {
  favouredFormRateSentence,
  mixedModelFormsSentence,
} from '../../../shared/economics/mixedModelFormsSentence';
import { mixedModelSentence } from '../../../shared/economics/mixedModelSentence';
import type { RateUnit } from '../../../shared/units/convertRate';
import { formatRate, formatRateInterval } from '../lib/format';

/**
 * What the regional model says and how sure it is, or null without a regional model.
 * @param priced - the priced trial
 * @param unit - display rate unit
 * @param locale - a BCP 47 tag
 * @returns e.g. "Across 6 site-years, the regional quadratic mixed model … puts the most profitable rate at 152 kg/ha (90 % interval 118 to 186 kg/ha). …"
 */
export function regionalModelText(
  priced: PricedTrial,
  unit: RateUnit,
  locale?: string,
): string | null {
  const mixed = priced.across.mixed;
  if (mixed.model === null || priced.mixedOptimum === null) return null;
  const format = {
    rate: (kgHa: number) => formatRate(kgHa, unit, locale),
    interval: (i: Parameters<typeof formatRateInterval>[0]) => formatRateInterval(i, unit, locale),
  };
  const sentence = mixedModelSentence(mixed.siteYears, priced.mixedOptimum, format);
  // Which form (quadratic, quadratic-plateau, linear-plateau) the AIC favours, when several fit,
  // and where a favoured plateau form puts the rate.
  const forms = mixedModelFormAics(priced.across, {
    quadratic: priced.mixedOptimum,
    plateau: priced.plateauMixedOptima,
  });
  return [sentence, mixedModelFormsSentence(forms), favouredFormRateSentence(forms, format)]
    .filter((t) => t !== '')
    .join(' ');
}
