/**
 * The randomized-complete-block model of one site, yield = mean + treatment +
 * block + error, fitted by least squares with one indicator column per rate
 * and per block but the first (Steel & Torrie, Principles and Procedures of
 * Statistics, ch. 9). Treatments are the distinct rates, so a site with
 * treatment numbers but a key of rates is handled the same way.
 */
import { fitLeastSquares, type LeastSquaresFit } from '../stats/leastSquares';
import { StatsInputError } from '../stats/errors';
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
 * @returns the fit, mean and CV %, or a reason it cannot be fitted (too few plots, no replication)
 * @example
 * fitTreatmentBlock(sitePlots) // { fit, meanKgHa: 12034, cvPct: 6.8, rates: 6, blocks: 4 }
 */
export function fitTreatmentBlock(plots: Plot[]): TreatmentBlockFit | { reason: string } {
  const keyOf = (r: number) => r.toFixed(6);
  const rateLevels = [...new Set(plots.map((p) => keyOf(p.rateKgHa!)))];
  const blockLevels = [
    ...new Set(plots.map((p) => p.block).filter((b): b is string => b !== null)),
  ];
  const useBlocks = blockLevels.length > 1 && plots.every((p) => p.block !== null);
  const columns: number[][] = [];
  const names: string[] = [];
  for (const level of rateLevels.slice(1)) {
    columns.push(plots.map((p) => (keyOf(p.rateKgHa!) === level ? 1 : 0)));
    names.push(`rate ${level}`);
  }
  if (useBlocks) {
    for (const b of blockLevels.slice(1)) {
      columns.push(plots.map((p) => (p.block === b ? 1 : 0)));
      names.push(`block ${b}`);
    }
  }
  const y = plots.map((p) => p.yieldKgHa!);
  if (plots.length < columns.length + 3) {
    return {
      reason: `${plots.length} plots are too few for ${rateLevels.length} rates${useBlocks ? ` and ${blockLevels.length} blocks` : ''}`,
    };
  }
  try {
    const fit = fitLeastSquares({ columns, columnNames: names, y, intercept: true });
    const meanKgHa = y.reduce((s, v) => s + v, 0) / y.length;
    return {
      plots,
      fit,
      meanKgHa,
      cvPct: (100 * fit.sigma) / meanKgHa,
      rates: rateLevels.length,
      blocks: useBlocks ? blockLevels.length : 1,
    };
  } catch (e) {
    if (e instanceof StatsInputError) return { reason: e.message };
    throw e;
  }
}
