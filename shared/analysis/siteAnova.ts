/**
 * One site's ANOVA of yield on rate as a factor with treatment means ± SE: the rate + block
 * model of the stats stage (shared/stats/rateBlockModel.ts), the same one the quality checks and
 * the rate effect read, laid out as the workbook's table: the rate-as-a-factor view beside the
 * curves.
 */
import {
  fitRateBlockModel,
  type RateBlockModel,
  type RateBlockProblem,
} from '../stats/rateBlockModel';

/** Treatment mean ± SE by rate, kg/ha. */
export interface TreatmentMeanRow {
  rateKgHa: number;
  n: number;
  meanKgHa: number;
  seKgHa: number;
}

/** One ANOVA source line; ss and ms in (kg/ha)². */
export interface AnovaRow {
  source: string;
  df: number;
  ss: number;
  ms: number | null;
  F: number | null;
  p: number | null;
}

export interface AnovaSummary {
  design: 'rcbd' | 'oneWay';
  rows: AnovaRow[];
  cvPercent: number | null;
  /** Fisher's LSD at 5 %, kg/ha; null when unbalanced (no single LSD). */
  lsdKgHa: number | null;
  notes: string[];
  /** Plots missing from a complete block design (rate, kg/ha, and block): the means are block-adjusted. */
  missingPlots: { rateKgHa: number; block: string }[];
}

/**
 * The site's ANOVA of yield on rate as a factor (randomized complete blocks when the site has
 * blocks by `hasBlocks`: every plot labeled, two blocks or more; else one-way) and the treatment
 * means ± SE by rate.
 * @param rates - rate of each plot used, kg/ha
 * @param yields - yield of each plot used, kg/ha
 * @param blocks - block label of each plot, null where there is none
 * @param fitted - the same plots' rate + block model when the caller has fitted it already
 * @returns the ANOVA table and the means, or null and [] when there are too few
 *   replicates or rates (the sheet then says there is no ANOVA)
 * @example
 * siteAnova([0, 0, 100, 100], [6000, 6200, 8000, 8300], [null, null, null, null]).anova?.design // 'oneWay'
 */
export function siteAnova(
  rates: number[],
  yields: number[],
  blocks: (string | null)[],
  fitted?: RateBlockModel | RateBlockProblem,
): { anova: AnovaSummary | null; means: TreatmentMeanRow[] } {
  const m = fitted ?? fitRateBlockModel({ rateKgHa: rates, yieldKgHa: yields, block: blocks });
  // Too few replicates or rates, or identical yields: no ANOVA, which the sheet says.
  if ('problem' in m) return { anova: null, means: [] };
  const line = (
    source: string,
    s: { df: number; ss: number; ms: number },
    F: number | null,
    p: number | null,
  ): AnovaRow => ({ source, df: s.df, ss: s.ss, ms: s.ms, F, p });
  const rows: AnovaRow[] = [
    ...(m.blocks ? [line('Blocks', m.blocks, m.blockF, m.blockP)] : []),
    line('N rate', m.rates, m.F, m.p),
    line('Error', m.residual, null, null),
    { ...line('Total', m.total, null, null), ms: null },
  ];
  return {
    anova: {
      design: m.design,
      rows,
      cvPercent: m.cvPct,
      lsdKgHa: m.lsdKgHa,
      notes: [],
      missingPlots: m.missingPlots,
    },
    means: m.rateMeans.map((r) => ({ ...r })),
  };
}
