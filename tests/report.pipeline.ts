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

/**
 * A metric corn report at one set of invented prices (grain 180 per t, N 1.26 per kg), blocks
 * fixed, 90 % intervals, seed 1: the run the level and factor tests share.
 * @param table - the plot table
 * @param options - bootstrap resamples and the import's column mapping (none by default)
 * @returns the report
 */
export function metricCornReportOf(
  table: PlotTable,
  options: { boot: number; mapping?: ReportMeta['mapping'] },
): TrialReport {
  return reportOf(
    table,
    {
      units: { rate: 'kg/ha', yield: 't/ha' },
      unitSystem: 'metric',
      currency: 'USD',
      crop: 'corn',
      prices: { grainPrice: 180, nutrientPrice: 1.26, product: null, defaulted: false },
      boot: options.boot,
      seed: 1,
      blocks: 'fixed',
      intervalLevel: 0.9,
    },
    {
      tool: { name: 'Plotrate', version: '0.1.0' },
      createdAt: '2026-03-01T12:00:00Z',
      mapping: options.mapping ?? [],
    },
  );
}
