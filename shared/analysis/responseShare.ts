/**
 * How many sites responded. "Responded" is defined here as: the site's rate effect (one-way
 * ANOVA of yield on rate as a factor, with blocks when present; siteRateEffect) is significant
 * at alpha. It needs no curve, so it does not depend on which model wins. Sites where it cannot
 * be tested are counted apart, not as "no".
 */
import type { SiteAnalysis } from './analyzeSite';
import type { SiteLeftOut } from './commonResponseTests';

/** How many sites responded, by the definition above. */
export interface ResponseShare {
  definition: string;
  responded: number;
  /** Sites where the rate effect could be tested. */
  assessed: number;
  /** responded / assessed (NaN when none was assessed). */
  share: number;
  notAssessed: SiteLeftOut[];
}

const RESPONDED_DEFINITION =
  'A site responded when its rate effect (one-way ANOVA of yield on rate as a factor, blocks included when present) is significant at the chosen level.';

/**
 * The share of the sites whose rate effect is significant, and the sites where it could not be tested.
 * @param sites - the sites' analyses (analyzeSite)
 * @returns counts, the share of those assessed, the definition in words and the sites not assessed
 * @example
 * responseShare(sites).share // e.g. 0.75
 */
export function responseShare(sites: readonly SiteAnalysis[]): ResponseShare {
  const assessed = sites.filter((s) => s.rateEffect.test.kind === 'f-test');
  const responded = assessed.filter((s) => s.responded).length;
  return {
    definition: RESPONDED_DEFINITION,
    responded,
    assessed: assessed.length,
    share: assessed.length > 0 ? responded / assessed.length : NaN,
    notAssessed: sites
      .filter((s) => s.rateEffect.test.kind === 'no-test')
      .map((s) => ({
        site: s.site,
        reason: s.rateEffect.test.kind === 'no-test' ? s.rateEffect.test.reason : '',
      })),
  };
}
