/**
 * The error the across-site analysis throws for a caller's mistake: a grid with
 * no points, a negative price, a band below zero, an unknown sort key. A data
 * problem (a site that cannot be fitted, too few sites for a test) is never
 * thrown (prices are checked by shared/economics, which throws StatsInputError): it is a typed result with its reason.
 */
export type SitesErrorCode = 'bad-grid' | 'bad-argument';

export class SitesInputError extends Error {
  readonly code: SitesErrorCode;

  constructor(code: SitesErrorCode, message: string) {
    super(message);
    this.name = 'SitesInputError';
    this.code = code;
  }
}
