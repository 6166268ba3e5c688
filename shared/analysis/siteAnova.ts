/**
 * One site's ANOVA of yield on rate as a factor, with treatment means ± SE, from the stats
 * stage (oneWayAnova, randomizedBlockAnova): the rate-as-a-factor view beside the curves.
 */
import { oneWayAnova } from '../stats/oneWayAnova';
import { randomizedBlockAnova } from '../stats/randomizedBlockAnova';

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
 * The site's ANOVA of yield on rate as a factor (randomized complete blocks
 * when every plot has a block label and there are two blocks or more, else
 * one-way) and the treatment means ± SE by rate.
 * @param rates - rate of each plot used, kg/ha
 * @param yields - yield of each plot used, kg/ha
 * @param blocks - block label of each plot, null where there is none
 * @returns the ANOVA table and the means, or null and [] when there are too few
 *   replicates or rates (the sheet then says there is no ANOVA)
 * @example
 * siteAnova([0, 0, 100, 100], [6000, 6200, 8000, 8300], [null, null, null, null]).anova?.design // 'oneWay'
 */
export function siteAnova(
  rates: number[],
  yields: number[],
  blocks: (string | null)[],
): { anova: AnovaSummary | null; means: TreatmentMeanRow[] } {
  const distinct = new Set(rates).size;
  if (distinct < 2 || rates.length <= distinct) return { anova: null, means: [] };
  const hasBlocks = blocks.every((b) => b !== null) && new Set(blocks).size > 1;
  const toRow = (level: string, n: number, mean: number, se: number): TreatmentMeanRow => ({
    rateKgHa: Number(level),
    n,
    meanKgHa: mean,
    seKgHa: se,
  });
  try {
    if (hasBlocks) {
      const a = randomizedBlockAnova({ treatment: rates, block: blocks as string[], y: yields });
      const line = (
        source: string,
        s: { df: number; ss: number; ms: number },
        F: number | null,
        p: number | null,
      ) => ({ source, df: s.df, ss: s.ss, ms: s.ms, F, p });
      return {
        anova: {
          design: 'rcbd',
          rows: [
            line('Blocks', a.blocks, a.blockF, a.blockP),
            line('N rate', a.treatments, a.F, a.p),
            line('Error', a.error, null, null),
            { ...line('Total', a.total, null, null), ms: null },
          ],
          cvPercent: a.cvPercent,
          lsdKgHa: a.lsd.lsd,
          notes: [],
          missingPlots: a.missingPlots.map((m) => ({
            rateKgHa: Number(m.treatment),
            block: m.block,
          })),
        },
        means: a.treatmentMeans
          .map((m) => toRow(m.level, m.n, m.mean, m.se))
          .sort((x, y) => x.rateKgHa - y.rateKgHa),
      };
    }
    const a = oneWayAnova({ treatment: rates, y: yields });
    return {
      anova: {
        design: 'oneWay',
        rows: [
          {
            source: 'N rate',
            df: a.between.df,
            ss: a.between.ss,
            ms: a.between.ms,
            F: a.F,
            p: a.p,
          },
          { source: 'Error', df: a.within.df, ss: a.within.ss, ms: a.within.ms, F: null, p: null },
          { source: 'Total', df: a.total.df, ss: a.total.ss, ms: null, F: null, p: null },
        ],
        cvPercent: a.cvPercent,
        lsdKgHa: a.lsd.lsd,
        notes: [],
        missingPlots: [],
      },
      means: a.treatments
        .map((m) => toRow(m.level, m.n, m.mean, m.se))
        .sort((x, y) => x.rateKgHa - y.rateKgHa),
    };
  } catch {
    // Too few replicates or identical yields: no ANOVA, which the sheet says.
    return { anova: null, means: [] };
  }
}
