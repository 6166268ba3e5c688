/**
 * What the report writer needs from the workspace: display units, crop, the
 * prices in the form the report quotes them (with the application cost), the
 * bootstrap settings the screen also uses and the models the user picked.
 */
import type { BlockTerms, ModelName } from '../../../shared/models/modelTypes';
import type { ReportSettings } from '../../../shared/report/reportSettings';
import { yieldUnitKg, rateUnitKg } from '../../../shared/report/reportSettings';
import type { CropId } from '../../../shared/table/plotTable';
import type { RateUnit } from '../../../shared/units/convertRate';
import type { YieldUnit } from '../../../shared/units/convertYield';
import { products } from '../../../shared/units/products';
import type { PriceSettings } from './priceInputs';
import { BOOTSTRAP } from './intervals';

/**
 * The report settings for the current workspace.
 * @param prices - the price inputs (canonical)
 * @param units - display units
 * @param system - 'us' or 'metric'
 * @param crop - the table's crop
 * @param blocks - block terms of the fits
 * @param siteModels - site → the model the user picked on screen
 * @returns settings for analyzeTrials; a product whose analysis the user changed
 *   is passed as its nutrient price, so the report prices N exactly as the screen does,
 *   with the screen's application cost and the screen's leading model at every site
 */
export function reportSettings(
  prices: PriceSettings,
  units: { rate: RateUnit; yield: YieldUnit },
  system: 'us' | 'metric',
  crop: CropId,
  blocks: BlockTerms,
  siteModels: Readonly<Record<string, ModelName>>,
): ReportSettings {
  const asListed = products(prices.productId).nitrogenPct === prices.analysisPct;
  const nutrientPerKg = prices.productPerKg / (prices.analysisPct / 100);
  return {
    units,
    unitSystem: system,
    crop,
    prices: {
      grainPrice: prices.grainPerKg * yieldUnitKg(units.yield, crop),
      nutrientPrice: asListed ? null : nutrientPerKg * rateUnitKg(units.rate),
      product: asListed
        ? { id: prices.productId, price: prices.productPerKg * rateUnitKg(units.rate) }
        : null,
      defaulted: prices.illustrative,
      applicationCostPerHa: prices.applicationPerHa,
    },
    boot: BOOTSTRAP.count,
    seed: BOOTSTRAP.seed,
    blocks,
    intervalLevel: BOOTSTRAP.level,
    siteModels: { ...siteModels },
  };
}
