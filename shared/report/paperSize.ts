/**
 * The paper a report is laid out for: US Letter where it is the usual paper size,
 * A4 elsewhere (ISO 216). A known locale decides by its region (the desktop shell
 * and the workspace pass the user's); without one the display units decide
 * (US units: Letter), which is what the command line does.
 */
import type { DisplayUnits } from '../units/displayUnits';

export type PaperSize = 'letter' | 'a4';

/** Regions where Letter is the usual paper size (common practice). */
const LETTER_REGIONS: ReadonlySet<string> = new Set(['US', 'CA', 'MX', 'PH', 'CL', 'CO', 'VE']);

/**
 * The paper size for a report.
 * @param units - the display units (used when no region is known)
 * @param region - the user's region, ISO 3166 alpha-2 ("US") or a BCP 47 locale ("en-US"); null when unknown
 * @returns "letter" or "a4"
 * @example
 * paperSize({ rate: 'kg/ha', yield: 't/ha' }, 'en-CA') // 'letter'
 * paperSize({ rate: 'lb/ac', yield: 'bu/ac' }, null) // 'letter'
 * paperSize({ rate: 'kg/ha', yield: 't/ha' }, null) // 'a4'
 */
export function paperSize(units: DisplayUnits, region: string | null = null): PaperSize {
  // A region is two capital letters, alone ("US") or after the language ("en-US"); "en" is a
  // language only.
  const code = region?.split(/[-_]/).find((part) => /^[A-Z]{2}$/.test(part)) ?? null;
  if (code) return LETTER_REGIONS.has(code) ? 'letter' : 'a4';
  return units.rate === 'lb/ac' ? 'letter' : 'a4';
}
