/**
 * A plot's rate as written (in its unit, of product or of nutrient) as kg of nutrient per
 * hectare: a product rate is first multiplied by the product's N content.
 */
import { convertRate, type RateUnit } from '../units/convertRate';
import type { FertilizerProduct } from '../units/products';
import { ImportError } from './importError';

/** What a product rate needs, and where to point when it is missing. */
export interface ProductRateContext {
  /** The product of the row, the treatment key or the settings; null when none is known. */
  product: FertilizerProduct | null;
  /** The product as written, for the message when it is not known. */
  productWords: string | undefined;
  /** "file › sheet row 7", to start the message. */
  where: string;
  /** The rate's cell, for the error. */
  ref: { file: string; sheet: string; cell: string | undefined };
}

/**
 * The nutrient rate of one plot.
 * @param rate - the rate as written, in `unit`
 * @param unit - its unit (kg/ha, lb/ac, …)
 * @param basis - "product" (× the product's N %) or "nutrient"
 * @param context - the product and where the rate was read
 * @returns kg N/ha; a zero rate needs no product
 * @throws {ImportError} "bad-mapping" for a product rate with no known product
 * @example
 * nutrientRateKgHa(200, 'kg/ha', 'product', { product: products('urea'), … }) // 92
 */
export function nutrientRateKgHa(
  rate: number,
  unit: RateUnit,
  basis: 'product' | 'nutrient',
  context: ProductRateContext,
): number {
  let nutrient = rate;
  if (basis === 'product' && rate !== 0) {
    const p = context.product;
    if (!p) {
      const words = context.productWords;
      throw new ImportError(
        'bad-mapping',
        `${context.where}: the rate ${rate} is a rate of product, but ${words ? `"${words}" is not a product Plotrate knows` : 'no product is named'}. Choose the product (urea 46-0-0, UAN 28 % or 32 %, anhydrous ammonia 82-0-0, ammonium sulfate 21-0-0, ammonium nitrate 34-0-0) in the import settings (on the command line: --product with --product-price), or mark the rates as nutrient.`,
        context.ref,
      );
    }
    nutrient = (rate * p.nitrogenPct) / 100;
  }
  return convertRate(nutrient, unit);
}
