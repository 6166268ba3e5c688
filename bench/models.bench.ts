// Speed of the response models and the economic optimum (figures only; nothing here fails a build).
// Targets: fitting all six models plus the optimum for a 24-plot site (6 rates × 4 blocks)
// at ≥ 20,000 sites per second on one core; a 1,000-resample bootstrap of one site's optimum
// in < 20 ms. Figures are CPU time of this process (process.cpuUsage), so other jobs on a
// shared machine do not inflate them; wall-clock figures are printed beside them.
import { bootstrapOptimum, economicOptimum } from '../shared/economics';
import {
  fitAllModels,
  MODEL_NAMES,
  prepareSite,
  type ModelName,
  type SiteData,
} from '../shared/models';
import { estimateCurve } from '../shared/models/estimateCurve';
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

/** Runs body repeatedly for about `seconds` of CPU time; rates per CPU second and per wall second. */
function timeFor(
  seconds: number,
  body: () => void,
): { perCpuSecond: number; perWallSecond: number } {
  const wall0 = performance.now();
  const cpu0 = process.cpuUsage();
  let count = 0;
  let cpu = 0;
  while (cpu < seconds * 1e6) {
    for (let i = 0; i < 20; i++) body();
    count += 20;
    const used = process.cpuUsage(cpu0);
    cpu = used.user + used.system;
  }
  return {
    perCpuSecond: count / (cpu / 1e6),
    perWallSecond: count / ((performance.now() - wall0) / 1000),
  };
}

/** CPU and wall milliseconds of one call. */
function timeOnce(body: () => void): { cpuMs: number; wallMs: number } {
  const wall0 = performance.now();
  const cpu0 = process.cpuUsage();
  body();
  const used = process.cpuUsage(cpu0);
  return { cpuMs: (used.user + used.system) / 1000, wallMs: performance.now() - wall0 };
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
    `full fits (errors, residuals, curve, lack of fit) of all six models + optimum, 24 plots: ${Math.round(plain.perCpuSecond)} sites per CPU second (${Math.round(plain.perWallSecond)} per wall second; target ≥ 20,000)`,
  );
  const blocked = timeFor(1, () => fitAndPrice({ blocks: 'fixed' }));
  console.log(
    `  the same with fixed block offsets: ${Math.round(blocked.perCpuSecond)} sites per CPU second`,
  );
  const lean = (): void => {
    const site = prepareSite(sites[k++ % sites.length], 'none');
    for (const name of MODEL_NAMES) economicOptimum(estimateCurve(site, name), prices);
  };
  timeFor(0.3, lean);
  const leanRate = timeFor(2, lean);
  console.log(
    `estimates only (status, parameters, SSE) of all six models + optimum: ${Math.round(leanRate.perCpuSecond)} sites per CPU second (${Math.round(leanRate.perWallSecond)} per wall second)`,
  );

  const fits = sites.map((s) => fitAllModels(s));
  const reprice = timeFor(1, () => {
    for (let i = 0; i < 500; i++) {
      const f = fits[i % fits.length];
      for (const name of MODEL_NAMES) economicOptimum(f.fits[name], prices);
    }
  });
  console.log(
    `re-pricing 500 sites × 6 models from fitted parameters: ${(1000 / reprice.perCpuSecond).toFixed(2)} CPU ms`,
  );

  const models: ModelName[] = ['quadratic', 'linearPlateau', 'quadraticPlateau', 'exponential'];
  for (const model of models) {
    for (let rep = 0; rep < 3; rep++) bootstrapOptimum(sites[10 + rep], model, prices); // warm-up
    const runs = [0, 1, 2, 3, 4].map((rep) =>
      timeOnce(() =>
        bootstrapOptimum(sites[rep], model, prices, { resamples: 1000, seed: rep + 1 }),
      ),
    );
    const cpu = runs.map((r) => r.cpuMs).sort((a, b) => a - b);
    const wall = runs.map((r) => r.wallMs).sort((a, b) => a - b);
    console.log(
      `bootstrap, 1000 resamples, ${model}: median ${cpu[2].toFixed(1)} CPU ms (${wall[2].toFixed(1)} wall ms; target < 20 ms)`,
    );
  }
}
