// Speed of the response models and the economic optimum (figures only; nothing here fails a build).
// Targets: fitting all six models plus the optimum for a 24-plot site (6 rates × 4 blocks)
// at ≥ 20,000 sites per second on one core; a 1,000-resample bootstrap of one site's optimum
// in < 20 ms.
import { bootstrapOptimum, economicOptimum } from '../shared/economics';
import { fitAllModels, MODEL_NAMES, type ModelName, type SiteData } from '../shared/models';
import { seededRandom } from '../shared/optimize/seededRandom';

const prices = { grainPricePerKg: 0.18, nutrientPricePerKg: 1.1 };

/** An invented site: a quadratic-plateau response plus noise, 6 rates × 4 blocks. */
function inventedSite(seed: number): SiteData {
  const random = seededRandom(seed);
  const rates = [0, 40, 80, 120, 160, 200];
  const rateKgHa: number[] = [];
  const yieldKgHa: number[] = [];
  const block: string[] = [];
  const joinKgHa = 100 + 60 * random.next();
  for (let b = 0; b < 4; b++) {
    for (const r of rates) {
      rateKgHa.push(r);
      // Uniform noise summed four times: roughly normal, sd about 350 kg/ha.
      let noise = 0;
      for (let k = 0; k < 4; k++) noise += random.next() - 0.5;
      yieldKgHa.push(9500 - 0.15 * Math.min(r - joinKgHa, 0) ** 2 + 1200 * noise);
      block.push(`B${b + 1}`);
    }
  }
  return { rateKgHa, yieldKgHa, block };
}

function timeFor(seconds: number, body: () => void): { perSecond: number; count: number } {
  const start = performance.now();
  let count = 0;
  while (performance.now() - start < seconds * 1000) {
    body();
    count++;
  }
  return { perSecond: count / ((performance.now() - start) / 1000), count };
}

export function run(): void {
  const sites = Array.from({ length: 200 }, (_, i) => inventedSite(i + 1));
  let k = 0;
  const fitAndPrice = (options = {}): void => {
    const all = fitAllModels(sites[k++ % sites.length], options);
    for (const name of MODEL_NAMES) economicOptimum(all.fits[name], prices);
  };
  timeFor(0.5, fitAndPrice); // warm-up
  const plain = timeFor(2, fitAndPrice);
  console.log(
    `all six models + optimum, 24 plots, no block terms: ${Math.round(plain.perSecond)} sites/s (target ≥ 20,000)`,
  );
  const blocked = timeFor(2, () => fitAndPrice({ blocks: 'fixed' }));
  console.log(
    `all six models + optimum, 24 plots, fixed blocks:   ${Math.round(blocked.perSecond)} sites/s`,
  );

  const fits = sites.map((s) => fitAllModels(s));
  const reprice = timeFor(1, () => {
    for (let i = 0; i < 500; i++) {
      const f = fits[i % fits.length];
      for (const name of MODEL_NAMES) economicOptimum(f.fits[name], prices);
    }
  });
  console.log(
    `re-pricing 500 sites × 6 models from fitted parameters: ${(1000 / reprice.perSecond).toFixed(2)} ms`,
  );

  const models: ModelName[] = ['quadratic', 'linearPlateau', 'quadraticPlateau', 'exponential'];
  for (const model of models) {
    bootstrapOptimum(sites[0], model, prices, { resamples: 200 }); // warm-up
    const times: number[] = [];
    for (let rep = 0; rep < 5; rep++) {
      const t0 = performance.now();
      bootstrapOptimum(sites[rep], model, prices, { resamples: 1000, seed: rep + 1 });
      times.push(performance.now() - t0);
    }
    times.sort((a, b) => a - b);
    console.log(
      `bootstrap, 1000 resamples, ${model}: median ${times[2].toFixed(1)} ms (target < 20 ms)`,
    );
  }
}
