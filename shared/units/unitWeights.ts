/**
 * The weight a display unit's number counts: what one bushel, tonne, pound or
 * kilogram of grain is in kg (a bushel by the crop's standard weight), and what
 * one pound or kilogram of nutrient is. Prices quoted per such a unit turn into
 * the canonical per-kg prices through these.
 */
import type { CropId } from '../table/plotTable';
import type { RateUnit } from './convertRate';
import type { YieldUnit } from './convertYield';
import { crops } from './crops';
import { KG_PER_LB, KG_PER_T } from './unitConstants';

/**
 * What one unit of the yield unit's weight is, kg (a bushel by the crop's standard weight).
 * @param unit - the yield unit
 * @param crop - the crop, for the bushel weight
 * @returns kg per bu, t, lb or kg
 * @example
 * yieldUnitKg('bu/ac', 'corn') // 25.40117272 (56 lb)
 */
export function yieldUnitKg(unit: YieldUnit, crop: CropId): number {
  switch (unit) {
    case 'bu/ac':
      return crops(crop).bushelLb * KG_PER_LB;
    case 'lb/ac':
      return KG_PER_LB;
    case 't/ha':
      return KG_PER_T;
    default:
      return 1;
  }
}

/**
 * What one unit of the rate unit's weight is, kg.
 * @param unit - the rate unit
 * @returns 0.45359237 for lb/ac, 1 otherwise (kg/ha and g/m² rates are priced per kg)
 * @example
 * rateUnitKg('lb/ac') // 0.45359237
 */
export function rateUnitKg(unit: RateUnit): number {
  return unit === 'lb/ac' ? KG_PER_LB : 1;
}

/**
 * Name of the weight unit a price is quoted per, for labels.
 * @param unit - a yield or rate unit
 * @returns "bu", "t", "lb" or "kg"
 * @example
 * priceWeightName('t/ha') // 't'
 */
export function priceWeightName(unit: YieldUnit | RateUnit): string {
  return unit === 'bu/ac' ? 'bu' : unit === 't/ha' ? 't' : unit === 'lb/ac' ? 'lb' : 'kg';
}
