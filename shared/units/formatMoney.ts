/**
 * Money as every view writes it: the screen, the grower page, the workbook's labels and the
 * chart axes. One owner, so an amount reads the same wherever it appears: the user's currency
 * (an ISO 4217 code shown as its symbol where the locale has one, else the code or the user's
 * own label after the number), two decimals, and per acre with lb/ac rates, per hectare
 * otherwise (the area the rates are read in).
 */
import type { RateUnit } from './convertRate';
import { numberFormat } from './numberFormat';
import { M2_PER_ACRE, M2_PER_HA } from './unitConstants';

/**
 * An amount in the user's currency.
 * @param amount - the amount; null or NaN prints "–"
 * @param currency - ISO 4217 code such as 'USD', or any label
 * @param locale - a BCP 47 tag; undefined uses the platform's
 * @param decimals - most digits after the separator, 2 unless told; never fewer than 2 (or
 *   `decimals` when it is below 2), so a price of 1.2 at 3 decimals reads "$1.20", not "$1.200",
 *   which a reader used to a comma for thousands could take for twelve hundred
 * @returns e.g. '$1.20' or '1,20 €'
 * @example
 * formatMoney(1.2, 'USD', 'en-US') // '$1.20'
 * formatMoney(0.573, 'USD', 'en-US', 3) // '$0.573'
 */
export function formatMoney(
  amount: number | null,
  currency: string,
  locale?: string,
  decimals = 2,
): string {
  if (amount === null || !Number.isFinite(amount)) return '–';
  const digits = { minimumFractionDigits: Math.min(2, decimals), maximumFractionDigits: decimals };
  try {
    return numberFormat(locale, { style: 'currency', currency, ...digits }).format(amount);
  } catch {
    // Not an ISO code (a user's own label): the number, then the label.
    const number = numberFormat(locale, digits).format(amount);
    return `${number} ${currency}`;
  }
}

/**
 * The area money is quoted per: acres with lb/ac rates, hectares otherwise.
 * @param rateUnit - the display rate unit
 * @returns 'ac' or 'ha'
 * @example moneyArea('lb/ac') // 'ac'
 */
export function moneyArea(rateUnit: RateUnit): 'ac' | 'ha' {
  return rateUnit === 'lb/ac' ? 'ac' : 'ha';
}

/**
 * An amount per hectare, shown per the display area in the user's currency.
 * @param perHa - amount per hectare
 * @param currency - ISO 4217 code
 * @param rateUnit - the display rate unit, which decides the area
 * @param locale - a BCP 47 tag
 * @returns e.g. '$41.20/ac'
 * @example
 * formatMoneyPerArea(100, 'USD', 'lb/ac', 'en-US') // '$40.47/ac'
 */
export function formatMoneyPerArea(
  perHa: number | null,
  currency: string,
  rateUnit: RateUnit,
  locale?: string,
): string {
  if (perHa === null || !Number.isFinite(perHa)) return '–';
  const area = moneyArea(rateUnit);
  const amount = area === 'ac' ? (perHa * M2_PER_ACRE) / M2_PER_HA : perHa;
  return `${formatMoney(amount, currency, locale)}/${area}`;
}
