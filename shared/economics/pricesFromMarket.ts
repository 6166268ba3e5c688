/**
 * Market prices as growers quote them, turned into Plotrate's canonical prices
 * (currency per kg grain at the yields' moisture, currency per kg nutrient,
 * currency per ha). Grain: per bushel (the crop's standard bushel weight, USDA,
 * from shared/units) or per tonne, at the market's standard moisture. Nutrient:
 * per kg or lb of nutrient, or a product's price per tonne or short ton with
 * its analysis (e.g. urea at 46 % N: nutrient price = product price / 0.46 per
 * unit weight).
 *
 * Moisture basis: a kg of grain at moisture M_y holds (100 − M_y)/(100 − M_m)
 * kg at the market moisture M_m (same dry matter), so the price per kg at the
 * yields' basis is the market price per kg × (100 − M_y)/(100 − M_m).
 */
import type { CropId } from '../table/plotTable';
import { StatsInputError } from '../stats/errors';
import { crops } from '../units/crops';
import { products, type ProductId } from '../units/products';
import { KG_PER_LB, KG_PER_T, M2_PER_ACRE, M2_PER_HA } from '../units/unitConstants';
import type { Prices } from './priceRatio';

/** One short ton, 2000 lb, in kg. */
const KG_PER_SHORT_TON = 2000 * KG_PER_LB;

export type NutrientPriceQuote =
  | { per: 'kg' | 'lb'; price: number }
  | {
      /** Price of the product per tonne (1000 kg) or short ton (2000 lb). */
      per: 'tonne' | 'shortTon';
      price: number;
      /** Nutrient content of the product, % by weight; or give `product`. */
      analysisPct?: number;
      product?: ProductId;
    };

export interface MarketPrices {
  crop: CropId;
  /** Grain price per bushel (the crop's standard bushel) or per tonne, at market moisture. */
  grain: { per: 'bushel' | 'tonne'; price: number };
  nutrient: NutrientPriceQuote;
  /** Application cost per ha or per acre; default none. */
  application?: { per: 'ha' | 'ac'; cost: number };
  /** Moisture basis of the yields the prices will be applied to, %; default the crop's market standard. */
  yieldMoisturePct?: number;
  /** Market moisture of the grain price, %; default the crop's standard moisture. */
  marketMoisturePct?: number;
}

function positive(value: number, name: string): number {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new StatsInputError('bad-argument', `${name} must be a positive number; got ${value}.`);
  }
  return value;
}

/**
 * Converts market quotes to canonical prices.
 * @param market - crop, grain quote, nutrient quote, optional application cost and moisture bases
 * @returns grainPricePerKg (currency/kg at the yields' moisture), nutrientPricePerKg, applicationCostPerHa
 * @throws {StatsInputError} "bad-argument" naming a price, analysis or moisture out of range
 * @example
 * pricesFromMarket({ crop: 'corn', grain: { per: 'bushel', price: 4.5 },
 *   nutrient: { per: 'shortTon', price: 600, product: 'urea' } })
 * // grainPricePerKg ≈ 0.1772 (4.5 / 25.40 kg), nutrientPricePerKg ≈ 1.438 (600 / 907.18 / 0.46)
 */
export function pricesFromMarket(market: MarketPrices): Prices {
  const crop = crops(market.crop);
  const grainPrice = positive(market.grain.price, 'grain.price');
  const kgPerUnit = market.grain.per === 'bushel' ? crop.bushelLb * KG_PER_LB : KG_PER_T;
  const marketMoisture = market.marketMoisturePct ?? crop.standardMoisturePct;
  const yieldMoisture = market.yieldMoisturePct ?? crop.standardMoisturePct;
  for (const [name, m] of [
    ['marketMoisturePct', marketMoisture],
    ['yieldMoisturePct', yieldMoisture],
  ] as const) {
    if (!(m >= 0 && m < 100)) {
      throw new StatsInputError(
        'bad-argument',
        `${name} must be at least 0 and below 100; got ${m}.`,
      );
    }
  }
  const grainPricePerKg =
    (grainPrice / kgPerUnit) * ((100 - yieldMoisture) / (100 - marketMoisture));

  const q = market.nutrient;
  let nutrientPricePerKg: number;
  if (q.per === 'kg' || q.per === 'lb') {
    nutrientPricePerKg = positive(q.price, 'nutrient.price') / (q.per === 'lb' ? KG_PER_LB : 1);
  } else if (q.per === 'tonne' || q.per === 'shortTon') {
    const analysis = q.analysisPct ?? (q.product ? products(q.product).nitrogenPct : NaN);
    if (!(analysis > 0 && analysis <= 100)) {
      throw new StatsInputError(
        'bad-argument',
        `nutrient.analysisPct must lie in (0, 100] (or name a product); got ${analysis}.`,
      );
    }
    const kgProduct = q.per === 'tonne' ? KG_PER_T : KG_PER_SHORT_TON;
    nutrientPricePerKg = positive(q.price, 'nutrient.price') / kgProduct / (analysis / 100);
  } else {
    throw new StatsInputError('bad-argument', `nutrient.per must be kg, lb, tonne or shortTon.`);
  }
  let applicationCostPerHa = 0;
  if (market.application) {
    const c = market.application.cost;
    if (!(Number.isFinite(c) && c >= 0)) {
      throw new StatsInputError(
        'bad-argument',
        `application.cost must be zero or positive; got ${c}.`,
      );
    }
    applicationCostPerHa = market.application.per === 'ha' ? c : (c * M2_PER_HA) / M2_PER_ACRE;
  }
  return { grainPricePerKg, nutrientPricePerKg, applicationCostPerHa };
}
