/**
 * Words for what the optimum's bootstrap interval counted (shared/economics/optimumInterval):
 * the basis (model chosen again in each resample, or the analyst's model throughout) and the
 * shares of resamples counted as a curve's optimum, no plateau, full response or no response.
 * The report's warning and the workbook's note both write them from here.
 */
import type { CountedKind } from '../economics/countedOptimum';
import type { BootstrapSummary } from './trialReport';

/** Each kind's name and the rate it is counted at, in the order they are listed. */
const KIND_WORDS: readonly [CountedKind, string][] = [
  ['curve', "a curve's optimum"],
  ['noResponse', 'no response (counted at 0)'],
  ['noPlateau', 'no plateau (counted at the highest tested rate)'],
  ['fullResponse', 'full response by the lowest rate (counted at the second-lowest rate)'],
];

function percent(share: number): string {
  return `${Math.round(share * 100)} %`;
}

/**
 * How the interval's resamples were priced, a phrase.
 * @param b - the site's bootstrap summary
 * @returns e.g. "all 200 resamples, the model chosen again in each"
 * @example
 * intervalBasisText({ count: 200, basis: 'fixed-model', … }) // "all 200 resamples, with the analyst's model in each"
 */
export function intervalBasisText(b: BootstrapSummary): string {
  return b.basis === 'fixed-model'
    ? `all ${b.count} resamples, with the analyst's model in each`
    : `all ${b.count} resamples, the model chosen again in each`;
}

/**
 * The shares of the kinds that occurred, a phrase listing each with its percentage.
 * @param b - the site's bootstrap summary
 * @param kinds - which kinds to list (default all), in their fixed order; kinds with no resample are left out
 * @returns e.g. "a curve's optimum 82 %, no response (counted at 0) 18 %"
 * @example
 * intervalSharesText(b, ['noResponse', 'noPlateau']) // "no response (counted at 0) 40 %, no plateau (…) 6 %"
 */
export function intervalSharesText(
  b: BootstrapSummary,
  kinds: readonly CountedKind[] = ['curve', 'noResponse', 'noPlateau', 'fullResponse'],
): string {
  return KIND_WORDS.filter(([k]) => kinds.includes(k) && b.shares[k] > 0)
    .map(([k, words]) => `${words} ${percent(b.shares[k])}`)
    .join(', ');
}

/**
 * The warning for a site whose resamples often gave no curve's optimum, or null when too few
 * did to move an end of the interval (fewer than the tail (1 − level)/2 of the resamples).
 * @param b - the site's bootstrap summary
 * @returns one sentence, or null
 * @example
 * intervalSharesWarning(flatSite) // "In 64 % of the bootstrap resamples no curve gave an optimum; …"
 */
export function intervalSharesWarning(b: BootstrapSummary): string | null {
  const other = 1 - b.shares.curve;
  if (!(other >= (1 - b.level) / 2)) return null;
  const what = b.basis === 'fixed-model' ? "the analyst's model" : 'no curve';
  const gave = b.basis === 'fixed-model' ? 'gave no optimum of its own' : 'gave an optimum';
  return `In ${percent(other)} of the bootstrap resamples ${what} ${gave}; each still counts in the interval: ${intervalSharesText(b, ['noResponse', 'noPlateau', 'fullResponse'])}.`;
}
