/**
 * Invented rate × factor trials (rate × timing, rate × source) whose true responses are known,
 * for the level tests' checks by simulation (`npm run validate`), the R fixtures and the demo.
 * Each site is a randomized complete block trial: in every block one zero-rate check plot,
 * shared by every level (its factor cell is blank), and one plot per level and fertilized rate,
 * in a random order within the block. Yields follow the level's true curve with the block's
 * offset and a multiplicative plot error, as shared/demo/simulatedSite does for rate-only sites.
 *
 * The true curves are quadratic-plateaus through one check yield (the levels share the check):
 * y = P + c·min(x − x0, 0)², c = (check − P)/x0². At price ratio PR (kg grain per kg N, no
 * application cost) the optimum is x* = x0 + PR/(2c) = x0 − PR·x0²/(2·(P − check)) (the slope
 * 2c(x − x0) equals PR there; simulatedSite's header derives it), and a level whose optimum is
 * a chosen rate has the join x0 = (1 − √(1 − 4kE))/(2k), k = PR/(2·(P − check)), the smaller
 * root of x0 − k·x0² = E.
 */
import type { Plot, PlotTable } from '../table/plotTable';
import { mulberry32 } from './mulberry32';
import { shuffled } from './simulatedSite';

/** One level's true response: a quadratic-plateau from the shared check. */
export interface LevelTruth {
  level: string;
  /** Yield at the plateau, kg/ha. */
  plateauKgHa: number;
  /** Where the curve reaches its plateau, kg/ha. */
  joinKgHa: number;
}

/** One simulated rate × factor site. */
export interface LevelSiteSpec {
  site: string;
  /** Yield of the shared check (rate 0), kg/ha. */
  checkKgHa: number;
  levels: readonly LevelTruth[];
}

export interface LevelTrialOptions {
  sites: readonly LevelSiteSpec[];
  /** PRNG seed: the same seed and sites give the same table. */
  seed: number;
  /** The factor's column header; default "Timing". */
  factor?: string;
  /** Fertilized rates and the check, kg/ha; default 0, 40, 80, 120, 160, 200. */
  ratesKgHa?: readonly number[];
  /** Blocks per site; default 4. */
  blocks?: number;
  /** Plot error CV, a fraction; default 0.065 (the demo trial's). */
  cv?: number;
  /** Standard deviation of the block offsets, kg/ha; default 250 (the demo trial's). */
  blockSdKgHa?: number;
  /** Harvest year of every plot; default 2025. */
  year?: number;
}

/**
 * A level's true yield at a rate.
 * @param check - the shared check's yield, kg/ha
 * @param t - the level's plateau and join
 * @param rateKgHa - N rate, kg/ha
 * @returns yield, kg/ha
 * @example
 * levelTrueYield(8000, { level: 'A', plateauKgHa: 12500, joinKgHa: 170 }, 170) // 12500
 */
export function levelTrueYield(check: number, t: LevelTruth, rateKgHa: number): number {
  const c = (check - t.plateauKgHa) / (t.joinKgHa * t.joinKgHa);
  return t.plateauKgHa + c * Math.min(rateKgHa - t.joinKgHa, 0) ** 2;
}

/**
 * A level's true economic optimum (no application cost).
 * @param check - the shared check's yield, kg/ha
 * @param t - the level's plateau and join
 * @param priceRatio - nutrient price / grain price, kg grain per kg N
 * @returns kg/ha (0 when even the first kg does not pay)
 * @example
 * levelTrueOptimum(8000, { level: 'A', plateauKgHa: 12500, joinKgHa: 170 }, 7) // ≈ 147.5
 */
export function levelTrueOptimum(check: number, t: LevelTruth, priceRatio: number): number {
  const c = (check - t.plateauKgHa) / (t.joinKgHa * t.joinKgHa);
  return Math.max(t.joinKgHa + priceRatio / (2 * c), 0);
}

/**
 * The join that gives a quadratic-plateau from `check` to `plateau` its optimum at a rate.
 * @param check - check yield, kg/ha
 * @param plateau - plateau yield, kg/ha (above the check)
 * @param optimumKgHa - the optimum wanted, kg/ha
 * @param priceRatio - kg grain per kg N
 * @returns the join x0, kg/ha
 * @throws {RangeError} when no join gives that optimum (the optimum is too high for the gain)
 * @example
 * joinForOptimum(8000, 12500, 147.5, 7) // ≈ 170
 */
export function joinForOptimum(
  check: number,
  plateau: number,
  optimumKgHa: number,
  priceRatio: number,
): number {
  const k = priceRatio / (2 * (plateau - check));
  const disc = 1 - 4 * k * optimumKgHa;
  if (!(k > 0 && disc >= 0)) {
    throw new RangeError(
      `No quadratic-plateau from ${check} to ${plateau} kg/ha has its optimum at ${optimumKgHa} kg/ha at price ratio ${priceRatio}.`,
    );
  }
  return (1 - Math.sqrt(disc)) / (2 * k);
}

/**
 * A plot table of simulated rate × factor sites, the factor's column marked as such.
 * @param options - the sites with their levels' truths, the seed, the design and noise
 * @returns the table (corn, canonical kg/ha, `factorKeys` = [factor])
 * @example
 * levelTrial({ sites: [{ site: 'Marrow Lea', checkKgHa: 8000, levels }], seed: 1 }).plots.length
 * // 4 blocks × (1 check + 2 levels × 5 rates) = 44
 */
export function levelTrial(options: LevelTrialOptions): PlotTable {
  const rng = mulberry32(options.seed);
  const factor = options.factor ?? 'Timing';
  const rates = options.ratesKgHa ?? [0, 40, 80, 120, 160, 200];
  const fertilized = rates.filter((r) => r > 0);
  const blocks = options.blocks ?? 4;
  const cv = options.cv ?? 0.065;
  const blockSd = options.blockSdKgHa ?? 250;
  const year = options.year ?? 2025;
  const plots: Plot[] = [];
  for (const spec of options.sites) {
    const cells: { level: LevelTruth | null; rate: number }[] = [{ level: null, rate: 0 }];
    for (const level of spec.levels) for (const rate of fertilized) cells.push({ level, rate });
    for (let block = 1; block <= blocks; block++) {
      const offset = blockSd * rng.normal();
      shuffled(rng, cells.length).forEach((ci, position) => {
        const { level, rate } = cells[ci];
        const truth = level ? levelTrueYield(spec.checkKgHa, level, rate) : spec.checkKgHa;
        plots.push({
          id: `simulated|${spec.site}|${year}|${block}|${position + 1}`,
          site: spec.site,
          year,
          block: String(block),
          plotLabel: `${block}${String(position + 1).padStart(2, '0')}`,
          treatment: null,
          rateKgHa: rate,
          yieldKgHa: (truth + offset) * (1 + cv * rng.normal()),
          moisturePct: null,
          testWeight: null,
          notes: null,
          groups: level ? { [factor]: level.level } : {},
          excluded: null,
          original: {},
        });
      });
    }
  }
  return { crop: 'corn', standardMoisturePct: 15.5, plots, sources: [], factorKeys: [factor] };
}
