/**
 * Units for Plotrate: one canonical system inside (kg/ha for nutrient rates and
 * for yields at the crop's standard moisture), conversions at the edges.
 *
 * - {@link convertRate} / {@link rateFromKgHa}: kg/ha, lb/ac, g/m²
 * - {@link convertYield} / {@link yieldFromKgHa}: kg/ha, t/ha, lb/ac, bu/ac (crop bushel), g/m²
 * - {@link plotWeightToKgHa}, {@link areaToM2}, {@link lengthToM}: plot weights and sizes
 * - {@link adjustMoisture}: wet × (100 − M_wet)/(100 − M_std)
 * - {@link crops}: bushel weight (USDA), standard moisture, plausible-yield bound
 * - {@link products}: N fertilizers and their analysis
 * - {@link formatQuantity}, {@link displayUnits}, {@link showRate}, {@link showYield}
 */
export * from './unitConstants';
export * from './convertRate';
export * from './convertYield';
export * from './adjustMoisture';
export * from './crops';
export * from './products';
export * from './formatQuantity';
export * from './displayUnits';
