/**
 * Invented regions whose population response is a known quadratic, for checking the regional
 * mixed model by simulation and for its benchmark. Each site-year is a randomized complete
 * block trial of 4 blocks × 6 N rates (0–200 kg N/ha, as simulatedSite) whose true curve is
 *   y = (a + a_s) + (b + b_s)·x + (c + c_s)·x²,
 * with (a_s, b_s, c_s) normal, SDs 900 kg/ha, 10 kg/kg and 0.025, the slope and curvature
 * correlated −0.5 (a site that starts steeper bends sooner), block offsets with SD 250 kg/ha
 * and plot errors with SD 550 kg/ha (about 6.5 % of the mean, the demo trial's CV). The
 * population curve a = 8500, b = 48, c = −0.14 reaches its top at 171 kg/ha. All of it is
 * invented.
 *
 * The true regional optimum is that of the population curve: (PR − b)/(2c), capped to
 * [0, 200] kg/ha.
 */
import type { Plot, PlotTable } from '../table/plotTable';
import { mulberry32 } from './mulberry32';
import { SIMULATED_BLOCKS, SIMULATED_RATES_KG_HA } from './simulatedSite';

/** The population quadratic of every simulated region: a (kg/ha), b (kg/kg), c. */
export const REGION_TRUTH = { a: 8500, b: 48, c: -0.14 } as const;

/** One simulated site-year's plots, kg/ha. */
export interface SimulatedSiteYear {
  site: string;
  rateKgHa: number[];
  yieldKgHa: number[];
  block: string[];
}

/**
 * The true regional optimum rate at a price ratio.
 * @param priceRatio - nutrient price / grain price, kg grain per kg N
 * @returns (PR − b)/(2c) of the population curve, capped to 0–200 kg N/ha
 */
export function regionTrueOptimumKgHa(priceRatio: number): number {
  const x = (priceRatio - REGION_TRUTH.b) / (2 * REGION_TRUTH.c);
  return Math.min(Math.max(x, 0), 200);
}

/**
 * Generates a region of site-years.
 * @param siteYears - how many site-years
 * @param seed - any 32-bit integer; the same seed gives the same region
 * @returns each site-year's 24 plots
 * @example
 * simulatedRegion(12, 1).length // 12
 */
export function simulatedRegion(siteYears: number, seed: number): SimulatedSiteYear[] {
  const rng = mulberry32(seed);
  const sites: SimulatedSiteYear[] = [];
  for (let s = 0; s < siteYears; s++) {
    const zb = rng.normal();
    const a = REGION_TRUTH.a + 900 * rng.normal();
    const b = REGION_TRUTH.b + 10 * zb;
    const c = REGION_TRUTH.c + 0.025 * (-0.5 * zb + Math.sqrt(0.75) * rng.normal());
    const site: SimulatedSiteYear = { site: `R${s + 1}`, rateKgHa: [], yieldKgHa: [], block: [] };
    for (let k = 1; k <= SIMULATED_BLOCKS; k++) {
      const offset = 250 * rng.normal();
      for (const x of SIMULATED_RATES_KG_HA) {
        site.rateKgHa.push(x);
        site.yieldKgHa.push(a + b * x + c * x * x + offset + 550 * rng.normal());
        site.block.push(String(k));
      }
    }
    sites.push(site);
  }
  return sites;
}

/**
 * A simulated region as a plot table (canonical kg/ha, corn), for the public analysis API.
 * @param siteYears - how many site-years
 * @param seed - any 32-bit integer; the same as simulatedRegion's
 * @returns the table of simulatedRegion(siteYears, seed)'s plots
 * @example
 * simulatedRegionTable(12, 1).plots.length // 288
 */
export function simulatedRegionTable(siteYears: number, seed: number): PlotTable {
  const plots: Plot[] = simulatedRegion(siteYears, seed).flatMap((s) =>
    s.rateKgHa.map((rateKgHa, i) => ({
      id: `region|${s.site}|${i + 1}`,
      site: s.site,
      year: 2025,
      block: s.block[i],
      plotLabel: String(i + 1),
      treatment: null,
      rateKgHa,
      yieldKgHa: s.yieldKgHa[i],
      moisturePct: null,
      testWeight: null,
      notes: null,
      groups: {},
      excluded: null,
      original: {},
    })),
  );
  return { crop: 'corn', standardMoisturePct: 15.5, plots, sources: [] };
}
