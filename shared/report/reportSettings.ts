/**
 * The choices a report is made with: display units, crop, prices, bootstrap
 * size and seed, block terms. Prices are given the way the trade quotes them
 * in the chosen units (grain per bushel or per tonne, nitrogen per lb or per
 * kg of N, or a product per lb or kg of product) and turned here into the one
 * price ratio the economics uses.
 */
import type { BlockTerms, ModelName } from '../models/modelTypes';
import type { CropId } from '../table/plotTable';
import type { RateUnit } from '../units/convertRate';
import type { YieldUnit } from '../units/convertYield';
import { crops } from '../units/crops';
import { products, type ProductId } from '../units/products';
import { KG_PER_LB, KG_PER_T } from '../units/unitConstants';

/** The units numbers are shown in (JSON, workbook, PDF). */
export interface ReportUnits {
  rate: RateUnit;
  yield: YieldUnit;
}

/** Prices as the user gave them, in the currency unit per weight of `ReportUnits`. */
export interface PriceInput {
  /** Grain price per weight unit of the yield unit: $/bu for bu/ac, $/t for t/ha, $/kg for kg/ha, $/lb for lb/ac. */
  grainPrice: number;
  /** Nutrient price per weight unit of the rate unit ($/lb N for lb/ac, $/kg N for kg/ha); null when a product price is given. */
  nutrientPrice: number | null;
  /** A product and its price per lb (lb/ac) or kg (kg/ha) of product; null when a nutrient price is given. */
  product: { id: ProductId; price: number } | null;
  /** True when the prices are the built-in illustrative ones, not the user's. */
  defaulted: boolean;
  /** Cost of making an application at all, currency per ha, charged when the rate is above 0; default 0. */
  applicationCostPerHa?: number;
}

export interface ReportSettings {
  units: ReportUnits;
  /** "us" or "metric" when the user chose a system; null when the input's own units are kept. */
  unitSystem: 'us' | 'metric' | null;
  crop: CropId;
  prices: PriceInput;
  /** Bootstrap resamples for the optimum's interval (0 = none). */
  boot: number;
  seed: number;
  blocks: BlockTerms;
  /** Level of the optimum interval, e.g. 0.9. */
  intervalLevel: number;
  /**
   * Site → the model the user picked to lead that site; the others lead with their
   * recommendation model (shared/sites leadingModel). Default none.
   */
  siteModels?: Readonly<Record<string, ModelName>>;
}

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

/**
 * The price ratio as the trade quotes it: grain per unit weight of N, the grain in bushels
 * (bu/ac yields), pounds (lb/ac) or kilograms (t/ha and kg/ha: "0.0147 t/kg N" reads as
 * nothing a grower uses, 14.7 kg/kg N does), the N in pounds (lb/ac rates) or kilograms.
 * @param ratioKgPerKg - PR = nutrient price / grain price, kg grain per kg N
 * @param units - the display units
 * @param crop - the crop, for the bushel weight
 * @returns the value and its unit text
 * @example
 * priceRatioQuote(7.47, { rate: 'lb/ac', yield: 'bu/ac' }, 'corn') // { value: ≈ 0.1334, unit: 'bu/lb N' }
 * priceRatioQuote(14.7, { rate: 'kg/ha', yield: 't/ha' }, 'wheat') // { value: 14.7, unit: 'kg/kg N' }
 */
export function priceRatioQuote(
  ratioKgPerKg: number,
  units: ReportUnits,
  crop: CropId,
): { value: number; unit: string } {
  const grain = units.yield === 't/ha' ? 'kg' : priceWeightName(units.yield);
  const grainKg = units.yield === 't/ha' ? 1 : yieldUnitKg(units.yield, crop);
  return {
    value: (ratioKgPerKg * rateUnitKg(units.rate)) / grainKg,
    unit: `${grain}/${priceWeightName(units.rate)} N`,
  };
}

/** The prices turned into what the economics needs. */
export interface PriceTerms {
  /** Nutrient price, $ per kg of N. */
  nutrientPricePerKg: number;
  /** Grain price, $ per kg of grain at standard moisture. */
  grainPricePerKg: number;
  /** Price ratio, kg grain per kg N (canonical). */
  priceRatioKgPerKg: number;
  /** Price ratio as the trade quotes it (priceRatioQuote): bu per lb N, kg grain per kg N. */
  priceRatioDisplay: number;
  /** Unit text of `priceRatioDisplay`, e.g. "bu/lb N" or "kg/kg N". */
  priceRatioUnit: string;
  /** Nutrient price in the report's units ($/lb N or $/kg N). */
  nutrientPriceDisplay: number;
  /** Cost of making an application at all, $ per ha (0 when none was given). */
  applicationCostPerHa: number;
}

/**
 * Turns user prices into the nutrient and grain price per kg and the price ratio.
 * PR = nutrient price / grain price (design notes, "Economic optimum").
 * @param settings - units, crop and prices
 * @returns prices per kg and the price ratio, canonical and in display units
 * @throws {RangeError} when a price is missing, zero or negative, or the application cost is
 *   negative (naming the option)
 * @example
 * // $0.50/lb N and $4.00/bu corn: PR = 0.125 bu/lb N
 * priceTerms(settings).priceRatioDisplay // 0.125
 */
export function priceTerms(
  settings: Pick<ReportSettings, 'units' | 'crop' | 'prices'>,
): PriceTerms {
  const { units, crop, prices } = settings;
  if (!(prices.grainPrice > 0)) {
    throw new RangeError(`The grain price must be a positive number; got ${prices.grainPrice}.`);
  }
  let nutrientPerRateWeight: number;
  if (prices.product) {
    if (!(prices.product.price > 0)) {
      throw new RangeError(
        `The product price must be a positive number; got ${prices.product.price}.`,
      );
    }
    // Price of the nutrient in it: product price ÷ N fraction.
    nutrientPerRateWeight = prices.product.price / (products(prices.product.id).nitrogenPct / 100);
  } else {
    if (prices.nutrientPrice === null || !(prices.nutrientPrice > 0)) {
      throw new RangeError(
        `The nutrient price must be a positive number; got ${String(prices.nutrientPrice)}.`,
      );
    }
    nutrientPerRateWeight = prices.nutrientPrice;
  }
  const applicationCostPerHa = prices.applicationCostPerHa ?? 0;
  if (!(Number.isFinite(applicationCostPerHa) && applicationCostPerHa >= 0)) {
    throw new RangeError(
      `The application cost must be 0 or a positive number; got ${applicationCostPerHa}.`,
    );
  }
  const nutrientPricePerKg = nutrientPerRateWeight / rateUnitKg(units.rate);
  const grainPricePerKg = prices.grainPrice / yieldUnitKg(units.yield, crop);
  const priceRatioKgPerKg = nutrientPricePerKg / grainPricePerKg;
  const quote = priceRatioQuote(priceRatioKgPerKg, units, crop);
  return {
    nutrientPricePerKg,
    grainPricePerKg,
    priceRatioKgPerKg,
    priceRatioDisplay: quote.value,
    priceRatioUnit: quote.unit,
    nutrientPriceDisplay: nutrientPerRateWeight,
    applicationCostPerHa,
  };
}
