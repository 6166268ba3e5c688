/**
 * Invented sites whose true response is known, for checking the analysis'
 * decisions by simulation (`npm run validate`). Every site is a randomized
 * complete block trial of 4 blocks × 6 N rates (0, 40, 80, 120, 160, 200
 * kg N/ha) whose plots follow one of five true responses of a corn crop, with
 * block offsets and plot errors of the demo trial's size (shared/demo/demoTrial:
 * block standard deviation 4 bu/ac ≈ 250 kg/ha, multiplicative plot error with a
 * CV of 6.5 %). Because the truth is known, so is the true economic optimum
 * rate at any price ratio: each truth carries it in closed form, written out
 * here independently of the model code in shared/models, so the check does not
 * lean on the code it checks.
 *
 * Prices enter only as the price ratio PR = nutrient price / grain price (kg
 * grain per kg N), with no application cost: the net return over the check,
 * p_grain·(y(x) − y(0)) − p_N·x, is p_grain·(y(x) − y(0) − PR·x), so its
 * maximizer depends on PR alone.
 */
import type { Plot, PlotTable } from '../table/plotTable';
import { mulberry32, type Random } from './mulberry32';

/** The true responses the simulation draws sites from. */
export type TruthName =
  | 'linear-plateau'
  | 'quadratic-plateau'
  | 'exponential'
  | 'flat'
  | 'full-response'
  | 'straight-line';

/**
 * The truths the decisions are judged on, in the order reports list them. The straight line is
 * not among them: it never levels off, so it has no finite optimum to judge a rate by; it serves
 * the gain-over-check test (STRAIGHT_GAIN_TRUTHS).
 */
export const TRUTH_NAMES: readonly TruthName[] = [
  'linear-plateau',
  'quadratic-plateau',
  'exponential',
  'flat',
  'full-response',
];

/** One true response of yield to N rate, and its economic optimum. */
export interface Truth {
  name: TruthName;
  /** The curve and its parameters in words, for reports. */
  description: string;
  /**
   * True yield at standard moisture.
   * @param rateKgHa - N rate, kg/ha
   * @returns yield, kg/ha
   */
  yieldKgHa(rateKgHa: number): number;
  /**
   * The true economic optimum rate over all rates ≥ 0 (no application cost).
   * @param priceRatio - nutrient price / grain price, kg grain per kg N
   * @returns the rate maximizing y(x) − PR·x, kg/ha
   */
  optimumKgHa(priceRatio: number): number;
  /** Where the curve reaches its plateau (the join of a plateau curve), kg/ha; null without one. */
  joinKgHa: number | null;
}

/** The N rates of every simulated site, kg/ha. */
export const SIMULATED_RATES_KG_HA: readonly number[] = [0, 40, 80, 120, 160, 200];

/** Blocks per simulated site. */
export const SIMULATED_BLOCKS = 4;

/**
 * y = a + b·min(x, x0): slope b up to the join x0, flat beyond.
 * Optimum: y(x) − PR·x rises with slope b − PR on [0, x0] and falls with slope −PR after, so
 * it is largest at x0 when b > PR and at 0 otherwise.
 */
function linearPlateau(name: TruthName, a: number, b: number, x0: number): Truth {
  return {
    name,
    description: `linear-plateau: ${a} + ${b}·min(x, ${x0}) kg/ha`,
    yieldKgHa: (x) => a + b * Math.min(x, x0),
    optimumKgHa: (pr) => (b > pr ? x0 : 0),
    joinKgHa: x0,
  };
}

/**
 * y = P + c·(x − x0)² for x < x0 (c < 0), P beyond: a parabola rising to its vertex at the join.
 * Optimum: the slope 2c(x − x0) falls from −2c·x0 at 0 to 0 at x0; it equals PR at
 * x* = x0 + PR/(2c), which lies in (0, x0) when −2c·x0 > PR. With a slope at 0 below PR,
 * y(x) − PR·x falls everywhere and the optimum is 0; hence max(x*, 0).
 */
function quadraticPlateau(name: TruthName, check: number, plateau: number, x0: number): Truth {
  const c = (check - plateau) / (x0 * x0);
  return {
    name,
    description: `quadratic-plateau: from ${check} at 0 to the plateau ${plateau} kg/ha at ${x0} kg/ha`,
    yieldKgHa: (x) => plateau + c * Math.min(x - x0, 0) ** 2,
    optimumKgHa: (pr) => Math.max(x0 + pr / (2 * c), 0),
    joinKgHa: x0,
  };
}

/**
 * y = a + b·(1 − e^(−k·x)): a rise towards the asymptote a + b, never reached.
 * Optimum: the slope b·k·e^(−k·x) falls from b·k at 0 towards 0; it equals PR at
 * x* = ln(b·k / PR) / k when b·k > PR, else every unit loses and the optimum is 0.
 */
function exponentialRise(name: TruthName, a: number, b: number, k: number): Truth {
  return {
    name,
    description: `exponential rise: ${a} + ${b}·(1 − e^(−${k}·x)) kg/ha`,
    yieldKgHa: (x) => a + b * -Math.expm1(-k * x),
    optimumKgHa: (pr) => (b * k > pr ? Math.log((b * k) / pr) / k : 0),
    joinKgHa: null,
  };
}

/**
 * y = a + b·x: every kg of N adds b, so the gains over the check lie on a straight line through
 * the origin. Optimum: y(x) − PR·x rises for ever when b > PR (no finite optimum: Infinity) and
 * falls from 0 otherwise.
 */
function straightLine(name: TruthName, a: number, b: number): Truth {
  return {
    name,
    description: `straight line: ${a} + ${b}·x kg/ha`,
    yieldKgHa: (x) => a + b * x,
    optimumKgHa: (pr) => (b > pr ? Infinity : 0),
    joinKgHa: null,
  };
}

/** y = a at every rate: no N pays, so the optimum is 0 at any positive price ratio. */
function flat(name: TruthName, a: number): Truth {
  return {
    name,
    description: `flat: ${a} kg/ha at every rate`,
    yieldKgHa: () => a,
    optimumKgHa: () => 0,
    joinKgHa: null,
  };
}

/**
 * The five truths at corn-like yields (a check near 8–9 t/ha, a plateau near 12–13 t/ha). Their
 * optima at the illustrative corn price ratio (≈ 7.0 kg grain per kg N) lie well inside the
 * tested rates except where a truth is built to sit at an edge (flat: 0; full response: 30
 * kg/ha, below the lowest non-zero rate, 40 kg/ha).
 */
const TRUTHS: Record<TruthName, Truth> = {
  // Join at 130 kg/ha, between the tested 120 and 160; slope 30 kg/kg, far above PR.
  'linear-plateau': linearPlateau('linear-plateau', 8500, 30, 130),
  // Join at 170 kg/ha; at PR ≈ 7.0 the optimum is 170 − 7.0/(2·0.1557) ≈ 147 kg/ha.
  'quadratic-plateau': quadraticPlateau('quadratic-plateau', 8000, 12500, 170),
  // b·k = 75 kg/kg at 0; at PR ≈ 7.0 the optimum is ln(75/7.0)/0.015 ≈ 158 kg/ha.
  exponential: exponentialRise('exponential', 8000, 5000, 0.015),
  flat: flat('flat', 12000),
  // The whole 3,000 kg/ha gain is reached by 30 kg/ha, below the lowest non-zero rate.
  'full-response': linearPlateau('full-response', 9500, 100, 30),
  // From 8,500 at 0 to 12,500 kg/ha at 200 kg/ha, with no bend.
  'straight-line': straightLine('straight-line', 8500, 20),
};

/**
 * The truths whose gains over each block's check lie on a straight line through the origin, so
 * that the gain-over-check test's nulls (no gain at rate zero, no bend) both hold: flat (all
 * gains zero) and the straight line.
 */
export const STRAIGHT_GAIN_TRUTHS: readonly TruthName[] = ['flat', 'straight-line'];

/**
 * One of the simulation's true responses.
 * @param name - the truth
 * @returns its yield curve (kg/ha) and closed-form optimum (kg/ha at a price ratio)
 * @example
 * simulatedTruth('exponential').optimumKgHa(7) // ≈ 158
 */
export function simulatedTruth(name: TruthName): Truth {
  return TRUTHS[name];
}

/** One site of a simulated table and the truth it was drawn from. */
export interface SimulatedSite {
  site: string;
  truth: TruthName;
  /** The harvest year of its plots. */
  year: number;
}

export interface SimulatedTrialOptions {
  /** The truth of each site, in table order. */
  truths: readonly TruthName[];
  /** PRNG seed; the same seed and truths give the same table. */
  seed: number;
  /** Site names are `${prefix}${truth} ${number}`; default "". */
  prefix?: string;
  /** Plot error CV, as a fraction (default 0.065, the demo trial's). */
  cv?: number;
  /** Standard deviation of the block offsets, kg/ha (default 250, the demo trial's 4 bu/ac). */
  blockSdKgHa?: number;
  /**
   * The site and year of each truth, same order, for trials of one site over several years
   * (the same site name in two entries with two years); default each truth its own site,
   * named as above, in 2025. Blocks and plots are labeled the same way every year (block "1",
   * plot "101", …), as a field kept year after year would be.
   */
  siteYears?: readonly { site: string; year: number }[];
}

export interface SimulatedTrial {
  /** Corn at 15.5 % moisture; yields already at standard moisture, rates in kg N/ha. */
  table: PlotTable;
  sites: SimulatedSite[];
}

/** The numbers 0 … n − 1 in a random order (Fisher–Yates, Knuth TAOCP vol. 2, §3.4.2). */
export function shuffled(rng: Random, n: number): number[] {
  const a = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.int(0, i);
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

/**
 * A plot table of simulated sites with known truths: each site 4 blocks × 6 rates, each block
 * its own offset, each plot y = (truth(x) + block offset) · (1 + CV·z) with z standard normal,
 * plots in a random order within each block (as a randomized field layout would label them).
 * @param options - each site's truth, the seed, and optionally the noise levels
 * @returns the table (canonical kg/ha) and each site's truth
 * @example
 * simulatedTrial({ truths: ['flat', 'exponential'], seed: 1 }).table.plots.length // 48
 */
export function simulatedTrial(options: SimulatedTrialOptions): SimulatedTrial {
  const rng = mulberry32(options.seed);
  const cv = options.cv ?? 0.065;
  const blockSd = options.blockSdKgHa ?? 250;
  const prefix = options.prefix ?? '';
  const rates = SIMULATED_RATES_KG_HA;
  const plots: Plot[] = [];
  const sites: SimulatedSite[] = [];
  if (options.siteYears && options.siteYears.length !== options.truths.length) {
    throw new RangeError(
      `siteYears has ${options.siteYears.length} entries for ${options.truths.length} truths; give one per truth.`,
    );
  }
  options.truths.forEach((name, s) => {
    const truth = TRUTHS[name];
    const site =
      options.siteYears?.[s].site ?? `${prefix}${name} ${String(s + 1).padStart(4, '0')}`;
    const year = options.siteYears?.[s].year ?? 2025;
    sites.push({ site, truth: name, year });
    for (let block = 1; block <= SIMULATED_BLOCKS; block++) {
      const offset = blockSd * rng.normal();
      shuffled(rng, rates.length).forEach((ri, position) => {
        const rate = rates[ri];
        const yieldKgHa = (truth.yieldKgHa(rate) + offset) * (1 + cv * rng.normal());
        plots.push({
          id: `simulated|${site}|${year}|${block}|${position + 1}`,
          site,
          year,
          block: String(block),
          plotLabel: `${block}0${position + 1}`,
          treatment: null,
          rateKgHa: rate,
          yieldKgHa,
          moisturePct: null,
          testWeight: null,
          notes: null,
          groups: {},
          excluded: null,
          original: {},
        });
      });
    }
  });
  return { table: { crop: 'corn', standardMoisturePct: 15.5, plots, sources: [] }, sites };
}
