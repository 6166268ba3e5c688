// `plotrate analyze` on a generated 1,000-site, 24,000-plot CSV (invented data
// from the seeded synthetic generator) with the report workbook and the
// results JSON written: whole-process wall time and peak memory of the child.
// Peak memory comes from GNU time (-v, "Maximum resident set size") when
// /usr/bin/time exists, else from the child's own process.resourceUsage().
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { syntheticCsv } from '../shared/demo';

const here = path.dirname(fileURLToPath(import.meta.url));
const cli = path.join(here, '..', 'cli', 'plotrate.mjs');

/** Runs the benchmark and prints wall time, peak memory and output sizes. */
export function run(): void {
  const sites = Number(process.env.PLOTRATE_BENCH_SITES ?? 1000);
  const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-bench-'));
  try {
    const csv = path.join(dir, 'trial.csv');
    writeFileSync(csv, syntheticCsv({ sites, seed: 7 }));
    const args = [
      cli,
      'analyze',
      csv,
      '--out',
      path.join(dir, 'report.xlsx'),
      '--json',
      path.join(dir, 'results.json'),
      '--grain-price',
      '4.5',
      '--nutrient-price',
      '0.6',
    ];
    const gnuTime = existsSync('/usr/bin/time');
    const started = process.hrtime.bigint();
    const r = gnuTime
      ? spawnSync('/usr/bin/time', ['-v', process.execPath, ...args], {
          encoding: 'utf8',
          maxBuffer: 64 << 20,
        })
      : spawnSync(
          process.execPath,
          [
            '--import',
            'data:text/javascript,process.on("exit",()=>process.stderr.write("maxRSS_kB "+process.resourceUsage().maxRSS+"\\n"))',
            ...args,
          ],
          { encoding: 'utf8', maxBuffer: 64 << 20 },
        );
    const wallS = Number(process.hrtime.bigint() - started) / 1e9;
    if (r.status !== 0) {
      console.log(
        `plotrate analyze failed (exit ${r.status}): ${r.stderr.split('\n').slice(-5).join(' ')}`,
      );
      return;
    }
    const rssKb = gnuTime
      ? Number(/Maximum resident set size \(kbytes\): (\d+)/.exec(r.stderr)?.[1] ?? NaN)
      : Number(/maxRSS_kB (\d+)/.exec(r.stderr)?.[1] ?? NaN);
    const size = (f: string): string => `${(statSync(path.join(dir, f)).size / 1e6).toFixed(1)} MB`;
    console.log(
      `plotrate analyze, ${sites} sites × 24 plots, workbook + JSON written, default 200 bootstrap resamples`,
    );
    console.log(`  wall time      ${wallS.toFixed(1)} s (whole process, from spawn to exit)`);
    console.log(
      `  peak memory    ${(rssKb / 1024).toFixed(0)} MB (max resident set, ${gnuTime ? 'GNU time -v' : 'process.resourceUsage'})`,
    );
    console.log(`  report.xlsx    ${size('report.xlsx')}`);
    console.log(`  results.json   ${size('results.json')}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
