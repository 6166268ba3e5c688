/**
 * The checks on the import settings made once before any sheet is read: a known crop, a
 * standard moisture that can be, a rate basis, a known product and a positive plot area.
 */
import { crops, isCropId } from '../units/crops';
import { productIds } from '../units/products';
import { ImportError } from './importError';
import type { ImportSettings } from './importSettings';

/**
 * Checks the import settings and gives the standard moisture in force.
 * @param settings - crop, standard moisture (% wet basis), rate basis, product, plot area (m²)
 * @returns the standard moisture, % wet basis: the settings' own, else the crop's usual one
 * @throws {ImportError} "bad-settings" naming the setting and the values it may take
 * @example
 * checkImportSettings({ crop: 'corn', rateBasis: 'nutrient' }) // 15.5
 */
export function checkImportSettings(settings: ImportSettings): number {
  if (!settings || !isCropId(String(settings.crop))) {
    throw new ImportError(
      'bad-settings',
      `The import settings name no known crop ("${String(settings?.crop)}"); choose one of corn, wheat, soybean, barley, sorghum, oats, canola.`,
    );
  }
  const std = settings.standardMoisturePct ?? crops(settings.crop).standardMoisturePct;
  if (!(std >= 0 && std < 50)) {
    throw new ImportError(
      'bad-settings',
      `The standard moisture must be between 0 % and 50 %; got ${std} %. The usual value for ${settings.crop} is ${crops(settings.crop).standardMoisturePct} %.`,
    );
  }
  if (settings.rateBasis !== 'product' && settings.rateBasis !== 'nutrient') {
    throw new ImportError(
      'bad-settings',
      `The rate basis must be "product" or "nutrient"; got "${String(settings.rateBasis)}".`,
    );
  }
  if (settings.product !== undefined && !productIds.includes(settings.product)) {
    throw new ImportError(
      'bad-settings',
      `The import settings name the product "${String(settings.product)}", which Plotrate does not know; choose one of ${productIds.join(', ')}.`,
    );
  }
  if (settings.plotAreaM2 !== undefined && !(settings.plotAreaM2 > 0)) {
    throw new ImportError(
      'bad-settings',
      `The plot area must be a positive number of m²; got ${settings.plotAreaM2}.`,
    );
  }
  return std;
}
