// Import speed: plot rows per second for a generated 50 000-row workbook and a
// 50 000-row CSV (read → detect → build), the 1,000-site CSV of the analyze benchmarks through
// importFiles (CPU time, first call and the median of 5 later ones), plus how fast a 1 GiB zip
// bomb is refused.
import { performance } from 'node:perf_hooks';
import { buildPlotTable, detectColumns, readTrialFile } from '../shared/import';
import { importFiles } from '../shared/import/importFiles';
import { syntheticCsv, syntheticWorkbook } from '../shared/demo';
import { zipBombXlsx } from '../tests/fixtures/import/zipBomb';
import { median } from './timing';

const sites = Math.ceil(50_000 / 24); // 24 plots per site → 50 016 rows

/** Process CPU time so far (user + system, every thread: garbage collection included), ms. */
const cpuMs = (): number => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};

async function timeImport(name: string, bytes: Uint8Array): Promise<void> {
  const t0 = performance.now();
  const c0 = cpuMs();
  const raw = await readTrialFile({ name, bytes });
  const t1 = performance.now();
  const c1 = cpuMs();
  const mapping = detectColumns(raw);
  const { table } = buildPlotTable(raw, mapping, { crop: 'corn', rateBasis: 'nutrient' });
  const t2 = performance.now();
  const c2 = cpuMs();
  const n = table.plots.length;
  const s = (t2 - t0) / 1000;
  console.log(
    `${name}: ${n} plots, ${(bytes.length / 1e6).toFixed(1)} MB; read ${(t1 - t0).toFixed(0)} ms (${(c1 - c0).toFixed(0)} ms CPU), detect+build ${(t2 - t1).toFixed(0)} ms (${(c2 - c1).toFixed(0)} ms CPU); ${Math.round(n / s).toLocaleString('en-US')} plot rows/s, ${Math.round(n / ((c2 - c0) / 1000)).toLocaleString('en-US')} per CPU second`,
  );
}

/** CPU ms of the first call of `f` and of 5 later ones. */
async function cpuRuns(f: () => Promise<unknown>): Promise<{ first: number; warm: number }> {
  const runs: number[] = [];
  for (let i = 0; i < 6; i++) {
    const c = cpuMs();
    await f();
    runs.push(cpuMs() - c);
  }
  return { first: runs[0], warm: median(runs.slice(1)) };
}

/**
 * The 1,000-site, 24,000-row CSV of the analyze benchmarks: the whole importFiles (its first
 * call in the process, then warm), and readTrialFile alone (warm: text → rows of cells).
 */
async function timeThousandSites(): Promise<void> {
  const bytes = new TextEncoder().encode(syntheticCsv({ sites: 1000, seed: 7 }));
  const name = 'synthetic-1000-sites.csv';
  const all = await cpuRuns(() => importFiles([{ name, bytes }], { crop: 'corn', overrides: [] }));
  const read = await cpuRuns(() => readTrialFile({ name, bytes }));
  console.log(
    `${name} (${(bytes.length / 1e6).toFixed(2)} MB, 24,000 rows): importFiles ${all.first.toFixed(0)} ms CPU first call, ${all.warm.toFixed(0)} ms CPU warm; readTrialFile ${read.warm.toFixed(0)} ms CPU warm (medians of 5)`,
  );
}

export async function run(): Promise<void> {
  await timeThousandSites();
  const csv = new TextEncoder().encode(syntheticCsv({ sites }));
  await timeImport('synthetic-50k.csv', csv);
  const xlsx = await syntheticWorkbook({ sites });
  await timeImport('synthetic-50k.xlsx', xlsx);
  for (const truthful of [true, false]) {
    const bomb = zipBombXlsx(1 << 30, truthful);
    const rss0 = process.memoryUsage().rss;
    const t0 = performance.now();
    const msg = await readTrialFile({ name: 'bomb.xlsx', bytes: bomb }).then(
      () => 'accepted (!)',
      (e: Error) => e.message.slice(0, 60),
    );
    const ms = performance.now() - t0;
    const rss = (process.memoryUsage().rss - rss0) / 1e6;
    console.log(
      `zip bomb (${(bomb.length / 1e6).toFixed(2)} MB → 1 GiB, sizes ${truthful ? 'declared' : 'lying'}): refused in ${ms.toFixed(0)} ms, RSS +${rss.toFixed(0)} MB — ${msg}…`,
    );
  }
}
