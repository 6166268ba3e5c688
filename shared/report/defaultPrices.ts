/**
 * Illustrative prices for a run where the user gave none, so the report can
 * still be made, and is marked loudly as resting on made-up prices. These are
 * round numbers of the usual order of magnitude (not market data, not a
 * forecast): grain per kg at standard moisture, nitrogen per kg of N.
 */
import type { CropId } from '../table/plotTable';
import type { ReportUnits } from './reportSettings';
import { rateUnitKg, yieldUnitKg } from './reportSettings';

const grainPerKg: Record<CropId, number> = {
  corn: 0.18,
  wheat: 0.22,
  soybean: 0.4,
  barley: 0.2,
  sorghum: 0.17,
  oats: 0.25,
  canola: 0.45,
};

/** Illustrative nitrogen price per kg of N. */
const nitrogenPerKg = 1.3;

/**
 * Illustrative prices in the report's units.
 * @param crop - the crop
 * @param units - display units (grain per bu, t, kg or lb; N per lb or kg)
 * @returns grain price per yield weight unit and N price per rate weight unit
 * @example
 * defaultPrices('corn', { rate: 'lb/ac', yield: 'bu/ac' }).grainPrice // ≈ 4.57 per bu
 */
export function defaultPrices(
  crop: CropId,
  units: ReportUnits,
): { grainPrice: number; nutrientPrice: number } {
  return {
    grainPrice: Number((grainPerKg[crop] * yieldUnitKg(units.yield, crop)).toPrecision(3)),
    nutrientPrice: Number((nitrogenPerKg * rateUnitKg(units.rate)).toPrecision(3)),
  };
}
