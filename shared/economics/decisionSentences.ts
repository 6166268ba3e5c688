/**
 * The plain sentences that go with the two recommendations a curve's optimum does not give
 * (shared/analysis/siteDecision decides which applies): no N at a site that showed no
 * response, and a full response by the lowest non-zero rate, given as a range. The screen,
 * the grower page and the workbook print these, so they say the same thing.
 */

/**
 * The caution printed with a non-responding site's recommendation of no N.
 * @param p - the rate effect's p-value
 * @returns one plain paragraph
 * @example
 * noResponseSentence(0.41) // 'The trial found no yield response to N at this site …'
 */
export function noResponseSentence(p: number): string {
  return (
    `The trial found no yield response to N at this site (rate effect p = ${p.toFixed(2)}), so no N is advised from this trial. ` +
    'This does not show that the crop here needs no N: a small response, or one in another season or on other soil, can go unseen in a trial of this size. The fitted curves are kept for reference. Local regulations, nutrient-management plans and licensed or certified agronomists come first.'
  );
}

/**
 * The plain sentence that goes with a full response by the lowest non-zero rate.
 * @param low - the lowest tested rate, formatted in the display units (e.g. "0 lb N/ac")
 * @param high - the second-lowest tested rate, formatted the same way
 * @returns one plain paragraph
 * @example
 * fullResponseSentence('0 kg N/ha', '40 kg N/ha') // 'The whole yield response came by the lowest rate …'
 */
export function fullResponseSentence(low: string, high: string): string {
  return (
    `The whole yield response came by the lowest rate tested above zero, so the best rate lies between ${low} and ${high}; this trial cannot place it more closely. ` +
    `Apply no more than ${high}; a trial with rates below ${high} would show how much less is enough.`
  );
}
