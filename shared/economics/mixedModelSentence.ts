/**
 * The plain sentence that says what the regional mixed model recommends and how sure it is.
 * Rates are written by the caller's formatters, so the screen and the report use their units.
 */
import type { MixedModelOptimum } from './mixedModelOptimum';

/** How the sentence writes a rate and an interval. */
export interface MixedModelSentenceFormat {
  /** One rate held in kg/ha, with its unit, e.g. "152 kg/ha". */
  rate: (rateKgHa: number) => string;
  /** An interval held in kg/ha with open ends marked, unit once, e.g. "118 to 186 kg/ha". */
  interval: (interval: NonNullable<MixedModelOptimum['interval']>) => string;
}

/**
 * What the regional model says, in one or two sentences.
 * @param siteYears - how many site-years the model was fitted to
 * @param optimum - mixedModelOptimum at the current prices
 * @param format - how to write rates
 * @returns e.g. "Across 12 site-years, the regional quadratic mixed model … puts the most profitable rate at
 *   152 kg/ha (90 % interval 118 to 186 kg/ha). …"
 * @example
 * mixedModelSentence(12, optimum, { rate: (r) => `${r} kg/ha`, interval: (i) => `${i.lowKgHa} to ${i.highKgHa} kg/ha` })
 */
export function mixedModelSentence(
  siteYears: number,
  optimum: MixedModelOptimum,
  format: MixedModelSentenceFormat,
): string {
  const rate = format.rate(optimum.rateKgHa);
  const where = `Across ${siteYears} site-years, the regional quadratic mixed model (one curve for the region, each site-year departing from it at random)`;
  if (optimum.status === 'no-maximum' || optimum.interval === null) {
    return `${where} does not bend down within the tested rates, so it has no optimum of its own; of the tested range, ${rate} pays best on it.`;
  }
  const level = Math.round(optimum.level * 100);
  const parts = [
    `${where} puts the most profitable rate at ${rate} (${level} % interval ${format.interval(optimum.interval)}).`,
  ];
  if (optimum.status === 'capped-high') {
    parts.push(
      'The regional curve still pays at the highest rate tested, so the rate stops there.',
    );
  } else if (optimum.status === 'capped-low') {
    parts.push('On the regional curve even the lowest rate tested does not pay.');
  }
  parts.push(
    "The interval is for the regional average; one field's best rate in one season varies more.",
  );
  return parts.join(' ');
}
