// The regional model by level (shared/analysis/regionalLevelMixedModel) on simulated regions of
// rate × timing site-years from the project's seeded level generator (shared/demo/simulatedLevels:
// 4 blocks, 6 rates, one check per block shared by both timings, plot CV 6.5 %, block SD 250 kg/ha),
// each site-year's truths drawn around the region's (check SD 900 kg/ha, gain SD 800 kg/ha, join
// SD 20 kg N/ha, as tests/fixtures/levelmixed/makeLevelMixed.ts draws them). Measured: how often
// the likelihood-ratio and Wald tests at 5 % declare the timings' regional curves different when
// both timings share every site-year's truth (their Type I error), and when the split's optimum
// is 20 kg N/ha lower at every site-year, with a plateau 1,000 kg/ha higher or the same (their
// power). The
// fit is called on the plots directly (block offsets absorbed), as levelMixedAcrossSites feeds it.
import { fitRegionalLevelMixedModel } from '../../shared/analysis/regionalLevelMixedModel';
import { mulberry32 } from '../../shared/demo/mulberry32';
import { joinForOptimum, levelTrial, type LevelSiteSpec } from '../../shared/demo/simulatedLevels';
import { share, type Share } from './decisionFigures';

export interface LevelMixedScenario {
  scenario: string;
  /** Regions with a fitted model (the others are counted in `noModel`). */
  fitted: number;
  noModel: number;
  likelihoodRatioRejects: Share;
  waldRejects: Share;
}

export interface LevelMixedFigures {
  regions: number;
  siteYearsPerRegion: number;
  scenarios: LevelMixedScenario[];
}

/**
 * Fits the regional model by level on simulated regions, equal and differing timings.
 * @param regions - regions per scenario
 * @param siteYears - site-years per region
 * @param seed - region r of scenario s uses seed + 10000·s + r
 * @param priceRatio - kg grain per kg N at which the differing case's optima are placed
 * @returns each scenario's rejection rates at 5 %
 */
export function levelMixedRegions(
  regions: number,
  siteYears: number,
  seed: number,
  priceRatio: number,
): LevelMixedFigures {
  const scenarios = [
    { name: 'equal timings', plateauShift: null },
    { name: 'split: optimum 20 kg N/ha lower, plateau +1,000', plateauShift: 1000 },
    { name: 'split: optimum 20 kg N/ha lower, same plateau', plateauShift: 0 },
  ];
  const out = scenarios.map((sc, s): LevelMixedScenario => {
    let fitted = 0;
    let lr = 0;
    let wald = 0;
    for (let r = 0; r < regions; r++) {
      const rng = mulberry32(seed + 10000 * s + r);
      const specs: LevelSiteSpec[] = [];
      for (let k = 0; k < siteYears; k++) {
        const check = 8000 + 900 * rng.normal();
        const plateau = check + 4500 + 800 * rng.normal();
        const join = 170 + 20 * rng.normal();
        const early = { level: 'At planting', plateauKgHa: plateau, joinKgHa: join };
        const optimum = join - (priceRatio * join * join) / (2 * (plateau - check));
        const split =
          sc.plateauShift === null
            ? { ...early, level: 'Split' }
            : {
                level: 'Split',
                plateauKgHa: plateau + sc.plateauShift,
                joinKgHa: joinForOptimum(
                  check,
                  plateau + sc.plateauShift,
                  optimum - 20,
                  priceRatio,
                ),
              };
        specs.push({ site: `R${r}S${k}`, checkKgHa: check, levels: [early, split] });
      }
      const table = levelTrial({ sites: specs, seed: seed + 10000 * s + r + 500000 });
      const sites = specs.map((spec) => {
        const plots = table.plots.filter((p) => p.site === spec.site);
        return {
          site: spec.site,
          rateKgHa: plots.map((p) => p.rateKgHa!),
          yieldKgHa: plots.map((p) => p.yieldKgHa!),
          block: plots.map((p) => p.block ?? ''),
          levelIndex: plots.map((p) =>
            p.rateKgHa === 0 ? -1 : p.groups.Timing === 'At planting' ? 0 : 1,
          ),
        };
      });
      const m = fitRegionalLevelMixedModel(sites, ['At planting', 'Split'], 'Timing');
      if (m.model === null) continue;
      fitted++;
      if (m.likelihoodRatio.p < 0.05) lr++;
      if (m.wald.p < 0.05) wald++;
    }
    return {
      scenario: sc.name,
      fitted,
      noModel: regions - fitted,
      likelihoodRatioRejects: share(lr, fitted),
      waldRejects: share(wald, fitted),
    };
  });
  return { regions, siteYearsPerRegion: siteYears, scenarios: out };
}
