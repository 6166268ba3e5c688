// The command line as a user runs it (node cli/plotrate.mjs, the bundle built
// from the current sources first), whole process from spawn to exit:
//   - `plotrate --help`, start-up alone (median of several runs);
//   - `plotrate analyze` on a generated 1,000-site, 24,000-plot CSV (invented
//     data from the seeded synthetic generator) writing the results JSON only;
//   - the same writing all three outputs (workbook, grower PDF, results JSON), on
//     1,000 sites (a chart for every site) and 5,000 sites (past the default
//     --site-charts limit of 1,000: the regional chart only), with peak memory.
// PLOTRATE_BENCH_SITES and PLOTRATE_BENCH_LARGE_SITES change the two sizes.
// Peak memory: see spawnTimed.ts.
import { mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { SITE_CHART_LIMIT } from '../cli/parseArgs';
import { buildCli } from '../scripts/buildCli.mjs';
import { syntheticCsv } from '../shared/demo';
import { failure, peakMemorySource, spawnTimed, type TimedRun } from './spawnTimed';
import { median } from './timing';

const here = path.dirname(fileURLToPath(import.meta.url));
const cli = path.join(here, '..', 'cli', 'plotrate.mjs');

/** One run of the command line with its wall time and peak memory. */
const runCli = (args: string[]): TimedRun => spawnTimed(process.execPath, [cli, ...args]);

function failed(what: string, r: TimedRun): void {
  console.log(failure(what, r));
}

/** Runs the benchmark and prints wall times, peak memory and output sizes. */
export async function run(): Promise<void> {
  await buildCli();
  const sites = Number(process.env.PLOTRATE_BENCH_SITES ?? 1000);
  const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-bench-'));
  try {
    // Start-up: the first run warms the file cache and is not counted.
    const helpRuns = 11;
    const help: number[] = [];
    let helpRss = NaN;
    for (let i = 0; i <= helpRuns; i++) {
      const r = runCli(['--help']);
      if (!r.ok) return failed('plotrate --help', r);
      if (i > 0) help.push(r.wallS * 1000);
      helpRss = r.rssKb;
    }
    console.log(`plotrate --help, ${helpRuns} runs after one warm-up`);
    console.log(
      `  wall time      median ${median(help).toFixed(0)} ms, fastest ${Math.min(...help).toFixed(0)} ms; ${(helpRss / 1024).toFixed(0)} MB peak`,
    );

    const csv = path.join(dir, 'trial.csv');
    writeFileSync(csv, syntheticCsv({ sites, seed: 7 }));
    const prices = ['--grain-price', '4.5', '--nutrient-price', '0.6'];
    const json = runCli(['analyze', csv, '--json', path.join(dir, 'only.json'), ...prices]);
    if (!json.ok) return failed('plotrate analyze --json', json);
    console.log(
      `plotrate analyze, ${sites} sites × 24 plots, results JSON only, default 200 bootstrap resamples`,
    );
    console.log(
      `  wall time      ${json.wallS.toFixed(1)} s (whole process); ${(json.rssKb / 1024).toFixed(0)} MB peak`,
    );

    for (const n of [sites, Number(process.env.PLOTRATE_BENCH_LARGE_SITES ?? 5000)]) {
      const input = n === sites ? csv : path.join(dir, `trial-${n}.csv`);
      if (n !== sites) writeFileSync(input, syntheticCsv({ sites: n, seed: 7 }));
      const outs = ['report.xlsx', 'report.pdf', 'results.json'].map((f) => path.join(dir, f));
      const full = runCli([
        'analyze',
        input,
        '--out',
        outs[0],
        '--pdf',
        outs[1],
        '--json',
        outs[2],
        ...prices,
      ]);
      if (!full.ok) return failed(`plotrate analyze ${n} sites --out --pdf --json`, full);
      const size = (f: string): string => `${(statSync(f).size / 1e6).toFixed(1)} MB`;
      const charts =
        n <= SITE_CHART_LIMIT ? 'a chart per site' : 'regional chart only (past --site-charts)';
      console.log(
        `plotrate analyze, ${n} sites × 24 plots, workbook + PDF + JSON written (${charts}), 200 bootstrap resamples`,
      );
      console.log(
        `  wall time      ${full.wallS.toFixed(1)} s (whole process, from spawn to exit)`,
      );
      console.log(
        `  peak memory    ${(full.rssKb / 1024).toFixed(0)} MB (max resident set, ${peakMemorySource})`,
      );
      console.log(
        `  sizes          ${outs.map((f) => `${path.basename(f)} ${size(f)}`).join(', ')}`,
      );
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
