/**
 * How a status message or explanation writes a rate. The models and economics
 * stages work in kg/ha, but their sentences end up in reports that may speak
 * lb/ac, so every sentence that names a rate takes it through a RateFormat the
 * caller can pass. The default writes kg/ha rounded to a precision a field can
 * apply (never the raw floating-point value of a search: 269 kg/ha, not
 * 269.0042774866694 kg/ha).
 */

/** Writes a rate given in kg/ha: the number alone, and the unit once after it or a range. */
export interface RateFormat {
  /** The rate as display text without its unit, e.g. "269" (or "240" for lb/ac). */
  number: (rateKgHa: number) => string;
  /** The unit written after a rate or a range, e.g. "kg/ha" or "lb N/ac". */
  unit: string;
}

/**
 * A rate in kg/ha as it is read in the field: whole kilograms from 100 kg/ha up,
 * one decimal below (a rate of 7.5 kg/ha is real), no trailing zeros.
 * @param rateKgHa - the rate, kg/ha
 * @returns the rounded number as text ("NaN" stays "NaN")
 * @example
 * roundedKgHa(269.0042774866694) // "269"
 * roundedKgHa(42.25) // "42.3"
 * roundedKgHa(40) // "40"
 */
export function roundedKgHa(rateKgHa: number): string {
  if (!Number.isFinite(rateKgHa)) return String(rateKgHa);
  // A whole number over 10 prints without noise (String gives the shortest
  // digits that round-trip); adding 0 turns −0 into 0.
  const rounded = Math.abs(rateKgHa) >= 100 ? Math.round(rateKgHa) : Math.round(rateKgHa * 10) / 10;
  return String(rounded + 0);
}

/** The default: kg/ha, rounded by roundedKgHa. */
export const KG_HA_FORMAT: RateFormat = { number: roundedKgHa, unit: 'kg/ha' };

/**
 * One rate with its unit.
 * @param format - how to write it
 * @param rateKgHa - the rate, kg/ha
 * @returns e.g. "269 kg/ha"
 * @example
 * rateText(KG_HA_FORMAT, 120) // "120 kg/ha"
 */
export function rateText(format: RateFormat, rateKgHa: number): string {
  return `${format.number(rateKgHa)} ${format.unit}`;
}

/**
 * Two rates with the unit written once.
 * @param format - how to write them
 * @param lowKgHa - the lower rate, kg/ha
 * @param highKgHa - the higher rate, kg/ha
 * @returns e.g. "0 and 40 kg/ha"
 * @example
 * rateRangeText(KG_HA_FORMAT, 0, 40) // "0 and 40 kg/ha"
 */
export function rateRangeText(format: RateFormat, lowKgHa: number, highKgHa: number): string {
  return `${format.number(lowKgHa)} and ${format.number(highKgHa)} ${format.unit}`;
}
