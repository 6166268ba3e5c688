/**
 * What the report writer needs from the workspace besides the analysis and its
 * priced view: display units and the prices in the form the report quotes them
 * (with the application cost).
 */
import { quotePrices } from '../../../shared/economics/priceQuote';
import { paperSize } from '../../../shared/report/paperSize';
import type { DisplaySettings } from '../../../shared/report/reportSettings';
import type { CropId } from '../../../shared/table/plotTable';
import type { RateUnit } from '../../../shared/units/convertRate';
import type { YieldUnit } from '../../../shared/units/convertYield';
import type { PriceSettings } from './priceInputs';

/**
 * The report's display settings for the current workspace.
 * @param prices - the price inputs (canonical)
 * @param units - display units
 * @param system - 'us' or 'metric'
 * @param crop - the table's crop
 * @param locale - the user's locale (its region picks Letter or A4), null when unknown
 * @returns display settings for assembleReport; a product whose analysis the user changed
 *   is passed as its nutrient price, so the report quotes N exactly as the screen prices it,
 *   with the screen's application cost
 */
export function reportDisplay(
  prices: PriceSettings,
  units: { rate: RateUnit; yield: YieldUnit },
  system: 'us' | 'metric',
  crop: CropId,
  locale: string | null = null,
): DisplaySettings {
  return {
    units,
    unitSystem: system,
    paper: paperSize(units, locale),
    prices: quotePrices(prices, units, crop, prices.illustrative),
    currency: prices.currency,
    ...(locale ? { locale } : {}),
  };
}
