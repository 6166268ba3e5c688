/**
 * The quality checks' view of the rate + block model (shared/stats/rateBlockModel.ts): the
 * site's CV % from the model and, for outliers, the least-squares fit of the same model, whose
 * externally studentized residuals need at least two residual degrees of freedom.
 */
import type { LeastSquaresFit } from '../stats/leastSquares';
import { StatsInputError } from '../stats/errors';
import {
  fitRateBlockLeastSquares,
  fitRateBlockModel,
  type RateBlockModel,
  type RateBlockProblem,
} from '../stats/rateBlockModel';
import type { Plot } from '../table/plotTable';

export interface TreatmentBlockFit {
  plots: Plot[];
  fit: LeastSquaresFit;
  /** Mean yield of the plots, kg/ha. */
  meanKgHa: number;
  /** CV % = 100 × √MSE / mean. */
  cvPct: number;
  rates: number;
  blocks: number;
}

/**
 * Fits yield ~ rate (as a factor) + block for one site's analyzable plots.
 * @param plots - the site's plots, not excluded, with rate (kg/ha) and yield (kg/ha)
 * @param fitted - the same plots' rate + block model when the analysis has fitted it already
 *   (fitRateBlockModel on these plots in this order), so that it is fitted once per site
 * @returns the fit, mean and CV %, or a reason it cannot be fitted (too few plots, no replication)
 * @example
 * fitTreatmentBlock(sitePlots) // { fit, meanKgHa: 12034, cvPct: 6.8, rates: 6, blocks: 4 }
 */
export function fitTreatmentBlock(
  plots: Plot[],
  fitted?: RateBlockModel | RateBlockProblem,
): TreatmentBlockFit | { reason: string } {
  const input = {
    rateKgHa: plots.map((p) => p.rateKgHa!),
    yieldKgHa: plots.map((p) => p.yieldKgHa!),
    block: plots.map((p) => p.block),
  };
  const model = fitted ?? fitRateBlockModel(input);
  if ('problem' in model) return { reason: model.problem };
  // Studentized residuals leave one plot out, so they need two residual df.
  if (model.residual.df < 2) {
    return {
      reason: `${plots.length} plots are too few for ${model.rateCount} rates${model.design === 'rcbd' ? ` and ${model.blockCount} blocks` : ''}`,
    };
  }
  try {
    return {
      plots,
      // Only the residuals are read: no coefficient tests (each a Student t tail).
      fit: fitRateBlockLeastSquares(input, { inference: false }),
      meanKgHa: model.meanKgHa,
      cvPct: model.cvPct ?? NaN,
      rates: model.rateCount,
      blocks: model.blockCount,
    };
  } catch (e) {
    if (e instanceof StatsInputError) return { reason: e.message };
    throw e;
  }
}
