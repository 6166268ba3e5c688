/**
 * Illustrative prices for a run where the user gave none, so an analysis can
 * still be shown, marked loudly everywhere as resting on made-up prices. Round
 * numbers of the usual order of magnitude in recent years (not market data, not
 * a forecast): grain per kg at standard moisture by crop, nitrogen bought as
 * urea. The command line and the workspace both start from these.
 */
import type { CropId } from '../table/plotTable';
import { products, type ProductId } from '../units/products';
import { KG_PER_LB } from '../units/unitConstants';
import type { Prices } from './priceRatio';

/** Grain, currency per kg at standard moisture (corn: $4.50 per 56-lb bushel). */
const GRAIN_PER_KG: Record<CropId, number> = {
  corn: 4.5 / (56 * KG_PER_LB),
  wheat: 0.22,
  soybean: 0.4,
  barley: 0.2,
  sorghum: 0.17,
  oats: 0.25,
  canola: 0.45,
};

/** Nitrogen bought as urea at $520 per short ton (2,000 lb) of product. */
const PRODUCT: ProductId = 'urea';
const PRODUCT_PER_KG = 520 / (2000 * KG_PER_LB);

export interface IllustrativePrices {
  currency: 'USD';
  /** Grain, currency per kg. */
  grainPerKg: number;
  productId: ProductId;
  /** N content of the product, % by weight. */
  analysisPct: number;
  /** Product, currency per kg of product. */
  productPerKg: number;
  /** The same as canonical prices (per kg grain, per kg N, no application cost). */
  canonical: Prices;
}

/**
 * The illustrative prices of a crop.
 * @param crop - the crop
 * @returns grain and product prices, and the canonical prices they make
 * @example
 * illustrativePrices('corn').canonical.nutrientPricePerKg // ≈ 1.246 (urea at 46 % N)
 */
export function illustrativePrices(crop: CropId): IllustrativePrices {
  const analysisPct = products(PRODUCT).nitrogenPct;
  return {
    currency: 'USD',
    grainPerKg: GRAIN_PER_KG[crop],
    productId: PRODUCT,
    analysisPct,
    productPerKg: PRODUCT_PER_KG,
    canonical: {
      grainPricePerKg: GRAIN_PER_KG[crop],
      nutrientPricePerKg: PRODUCT_PER_KG / (analysisPct / 100),
      applicationCostPerHa: 0,
    },
  };
}
