// The run the command line makes, as one call for the report tests: the quoted prices turned
// canonical (priceTerms), one analysis (analyzeTrial), its priced view (priceTrial) and the
// report assembled from them (assembleReport).
import { analysisSettings } from '../shared/analysis/analysisSettings';
import { analyzeTrial } from '../shared/analysis/analyzeTrial';
import { priceTrial } from '../shared/analysis/priceTrial';
import { priceTerms } from '../shared/economics/priceQuote';
import { assembleReport, type ReportMeta } from '../shared/report/assembleReport';
import type { ReportSettings } from '../shared/report/reportSettings';
import type { TrialReport } from '../shared/report/trialReport';
import type { PlotTable } from '../shared/table/plotTable';

/**
 * Analyzes a table and assembles its report, the way the command line does.
 * @param table - the plot table
 * @param s - display units, quoted prices and the analysis settings in the report's own record form
 * @param meta - tool, time stamp, mapping, findings
 * @returns the report
 */
export function reportOf(table: PlotTable, s: ReportSettings, meta: ReportMeta): TrialReport {
  const terms = priceTerms({ units: s.units, crop: table.crop, prices: s.prices });
  const prices = {
    grainPricePerKg: terms.grainPricePerKg,
    nutrientPricePerKg: terms.nutrientPricePerKg,
    applicationCostPerHa: terms.applicationCostPerHa,
  };
  const analysis = analyzeTrial(
    table,
    analysisSettings({
      prices,
      resamples: s.boot,
      seed: s.seed,
      blocks: s.blocks === 'fixed' ? 'auto' : 'none',
      intervalLevel: s.intervalLevel,
    }),
  );
  return assembleReport(
    analysis,
    priceTrial(analysis, prices, s.siteModels ?? {}),
    { units: s.units, unitSystem: s.unitSystem, prices: s.prices, currency: s.currency },
    meta,
  );
}
