/**
 * Prices as the user types them (grain per bushel or tonne, product per lb or
 * kg, application per acre or hectare) against the canonical per-kg and
 * per-ha values the economics reads. Prices are stored canonical, so the
 * US/metric switch changes what is shown, never the optimum.
 */
import { illustrativePrices } from '../../../shared/economics/illustrativePrices';
import type { Prices } from '../../../shared/economics/priceRatio';
import { priceRatioQuote } from '../../../shared/economics/priceQuote';
import type { CropId } from '../../../shared/table/plotTable';
import type { RateUnit } from '../../../shared/units/convertRate';
import type { YieldUnit } from '../../../shared/units/convertYield';
import { displayUnits } from '../../../shared/units/displayUnits';
import type { ProductId } from '../../../shared/units/products';
import { rateUnitKg, yieldUnitKg } from '../../../shared/units/unitWeights';
import { M2_PER_ACRE, M2_PER_HA } from '../../../shared/units/unitConstants';

/** The price inputs, canonical. */
export interface PriceSettings {
  /** ISO 4217 code, e.g. "USD". */
  currency: string;
  /** Grain, currency per kg at standard moisture. */
  grainPerKg: number;
  /** The product bought, e.g. urea; "nitrogen" for a price per unit of N itself. */
  productId: ProductId;
  /** N content of the product, % by weight (the label's analysis). */
  analysisPct: number;
  /** Product, currency per kg of product. */
  productPerKg: number;
  /** Cost of making an application at all, currency per ha. */
  applicationPerHa: number;
  /** True while these are the built-in illustrative prices, not the user's. */
  illustrative: boolean;
}

/**
 * Illustrative starting prices of a crop (shared/economics illustrativePrices, the same the
 * command line uses; replace with your own).
 * @param crop - the crop
 * @returns price inputs marked illustrative
 */
export function illustrativePriceSettings(crop: CropId): PriceSettings {
  const p = illustrativePrices(crop);
  return {
    currency: p.currency,
    grainPerKg: p.grainPerKg,
    productId: p.productId,
    analysisPct: p.analysisPct,
    productPerKg: p.productPerKg,
    applicationPerHa: 0,
    illustrative: true,
  };
}

/** Illustrative starting prices for corn, before a table says its crop. */
export const ILLUSTRATIVE_PRICES: PriceSettings = illustrativePriceSettings('corn');

/**
 * The canonical prices the economics reads.
 * @param settings - the price inputs
 * @returns grain and nutrient price per kg, application cost per ha
 * @throws {RangeError} when the analysis is not between 0 and 100 %
 * @example
 * canonicalPrices({ ...ILLUSTRATIVE_PRICES, productPerKg: 0.46, analysisPct: 46 }).nutrientPricePerKg // 1
 */
export function canonicalPrices(settings: PriceSettings): Prices {
  if (!(settings.analysisPct > 0 && settings.analysisPct <= 100)) {
    throw new RangeError(
      `The product analysis must be above 0 and at most 100 % N; got ${settings.analysisPct}.`,
    );
  }
  return {
    grainPricePerKg: settings.grainPerKg,
    nutrientPricePerKg: settings.productPerKg / (settings.analysisPct / 100),
    applicationCostPerHa: settings.applicationPerHa,
  };
}

/** Area of the display rate unit's "per area": acres for lb/ac, hectares otherwise. */
function haPerDisplayArea(unit: RateUnit): number {
  return unit === 'lb/ac' ? M2_PER_ACRE / M2_PER_HA : 1;
}

/** Grain price per display weight (bu, t, lb or kg) from per kg. */
export function grainPriceShown(perKg: number, unit: YieldUnit, crop: CropId): number {
  return perKg * yieldUnitKg(unit, crop);
}
/** Grain price per kg from per display weight. */
export function grainPriceFromShown(shown: number, unit: YieldUnit, crop: CropId): number {
  return shown / yieldUnitKg(unit, crop);
}
/** Product price per display weight (lb for lb/ac, kg otherwise) from per kg. */
export function productPriceShown(perKg: number, unit: RateUnit): number {
  return perKg * rateUnitKg(unit);
}
/** Product price per kg from per display weight. */
export function productPriceFromShown(shown: number, unit: RateUnit): number {
  return shown / rateUnitKg(unit);
}
/** Money per display area (ac or ha) from per ha: the application cost, the shortfall tolerance. */
export function moneyPerAreaShown(perHa: number, unit: RateUnit): number {
  return perHa * haPerDisplayArea(unit);
}
/** Money per ha from per display area. */
export function moneyPerAreaFromShown(shown: number, unit: RateUnit): number {
  return shown / haPerDisplayArea(unit);
}

/**
 * The price ratio as the trade quotes it (shared/report priceRatioQuote, as the
 * report prints it): bushels per pound of N in US units, kilograms of grain per
 * kilogram of N in metric.
 * @param ratioKgPerKg - PR, kg grain per kg N
 * @param system - 'us' or 'metric'
 * @param crop - the crop, for the bushel weight
 * @returns the value and its unit text
 * @example
 * priceRatioDisplay(7.47, 'us', 'corn') // { value: ≈ 0.133, unit: 'bu/lb N' }
 */
export function priceRatioDisplay(
  ratioKgPerKg: number,
  system: 'us' | 'metric',
  crop: CropId,
): { value: number; unit: string } {
  return priceRatioQuote(ratioKgPerKg, displayUnits(system), crop);
}
