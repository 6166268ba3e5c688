/**
 * A number with its unit at a precision a reader of a trial report expects:
 * enough significant digits to tell treatments apart, no false precision.
 */

/** How many decimals each unit is usually shown with (common practice in trial reports). */
const decimalsByUnit: Record<string, number> = {
  'kg/ha': 0,
  'lb/ac': 0,
  'kg N/ha': 0,
  'lb N/ac': 0,
  'bu/ac': 1,
  't/ha': 2,
  'g/m2': 1,
  '%': 1,
  '$/ac': 2,
  '$/ha': 2,
  'lb/bu': 1,
  'kg/hl': 1,
};

/** How a unit is written for people (superscripts, not ASCII). */
const unitLabel: Record<string, string> = { 'g/m2': 'g/m²', m2: 'm²', ft2: 'ft²' };

/**
 * Formats a value with its unit.
 * @param value - the number, in `unit`
 * @param unit - the unit text, e.g. "bu/ac", "kg/ha", "%"
 * @param decimals - override the unit's usual number of decimals
 * @returns text such as "187.4 bu/ac" or "12,553 kg/ha"; "—" for a
 *   missing or non-finite value
 * @example
 * formatQuantity(187.36, 'bu/ac') // '187.4 bu/ac'
 * formatQuantity(12553.4, 'kg/ha') // '12,553 kg/ha'
 */
export function formatQuantity(value: number | null, unit: string, decimals?: number): string {
  if (value === null || !Number.isFinite(value)) return '—';
  let d = decimals ?? decimalsByUnit[unit];
  if (d === undefined) {
    // Unknown unit: three significant digits, at most three decimals.
    const mag = value === 0 ? 0 : Math.floor(Math.log10(Math.abs(value)));
    d = Math.min(3, Math.max(0, 2 - mag));
  }
  const text = value.toLocaleString('en-US', {
    minimumFractionDigits: d,
    maximumFractionDigits: d,
  });
  // "-0" reads as a sign error in a table.
  const clean = /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
  const label = unitLabel[unit] ?? unit;
  return label === '%' ? `${clean} %` : `${clean} ${label}`;
}
