// Import speed: plot rows per second for a generated 50 000-row workbook and a
// 50 000-row CSV (read → detect → build), plus how fast a 1 GiB zip bomb is refused.
import { performance } from 'node:perf_hooks';
import { buildPlotTable, detectColumns, readTrialFile } from '../shared/import';
import { syntheticCsv, syntheticWorkbook } from '../shared/demo';
import { zipBombXlsx } from '../tests/fixtures/import/zipBomb';

const sites = Math.ceil(50_000 / 24); // 24 plots per site → 50 016 rows

async function timeImport(name: string, bytes: Uint8Array): Promise<void> {
  const t0 = performance.now();
  const raw = await readTrialFile({ name, bytes });
  const t1 = performance.now();
  const mapping = detectColumns(raw);
  const { table } = buildPlotTable(raw, mapping, { crop: 'corn', rateBasis: 'nutrient' });
  const t2 = performance.now();
  const n = table.plots.length;
  const s = (t2 - t0) / 1000;
  console.log(
    `${name}: ${n} plots, ${(bytes.length / 1e6).toFixed(1)} MB; read ${(t1 - t0).toFixed(0)} ms, detect+build ${(t2 - t1).toFixed(0)} ms; ${Math.round(n / s).toLocaleString('en-US')} plot rows/s`,
  );
}

export async function run(): Promise<void> {
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
