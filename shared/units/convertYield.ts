/**
 * Grain yields between the units sheets use and kg/ha. A bushel is a weight
 * here (the crop's standard bushel, lb/bu), as grain is sold by weight.
 * Moisture is a separate step (adjustMoisture): this only changes units.
 */
import type { CropId } from '../table/plotTable';
import { crops } from './crops';
import {
  G_PER_KG,
  KG_PER_LB,
  KG_PER_T,
  LB_AC_TO_KG_HA,
  M2_PER_ACRE,
  M2_PER_HA,
  M_PER_FT,
} from './unitConstants';

/** Units a yield can be given in. "t/ha" is the tonne (Mg) per hectare. */
export type YieldUnit = 'kg/ha' | 't/ha' | 'lb/ac' | 'bu/ac' | 'g/m2';

/**
 * Units a sheet's yield column may carry: the display units and the quintal per hectare (q/ha,
 * 100 kg/ha; also written dt/ha, the decitonne; common practice in several countries), read in
 * but never shown (the views use t/ha).
 */
export type SheetYieldUnit = YieldUnit | 'q/ha';

/** Kilograms in a quintal (and in a decitonne): 100 (NIST SP 811 lists the quintal as 100 kg). */
const KG_PER_QUINTAL = 100;

/**
 * Converts a yield as a sheet gives it to kg/ha.
 * @param value - the yield in `unit`
 * @param unit - its unit, a display unit or q/ha
 * @param crop - the crop, for the bushel weight
 * @returns the yield, kg/ha
 * @throws {RangeError} for an unknown unit
 * @example sheetYieldToKgHa(72.5, 'q/ha', 'wheat') // 7250
 */
export function sheetYieldToKgHa(value: number, unit: SheetYieldUnit, crop: CropId): number {
  return unit === 'q/ha' ? value * KG_PER_QUINTAL : convertYield(value, unit, crop);
}

/** Every yield unit, for menus and validation. */
export const yieldUnits: readonly YieldUnit[] = ['kg/ha', 't/ha', 'lb/ac', 'bu/ac', 'g/m2'];

function factorToKgHa(unit: YieldUnit, crop: CropId): number {
  switch (unit) {
    case 'kg/ha':
      return 1;
    case 't/ha':
      return KG_PER_T;
    case 'lb/ac':
      return LB_AC_TO_KG_HA;
    case 'bu/ac':
      return crops(crop).bushelLb * LB_AC_TO_KG_HA;
    case 'g/m2':
      return M2_PER_HA / G_PER_KG;
  }
}

/**
 * Converts a yield to kg/ha (same moisture basis as given).
 * @param value - the yield in `unit`
 * @param unit - its unit
 * @param crop - the crop, for the bushel weight (lb/bu)
 * @returns the yield, kg/ha
 * @throws {RangeError} for an unknown unit or crop (unchecked data)
 * @example
 * convertYield(200, 'bu/ac', 'corn') // ≈ 12553.5 kg/ha (200 × 56 lb × 1.120851)
 */
export function convertYield(value: number, unit: YieldUnit, crop: CropId): number {
  if (!yieldUnits.includes(unit)) throw new RangeError(`Unknown yield unit "${String(unit)}".`);
  return value * factorToKgHa(unit, crop);
}

/**
 * Converts a yield from kg/ha to a display unit.
 * @param yieldKgHa - the yield, kg/ha
 * @param unit - the unit to show
 * @param crop - the crop, for the bushel weight (lb/bu)
 * @returns the yield in `unit`
 * @throws {RangeError} for an unknown unit or crop
 * @example
 * yieldFromKgHa(12553.5, 'bu/ac', 'corn') // ≈ 200
 */
export function yieldFromKgHa(yieldKgHa: number, unit: YieldUnit, crop: CropId): number {
  if (!yieldUnits.includes(unit)) throw new RangeError(`Unknown yield unit "${String(unit)}".`);
  return yieldKgHa / factorToKgHa(unit, crop);
}

/** Units a plot's harvested weight can be given in. */
export type MassUnit = 'kg' | 'g' | 'lb';
/** Units a plot's area can be given in. */
export type AreaUnit = 'm2' | 'ft2' | 'ha' | 'ac';
/** Units a plot's length or width can be given in. */
export type LengthUnit = 'm' | 'ft';

/**
 * Turns a harvested plot weight over a plot area into kg/ha (same moisture).
 * @param weight - harvested grain weight in `massUnit`
 * @param massUnit - kg, g or lb
 * @param area - plot area in `areaUnit`
 * @param areaUnit - m2, ft2, ha or ac
 * @returns yield, kg/ha
 * @throws {RangeError} when the area is not positive
 * @example
 * plotWeightToKgHa(9.6, 'kg', 12, 'm2') // 8000 kg/ha
 */
export function plotWeightToKgHa(
  weight: number,
  massUnit: MassUnit,
  area: number,
  areaUnit: AreaUnit,
): number {
  if (!(area > 0)) throw new RangeError(`A plot area must be positive; got ${area}.`);
  const kg = massUnit === 'kg' ? weight : massUnit === 'g' ? weight / G_PER_KG : weight * KG_PER_LB;
  const m2 = areaToM2(area, areaUnit);
  return (kg / m2) * M2_PER_HA;
}

/**
 * Converts an area to square metres.
 * @param area - the area in `unit`
 * @param unit - m2, ft2, ha or ac
 * @returns area, m²
 * @example
 * areaToM2(1, 'ac') // 4046.8564224
 */
export function areaToM2(area: number, unit: AreaUnit): number {
  switch (unit) {
    case 'm2':
      return area;
    case 'ft2':
      return area * M_PER_FT * M_PER_FT;
    case 'ha':
      return area * M2_PER_HA;
    case 'ac':
      return area * M2_PER_ACRE;
  }
}

/**
 * Converts a length to metres.
 * @param length - the length in `unit`
 * @param unit - m or ft
 * @returns length, m
 * @example
 * lengthToM(10, 'ft') // 3.048
 */
export function lengthToM(length: number, unit: LengthUnit): number {
  return unit === 'ft' ? length * M_PER_FT : length;
}
