/**
 * Prices as the trade quotes them, in the display units (grain per bushel or
 * per tonne, nitrogen per lb or per kg of N, or a product per lb or kg of
 * product), turned into the canonical per-kg prices the economics reads and
 * into the price ratio as growers quote it. Whoever reads prices from a person
 * (the command line's options, the workspace's boxes) goes through here.
 */
import type { CropId } from '../table/plotTable';
import type { DisplayUnits } from '../units/displayUnits';
import { products, type ProductId } from '../units/products';
import { priceWeightName, rateUnitKg, yieldUnitKg } from '../units/unitWeights';

/** Prices as the user gave them, in the currency unit per weight of `DisplayUnits`. */
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
  units: DisplayUnits,
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
export function priceTerms(settings: {
  units: DisplayUnits;
  crop: CropId;
  prices: PriceInput;
}): PriceTerms {
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

/** Prices per kg as the engine keeps them: grain, and a product with its N content. */
export interface PricesPerKg {
  /** Grain, currency per kg at standard moisture. */
  grainPerKg: number;
  /** The product bought, e.g. urea ("nitrogen" for N itself). */
  productId: ProductId;
  /** N content of the product, % by weight. */
  analysisPct: number;
  /** Product, currency per kg of product. */
  productPerKg: number;
  /** Cost of making an application at all, currency per ha; default 0. */
  applicationPerHa?: number;
}

/**
 * Per-kg prices quoted the way the trade writes them in the display units: grain per bushel,
 * tonne, kg or lb; the product per lb or kg of product, or, when its N content differs from
 * the product list's (the user changed the analysis), per lb or kg of N, so that priceTerms
 * gives back exactly the nutrient price per kg it was given.
 * @param prices - per-kg prices
 * @param units - display units
 * @param crop - the crop, for the bushel weight
 * @param defaulted - true for the built-in illustrative prices
 * @returns the prices as quoted
 * @example
 * quotePrices({ grainPerKg: 4.5 / 25.40117272, productId: 'urea', analysisPct: 46, productPerKg: 0.5732 },
 *   { rate: 'lb/ac', yield: 'bu/ac' }, 'corn', false).grainPrice // 4.5 (per bushel)
 */
export function quotePrices(
  prices: PricesPerKg,
  units: DisplayUnits,
  crop: CropId,
  defaulted: boolean,
): PriceInput {
  const asListed = products(prices.productId).nitrogenPct === prices.analysisPct;
  const perRateWeight = rateUnitKg(units.rate);
  return {
    grainPrice: prices.grainPerKg * yieldUnitKg(units.yield, crop),
    nutrientPrice: asListed
      ? null
      : (prices.productPerKg / (prices.analysisPct / 100)) * perRateWeight,
    product: asListed ? { id: prices.productId, price: prices.productPerKg * perRateWeight } : null,
    defaulted,
    applicationCostPerHa: prices.applicationPerHa ?? 0,
  };
}
