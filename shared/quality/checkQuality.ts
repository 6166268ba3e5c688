/**
 * All data checks on a plot table, each finding with a severity, a message and
 * the cells concerned. Checks never change the table.
 */
import type { RateBlockModel, RateBlockProblem } from '../stats/rateBlockModel';
import type { PlotTable } from '../table/plotTable';
import { checkDesign } from './checkDesign';
import { checkResiduals } from './checkResiduals';
import { checkValues } from './checkValues';
import type { QualityFinding } from '../table/qualityFinding';

export interface QualityOptions {
  /** Trial CV above which a site is warned, %; default 15 (common practice for yield trials). */
  cvWarnPct?: number;
  /** |Studentized residual| above which a plot is flagged; default 3. */
  outlierAbsResidual?: number;
  /** Accepted harvest moisture, %; default [5, 40]. */
  moistureRangePct?: [number, number];
  /**
   * Site-year name → its rate + block model, when the caller (the analysis) has fitted it on the
   * site's analyzable plots in table order; the checks then read it instead of fitting it again.
   */
  rateBlockModels?: ReadonlyMap<string, RateBlockModel | RateBlockProblem>;
}

/**
 * Runs every check.
 * @param table - the plot table from buildPlotTable
 * @param options - thresholds (CV %, residual bound, moisture range %)
 * @returns findings, most severe first
 * @throws {RangeError} for a threshold that is not a positive number
 * @example
 * checkQuality(table).filter((f) => f.severity !== 'info')
 */
export function checkQuality(table: PlotTable, options: QualityOptions = {}): QualityFinding[] {
  const cvWarnPct = options.cvWarnPct ?? 15;
  const outlier = options.outlierAbsResidual ?? 3;
  const moisture = options.moistureRangePct ?? [5, 40];
  if (!(cvWarnPct > 0))
    throw new RangeError(`cvWarnPct must be a positive percentage; got ${cvWarnPct}.`);
  if (!(outlier > 0)) throw new RangeError(`outlierAbsResidual must be positive; got ${outlier}.`);
  if (!(moisture[0] < moisture[1])) {
    throw new RangeError(
      `moistureRangePct must be [low, high] with low < high; got [${moisture.join(', ')}].`,
    );
  }
  const rank = { error: 0, warning: 1, info: 2 };
  return [
    ...checkValues(table, moisture),
    ...checkDesign(table),
    ...checkResiduals(table, cvWarnPct, outlier, options.rateBlockModels),
  ].sort((a, b) => rank[a.severity] - rank[b.severity]);
}
