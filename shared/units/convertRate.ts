/**
 * Application rates between the units sheets use and the canonical kg/ha.
 * Factors from unitConstants (exact pound and international acre).
 */
import { formatQuantity } from './formatQuantity';
import { G_PER_KG, LB_AC_TO_KG_HA, M2_PER_HA } from './unitConstants';

/** Units an application rate (of product or of nutrient) can be given in. */
export type RateUnit = 'kg/ha' | 'lb/ac' | 'g/m2';

/** Every rate unit, for menus and validation. */
export const rateUnits: readonly RateUnit[] = ['kg/ha', 'lb/ac', 'g/m2'];

function factorToKgHa(unit: RateUnit): number {
  switch (unit) {
    case 'kg/ha':
      return 1;
    case 'lb/ac':
      return LB_AC_TO_KG_HA;
    case 'g/m2':
      // 1 g/m² = 10 000 g/ha = 10 kg/ha.
      return M2_PER_HA / G_PER_KG;
  }
}

/**
 * Converts a rate to kg/ha.
 * @param value - the rate in `unit`
 * @param unit - the unit it is given in
 * @returns the rate, kg/ha
 * @throws {RangeError} for a unit outside {@link rateUnits} (unchecked data)
 * @example
 * convertRate(100, 'lb/ac') // ≈ 112.085 kg/ha
 */
export function convertRate(value: number, unit: RateUnit): number {
  if (!rateUnits.includes(unit)) throw new RangeError(`Unknown rate unit "${String(unit)}".`);
  return value * factorToKgHa(unit);
}

/**
 * Converts a rate from kg/ha to a display unit.
 * @param rateKgHa - the rate, kg/ha
 * @param unit - the unit to show
 * @returns the rate in `unit`
 * @throws {RangeError} for a unit outside {@link rateUnits}
 * @example
 * rateFromKgHa(112.0851, 'lb/ac') // ≈ 100
 */
export function rateFromKgHa(rateKgHa: number, unit: RateUnit): number {
  if (!rateUnits.includes(unit)) throw new RangeError(`Unknown rate unit "${String(unit)}".`);
  return rateKgHa / factorToKgHa(unit);
}

/**
 * A rate unit as an axis or label names it: the rate is of nutrient, so "kg N/ha", "lb N/ac",
 * "g N/m²".
 * @param unit - the display rate unit
 * @returns the label
 * @example nutrientRateUnit('lb/ac') // 'lb N/ac'
 */
export function nutrientRateUnit(unit: RateUnit): string {
  return unit === 'g/m2' ? 'g N/m²' : unit.replace('/', ' N/');
}

/**
 * A nutrient rate with its unit: the number as formatQuantity writes it, the unit as
 * nutrientRateUnit names it.
 * @param value - the rate in `unit`, or null
 * @param unit - the display rate unit
 * @param decimals - override the unit's usual decimals
 * @returns text such as "150 lb N/ac" or "12.5 g N/m²"; "—" for a missing value
 * @example formatNutrientRate(150, 'lb/ac') // '150 lb N/ac'
 */
export function formatNutrientRate(
  value: number | null,
  unit: RateUnit,
  decimals?: number,
): string {
  const text = formatQuantity(value, unit, decimals);
  if (text === '—') return text;
  return `${text.slice(0, text.lastIndexOf(' '))} ${nutrientRateUnit(unit)}`;
}
