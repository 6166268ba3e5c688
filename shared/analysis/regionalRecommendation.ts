/**
 * The regional rate in words, always with the cautions that belong beside any
 * fertilizer advice: the rate comes from these trials and these prices; soil,
 * weather and management differ; excess nitrogen costs money and can reach
 * ground and surface water; local regulations and nutrient-management plans
 * come first; a licensed or certified agronomist has the last word. The
 * sentences are shared/economics' recommendationCautions, the same list every
 * rate in Plotrate carries.
 */
import { recommendationCautions } from '../economics/recommendationCautions';
import type { RegionalReturn } from './regionalReturn';

export interface RegionalRecommendationText {
  /** One or two sentences with the rate, the profitable range and how many sites stand behind it. */
  sentence: string;
  /** The cautions, to be shown with the sentence and never without it. */
  cautions: readonly string[];
}

/**
 * Words for a regional rate.
 * @param regional - the regional return at one set of prices
 * @param formatRate - turns a rate in kg/ha into display text, default "152 kg/ha"
 * @returns the sentence and the cautions that must go with it
 * @example
 * regionalRecommendation(r).sentence
 * // "Across 12 sites the highest mean net return is at 152 kg/ha (profitable range 138–167 kg/ha, …)."
 */
export function regionalRecommendation(
  regional: RegionalReturn,
  formatRate: (rateKgHa: number) => string = (r) => `${Math.round(r)} kg/ha`,
): RegionalRecommendationText {
  const n = regional.siteOptima.length;
  if (n === 0 || !Number.isFinite(regional.bestRateKgHa)) {
    return {
      sentence: 'No regional rate: no site has a fitted response to average.',
      cautions: recommendationCautions,
    };
  }
  const { lowKgHa, highKgHa, bandPerHa, contiguous } = regional.profitableRange;
  const pr = regional.priceRatio.toPrecision(3);
  const sentence =
    `Across ${n} site${n === 1 ? '' : 's'} the highest mean net return over the zero-rate check is at ` +
    `${formatRate(regional.bestRateKgHa)}, at a price ratio of ${pr} kg grain per kg N; ` +
    (lowKgHa === highKgHa
      ? `no other rate returns within ${bandPerHa.toPrecision(3)} per ha of the best`
      : `rates from ${formatRate(lowKgHa)} to ${formatRate(highKgHa)} return within ${bandPerHa.toPrecision(3)} per ha of the best`) +
    (contiguous ? '.' : ' (with gaps: the mean return curve has more than one peak).');
  return { sentence, cautions: recommendationCautions };
}
