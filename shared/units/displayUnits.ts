/**
 * The two display systems: US (lb/ac rates, bu/ac yields) and metric (kg/ha
 * rates, t/ha yields). Everything inside stays kg/ha; these only choose how to
 * show it.
 */
import type { CropId } from '../table/plotTable';
import { rateFromKgHa, type RateUnit } from './convertRate';
import { yieldFromKgHa, type YieldUnit } from './convertYield';
import { formatQuantity } from './formatQuantity';

export type UnitSystem = 'us' | 'metric';

/** The units rates and yields are shown in (screen, workbook, grower page, JSON). */
export interface DisplayUnits {
  rate: RateUnit;
  yield: YieldUnit;
}

/**
 * The rate and yield units of a display system.
 * @param system - "us" or "metric"
 * @returns the units to show rates and yields in
 * @example
 * displayUnits('us') // { rate: 'lb/ac', yield: 'bu/ac' }
 */
export function displayUnits(system: UnitSystem): DisplayUnits {
  return system === 'us' ? { rate: 'lb/ac', yield: 'bu/ac' } : { rate: 'kg/ha', yield: 't/ha' };
}

/**
 * Formats a canonical rate for display.
 * @param rateKgHa - rate, kg/ha
 * @param system - display system
 * @returns e.g. "160 lb/ac"
 * @example
 * showRate(179.34, 'us') // '160 lb/ac'
 */
export function showRate(rateKgHa: number | null, system: UnitSystem): string {
  const rateUnit = displayUnits(system).rate;
  return formatQuantity(rateKgHa === null ? null : rateFromKgHa(rateKgHa, rateUnit), rateUnit);
}

/**
 * Formats a canonical yield for display.
 * @param yieldKgHa - yield at standard moisture, kg/ha
 * @param crop - crop, for the bushel weight
 * @param system - display system
 * @returns e.g. "200.0 bu/ac"
 * @example
 * showYield(12553.5, 'corn', 'us') // '200.0 bu/ac'
 */
export function showYield(yieldKgHa: number | null, crop: CropId, system: UnitSystem): string {
  const yieldUnit = displayUnits(system).yield;
  return formatQuantity(
    yieldKgHa === null ? null : yieldFromKgHa(yieldKgHa, yieldUnit, crop),
    yieldUnit,
  );
}
