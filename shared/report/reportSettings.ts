/**
 * How a report shows its numbers (display units, the prices as the user quoted
 * them) and the record of the run it prints: the display part beside the
 * analysis settings it was made with. The analysis itself reads only
 * AnalysisSettings (shared/analysis/analysisSettings).
 */
import type { BlockTerms, ModelName } from '../models/modelTypes';
import type { PriceInput } from '../economics/priceQuote';
import type { CropId } from '../table/plotTable';
import type { DisplayUnits } from '../units/displayUnits';
import type { PaperSize } from './paperSize';
import type { PageFields } from './pageFields';

/** The units numbers are shown in (JSON, workbook, PDF). */
export type ReportUnits = DisplayUnits;

/** How the report shows numbers: chosen by the user, never read by the analysis. */
export interface DisplaySettings {
  units: DisplayUnits;
  /** "us" or "metric" when the user chose a system; null when the input's own units are kept. */
  unitSystem: 'us' | 'metric' | null;
  /** Prices as the user quoted them in the display units (the analysis has them canonical). */
  prices: PriceInput;
  /**
   * The currency the prices are in: an ISO 4217 code such as "USD" (or the user's own label),
   * written on every amount (shared/units/formatMoney).
   */
  currency: string;
  /** BCP 47 locale of the numbers in text (the screen's); undefined: the platform's. */
  locale?: string;
  /** Who and what the grower pages are for (shared/report/pageFields); undefined: all blank. */
  pageFields?: PageFields;
  /** Paper of the printed pages and workbook; default paperSize of the units (Letter for US units). */
  paper?: PaperSize;
}

/** What a report records of its run: the display part and the analysis settings it was made with. */
export interface ReportSettings extends DisplaySettings {
  crop: CropId;
  /** Bootstrap resamples for the optimum's interval (0 = none). */
  boot: number;
  seed: number;
  blocks: BlockTerms;
  /** Level of the optimum interval, e.g. 0.9. */
  intervalLevel: number;
  /** Site → the model the analyst picked to lead that site (leadingModel). */
  siteModels?: Readonly<Record<string, ModelName>>;
  /**
   * The shortfall tolerance of the risk tables, currency/ha, and whether it is the default
   * (the cost of 10 kg N/ha at the prices) rather than the user's.
   */
  shortfallTolerance?: { perHa: number; isDefault: boolean };
}
