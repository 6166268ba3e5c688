/**
 * The invented demo trial: a fictional research farm ("Wrenhollow Research
 * Farm") with six corn sites and two wheat sites whose names are made up.
 * Corn: six N rates (0–240 lb N/ac) × four blocks, yields in bu/ac as weighed
 * at harvest moisture with a moisture column, so the moisture adjustment
 * matters. Wheat: a small metric set in t/ha and kg N/ha.
 *
 * Each site has its own true response (quadratic-plateau, linear-plateau,
 * Mitscherlich, or none), block offsets and plot noise with a CV near 6–7 %,
 * so the curve fitters have something realistic to find. Untidiness is
 * deliberate and listed in {@link DemoTrial.quirks} so tests can check each.
 */
import { mulberry32, type Random } from './mulberry32';

export type ResponseShape = 'quadratic-plateau' | 'linear-plateau' | 'mitscherlich' | 'flat';

export interface DemoSite {
  name: string;
  crop: 'corn' | 'wheat';
  shape: ResponseShape;
  previousCrop: string;
  soil: string;
  /** True yield at the crop's standard moisture, in the site's own unit (bu/ac or t/ha), at a rate in its own unit (lb N/ac or kg N/ha). */
  trueYield: (rate: number) => number;
  /** Mean harvest moisture, %. */
  moisturePct: number;
}

/** One plot row as it is written into the demo workbook. */
export interface DemoPlot {
  site: string;
  year: number;
  block: number;
  plot: string;
  treatment: number;
  /** Rate in the site's unit: lb N/ac for corn, kg N/ha for wheat. */
  rate: number;
  /** Yield as weighed at harvest moisture, rounded as written: bu/ac (corn) or t/ha (wheat). */
  yieldWet: number;
  moisturePct: number;
  /** Test weight: lb/bu for corn, kg/hl for wheat. */
  testWeight: number;
  previousCrop: string;
  soil: string;
  exclude: string;
  notes: string;
  /** The yield is written as text ("187.4") instead of a number. */
  yieldAsText: boolean;
}

export interface DemoTrial {
  farm: string;
  year: number;
  seed: number;
  /** Treatment number → corn rate, lb N/ac. */
  cornTreatments: { treatment: number; rateLbAc: number; source: string; timing: string }[];
  wheatRatesKgHa: number[];
  sites: DemoSite[];
  cornPlots: DemoPlot[];
  wheatPlots: DemoPlot[];
  quirks: {
    missingPlot: { site: string; block: number; treatment: number };
    yieldAsText: { site: string; plot: string };
    excluded: { site: string; plot: string; reason: string };
    flatSite: string;
  };
}

const quadPlateau = (a: number, plateau: number, x0: number) => (x: number) =>
  plateau + ((a - plateau) / (x0 * x0)) * Math.min(x - x0, 0) ** 2;
const linPlateau = (a: number, b: number, x0: number) => (x: number) => a + b * Math.min(x, x0);
const mitscherlich = (a: number, b: number, k: number) => (x: number) =>
  a + b * (1 - Math.exp(-k * x));

/** The demo trial's fixed seed; change it and the committed workbook must be regenerated. */
export const demoSeed = 20250917;

function round(v: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(v * f) / f;
}

function permutation(rng: Random, n: number): number[] {
  const a = Array.from({ length: n }, (_, i) => i);
  for (let i = n - 1; i > 0; i--) {
    const j = rng.int(0, i);
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

/**
 * Builds the demo trial's plot rows from its seed.
 * @param seed - PRNG seed (default {@link demoSeed})
 * @returns the scenario, every plot row and the list of deliberate quirks
 * @example
 * demoTrial().cornPlots.length // 143 (6 sites × 24 plots, one plot missing)
 */
export function demoTrial(seed: number = demoSeed): DemoTrial {
  const rng = mulberry32(seed);
  const cornTreatments = [0, 40, 80, 120, 180, 240].map((rateLbAc, i) => ({
    treatment: i + 1,
    rateLbAc,
    source: rateLbAc === 0 ? 'none' : 'UAN 32%',
    timing: rateLbAc === 0 ? '' : 'pre-plant',
  }));
  const sites: DemoSite[] = [
    {
      name: 'Quillmere North',
      crop: 'corn',
      shape: 'quadratic-plateau',
      previousCrop: 'corn',
      soil: 'silty clay loam',
      trueYield: quadPlateau(118, 206, 165),
      moisturePct: 19.5,
    },
    {
      name: 'Tarrowfield',
      crop: 'corn',
      shape: 'linear-plateau',
      previousCrop: 'corn',
      soil: 'loam',
      trueYield: linPlateau(132, 0.47, 140),
      moisturePct: 21,
    },
    {
      name: 'Brackenhollow',
      crop: 'corn',
      shape: 'mitscherlich',
      previousCrop: 'soybean',
      soil: 'clay loam',
      trueYield: mitscherlich(128, 88, 0.013),
      moisturePct: 17.8,
    },
    {
      name: 'Vesselby Ridge',
      crop: 'corn',
      shape: 'quadratic-plateau',
      previousCrop: 'corn',
      soil: 'silt loam',
      trueYield: quadPlateau(142, 221, 188),
      moisturePct: 22.4,
    },
    {
      name: 'Pennock Flats',
      crop: 'corn',
      shape: 'flat',
      previousCrop: 'soybean',
      soil: 'loam',
      trueYield: () => 194,
      moisturePct: 18.3,
    },
    {
      name: "Orrin's Bend",
      crop: 'corn',
      shape: 'linear-plateau',
      previousCrop: 'corn',
      soil: 'sandy loam',
      trueYield: linPlateau(96, 0.56, 158),
      moisturePct: 16.9,
    },
    {
      name: 'Skellwater Upper',
      crop: 'wheat',
      shape: 'quadratic-plateau',
      previousCrop: 'canola',
      soil: 'silt loam',
      trueYield: quadPlateau(4.6, 7.9, 118),
      moisturePct: 14.2,
    },
    {
      name: 'Skellwater Lower',
      crop: 'wheat',
      shape: 'mitscherlich',
      previousCrop: 'barley',
      soil: 'clay loam',
      trueYield: mitscherlich(5.1, 3.2, 0.021),
      moisturePct: 15.1,
    },
  ];
  const quirks: DemoTrial['quirks'] = {
    missingPlot: { site: 'Tarrowfield', block: 3, treatment: 5 },
    yieldAsText: { site: 'Brackenhollow', plot: '204' },
    excluded: {
      site: 'Vesselby Ridge',
      plot: '302',
      reason: 'deer damage, plot not representative',
    },
    flatSite: 'Pennock Flats',
  };
  const year = 2025;
  const wheatRatesKgHa = [0, 40, 80, 120, 160];
  const cornPlots: DemoPlot[] = [];
  const wheatPlots: DemoPlot[] = [];
  for (const site of sites) {
    const corn = site.crop === 'corn';
    const rates = corn ? cornTreatments.map((t) => t.rateLbAc) : wheatRatesKgHa;
    const stdMoisture = corn ? 15.5 : 13.5;
    const cv = site.shape === 'flat' ? 0.06 : 0.065;
    const blockSd = corn ? 4 : 0.15;
    const out = corn ? cornPlots : wheatPlots;
    for (let block = 1; block <= 4; block++) {
      const blockEffect = blockSd * rng.normal();
      const order = permutation(rng, rates.length);
      order.forEach((ti, pos) => {
        const rate = rates[ti];
        const plotNo = corn
          ? `${block}0${pos + 1}`
          : `${site.name.slice(-5, -4)}${block}0${pos + 1}`;
        const trueStd = site.trueYield(rate) + blockEffect;
        const std = trueStd * (1 + cv * rng.normal());
        const moisturePct = round(site.moisturePct + 0.8 * rng.normal(), 1);
        // Weighed wet: the same dry matter carries more water at harvest.
        const wet = (std * (100 - stdMoisture)) / (100 - moisturePct);
        const testWeight = corn
          ? round(56.5 + 0.9 * rng.normal(), 1)
          : round(78 + 1.2 * rng.normal(), 1);
        const plot: DemoPlot = {
          site: site.name,
          year,
          block,
          plot: plotNo,
          treatment: ti + 1,
          rate,
          yieldWet: round(wet, corn ? 1 : 2),
          moisturePct,
          testWeight,
          previousCrop: site.previousCrop,
          soil: site.soil,
          exclude: '',
          notes: '',
          yieldAsText: false,
        };
        const m = quirks.missingPlot;
        if (site.name === m.site && block === m.block && ti + 1 === m.treatment) return;
        if (site.name === quirks.yieldAsText.site && plotNo === quirks.yieldAsText.plot) {
          plot.yieldAsText = true;
        }
        if (site.name === quirks.excluded.site && plotNo === quirks.excluded.plot) {
          plot.exclude = 'yes';
          plot.notes = quirks.excluded.reason;
        }
        out.push(plot);
      });
    }
  }
  const byPlot = (a: DemoPlot, b: DemoPlot) =>
    a.site === b.site ? a.plot.localeCompare(b.plot, 'en', { numeric: true }) : 0;
  cornPlots.sort(byPlot);
  wheatPlots.sort(byPlot);
  return {
    farm: 'Wrenhollow Research Farm',
    year,
    seed,
    cornTreatments,
    wheatRatesKgHa,
    sites,
    cornPlots,
    wheatPlots,
    quirks,
  };
}
