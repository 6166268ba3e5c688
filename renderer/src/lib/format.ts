/**
 * Numbers on screen: every figure goes out with its unit and a precision that
 * suits what it measures, in the user's locale (Intl). The engine keeps kg/ha
 * inside; this module converts at the edge, so the US/metric switch touches
 * nothing but display.
 */
import { parseNumberText } from '../../../shared/table/parseNumberText';
import type { RateProfileInterval } from '../../../shared/models/joinProfile';
import { profileIntervalText } from '../../../shared/report/modelNotes';
import type { CropId } from '../../../shared/table/plotTable';
import { rateFromKgHa, type RateUnit } from '../../../shared/units/convertRate';
import { numberFormat } from '../../../shared/units/numberFormat';
import { yieldFromKgHa, type YieldUnit } from '../../../shared/units/convertYield';
import {
  displayUnits as sharedDisplayUnits,
  type DisplayUnits as SharedDisplayUnits,
  type UnitSystem,
} from '../../../shared/units/displayUnits';
// Money has one owner in the engine, shared by the screen and the reports.
import { RATE_DECIMALS } from '../../../shared/units/rateRounding';
export { formatMoney, formatMoneyPerArea } from '../../../shared/units/formatMoney';

/** The one switch between unit families ('metric' or 'us'), as shared/units names it. */
export type { UnitSystem };

/** The display units a unit system stands for (shared/units), with the price boxes' area and mass. */
export interface DisplayUnits extends SharedDisplayUnits {
  /** Area a price per area is given in. */
  area: 'ha' | 'ac';
  /** Mass a price per mass is given in. */
  mass: 'kg' | 'lb';
}

/**
 * The display units of a unit system.
 * @param system - 'metric' (kg/ha rates, t/ha yields) or 'us' (lb/ac, bu/ac)
 * @returns the rate, yield, area and mass units to show
 * @example
 * displayUnits('us').yield // 'bu/ac'
 */
export function displayUnits(system: UnitSystem): DisplayUnits {
  const units = sharedDisplayUnits(system);
  return system === 'us'
    ? { ...units, area: 'ac', mass: 'lb' }
    : { ...units, area: 'ha', mass: 'kg' };
}

/** Decimals that match how finely each unit is measured in a plot trial (common practice). */
const yieldDecimals: Record<YieldUnit, number> = {
  'kg/ha': 0,
  't/ha': 2,
  'lb/ac': 0,
  'bu/ac': 1,
  'g/m2': 0,
};

/** Unit labels as a reader writes them (superscripts rather than ASCII). */
const unitLabels: Record<string, string> = {
  'g/m2': 'g/m²',
  m2: 'm²',
  ft2: 'ft²',
};

/**
 * A unit as printed on screen.
 * @param unit - a unit code, e.g. 'g/m2'
 * @returns its printed form, e.g. 'g/m²'
 * @example
 * unitLabel('kg/ha') // 'kg/ha'
 */
export function unitLabel(unit: string): string {
  return unitLabels[unit] ?? unit;
}

/**
 * Formats a plain number in the locale with fixed decimals; "–" for null or NaN.
 * @param value - the number
 * @param decimals - digits after the decimal separator
 * @param locale - a BCP 47 tag, e.g. 'de-DE'; undefined uses the browser's
 * @returns the formatted text
 * @example
 * formatNumber(1234.5, 1, 'de-DE') // '1.234,5'
 */
export function formatNumber(
  value: number | null | undefined,
  decimals: number,
  locale?: string,
): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  return numberFormat(locale, {
    minimumFractionDigits: decimals,
    maximumFractionDigits: decimals,
  }).format(value);
}

/**
 * Formats a number to a count of significant digits (for ratios, p-values, r).
 * @param value - the number
 * @param digits - significant digits, 1–21
 * @param locale - a BCP 47 tag
 * @returns the formatted text, "–" for null or NaN
 * @example
 * formatSignificant(0.0012345, 3, 'en-US') // '0.00123'
 */
export function formatSignificant(
  value: number | null | undefined,
  digits: number,
  locale?: string,
): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  return numberFormat(locale, {
    maximumSignificantDigits: digits,
  }).format(value);
}

/**
 * A rate held in kg/ha, shown in the display unit with its unit.
 * @param rateKgHa - nutrient rate, kg/ha
 * @param unit - display unit
 * @param locale - a BCP 47 tag
 * @returns e.g. '150 kg/ha' or '134 lb/ac'
 * @example
 * formatRate(112.085, 'lb/ac', 'en-US') // '100 lb/ac'
 */
export function formatRate(rateKgHa: number | null, unit: RateUnit, locale?: string): string {
  if (rateKgHa === null || !Number.isFinite(rateKgHa)) return '–';
  return `${formatNumber(rateFromKgHa(rateKgHa, unit), RATE_DECIMALS[unit], locale)} ${unitLabel(unit)}`;
}

/**
 * A profile interval of a rate held in kg/ha, in the display unit with the unit once; an end the
 * data leave open is marked ≤ (below) or ≥ (above), as the report writes it (profileIntervalText).
 * @param interval - the interval, kg/ha, with its open ends
 * @param unit - display unit
 * @param locale - a BCP 47 tag
 * @returns e.g. '101 to 185 kg/ha' or '127 to ≥ 200 kg/ha'; '–' for none
 * @example
 * formatRateInterval({ lowKgHa: 112.085, highKgHa: 224.17, lowOpen: false, highOpen: true }, 'lb/ac', 'en-US') // '100 to ≥ 200 lb/ac'
 */
export function formatRateInterval(
  interval: Pick<RateProfileInterval, 'lowKgHa' | 'highKgHa' | 'lowOpen' | 'highOpen'> | null,
  unit: RateUnit,
  locale?: string,
): string {
  if (!interval) return '–';
  const text = profileIntervalText(interval, (kgHa) =>
    formatNumber(rateFromKgHa(kgHa, unit), RATE_DECIMALS[unit], locale),
  );
  return `${text} ${unitLabel(unit)}`;
}

/**
 * A yield held in kg/ha at standard moisture, shown in the display unit with its unit.
 * @param yieldKgHa - yield, kg/ha
 * @param unit - display unit
 * @param crop - the crop (bushel weight for bu/ac)
 * @param locale - a BCP 47 tag
 * @returns e.g. '11.25 t/ha' or '179.3 bu/ac'
 * @example
 * formatYield(12553.5, 'bu/ac', 'corn', 'en-US') // '200.0 bu/ac'
 */
export function formatYield(
  yieldKgHa: number | null,
  unit: YieldUnit,
  crop: CropId,
  locale?: string,
): string {
  if (yieldKgHa === null || !Number.isFinite(yieldKgHa)) return '–';
  const shown = yieldFromKgHa(yieldKgHa, unit, crop);
  return `${formatNumber(shown, yieldDecimals[unit], locale)} ${unitLabel(unit)}`;
}

/**
 * A date in the user's locale, e.g. for "saved at".
 * @param iso - ISO 8601 text or a Date
 * @param locale - a BCP 47 tag
 * @returns the date and time, medium style
 * @example
 * formatDate('2026-03-01T10:00:00Z', 'en-GB') // '1 Mar 2026, 10:00' (in a UTC time zone)
 */
export function formatDate(iso: string | Date, locale?: string): string {
  const date = typeof iso === 'string' ? new Date(iso) : iso;
  if (Number.isNaN(date.getTime())) return '–';
  return new Intl.DateTimeFormat(locale, { dateStyle: 'medium', timeStyle: 'short' }).format(date);
}

/**
 * The number of decimals to show for a yield unit (for chart hover text and tables).
 * @param unit - yield unit
 * @returns decimals
 * @example
 * yieldDecimalsFor('t/ha') // 2
 */
export function yieldDecimalsFor(unit: YieldUnit): number {
  return yieldDecimals[unit];
}

/**
 * The number of decimals to show for a rate unit.
 * @param unit - rate unit
 * @returns decimals
 * @example
 * rateDecimalsFor('kg/ha') // 0
 */
export function rateDecimalsFor(unit: RateUnit): number {
  return RATE_DECIMALS[unit];
}

/**
 * A file size in the locale, in kB or MB.
 * @param bytes - size in bytes
 * @param locale - a BCP 47 tag
 * @returns e.g. '20.1 kB'
 * @example
 * formatFileSize(20602, 'en-US') // '20.1 kB'
 */
export function formatFileSize(bytes: number, locale?: string): string {
  if (bytes < 1000) return `${formatNumber(bytes, 0, locale)} bytes`;
  return bytes < 1_000_000
    ? `${formatNumber(bytes / 1000, 1, locale)} kB`
    : `${formatNumber(bytes / 1_000_000, 1, locale)} MB`;
}

/**
 * Plotly's `separators` layout value (decimal mark then group mark) for a locale,
 * so chart ticks read like the numbers beside them.
 * @param locale - a BCP 47 tag
 * @returns e.g. '.,' for en-US, ',.' for de-DE
 * @example
 * plotlySeparators('fr-FR') // ', ' (a narrow no-break space groups thousands)
 */
export function plotlySeparators(locale?: string): string {
  const parts = numberFormat(locale).formatToParts(12345.6);
  const decimal = parts.find((p) => p.type === 'decimal')?.value ?? '.';
  const group = parts.find((p) => p.type === 'group')?.value ?? ',';
  return decimal + group;
}

/**
 * Reads a number a person typed in a field, with either the locale's decimal mark or a plain
 * point ("0,62" and "0.62" are both 0.62 in any locale), and the locale's thousands groups.
 * The rules are import's (shared/table/parseNumberText), so a field and a cell read alike.
 * @param text - what was typed
 * @param locale - the workspace's number locale, e.g. 'de-DE'
 * @returns the number, or null when the text is not one
 * @example
 * readTypedNumber('0,62', 'en-US') // 0.62
 * readTypedNumber('1.250,5', 'de-DE') // 1250.5
 */
export function readTypedNumber(text: string, locale?: string): number | null {
  const decimalComma = plotlySeparators(locale)[0] === ',';
  return parseNumberText(text, decimalComma) ?? parseNumberText(text, !decimalComma);
}

/**
 * A plot's rate or yield held in kg/ha, in the display unit of its kind (a correction, a cell).
 * @param role - "rate" or "yield"
 * @param kgHa - the value, kg/ha; null prints "–"
 * @param units - the display units
 * @param crop - the crop, for bushels
 * @param locale - a BCP 47 tag
 * @returns e.g. '13.90 t/ha' or '135 kg/ha'
 * @example formatPlotValue('rate', 135, { rate: 'kg/ha', yield: 't/ha' }, 'corn', 'en-US') // '135 kg/ha'
 */
export function formatPlotValue(
  role: 'rate' | 'yield',
  kgHa: number | null,
  units: { rate: RateUnit; yield: YieldUnit },
  crop: CropId,
  locale?: string,
): string {
  return role === 'yield'
    ? formatYield(kgHa, units.yield, crop, locale)
    : formatRate(kgHa, units.rate, locale);
}
