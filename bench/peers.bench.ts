// The whole command beside the scripts an analyst would write for the same CSV
// (bench/peers/: R lm + nls, Python numpy + SciPy curve_fit; each file's header
// says what it fits). All on one generated 1,000-site, 24,000-plot CSV (invented
// data from the seeded synthetic generator), whole process from spawn to exit,
// median of 5 runs each after one warm-up run that is not counted:
//   - `node cli/plotrate.mjs analyze trial.csv --json out.json --boot 0`: the
//     results JSON only and no resamples, since the scripts draw none;
//   - `Rscript bench/peers/plateauFits.R` when Rscript is on the PATH;
//   - `python3 bench/peers/plateau_fits.py` when python3 imports numpy and scipy;
// then the ratios (peer time / Plotrate time, wall and CPU), and the same Plotrate command on
// 10,000 sites. PLOTRATE_BENCH_SITES and PLOTRATE_BENCH_PEER_RUNS change the size
// and the number of runs.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildCli } from '../scripts/buildCli.mjs';
import { syntheticCsv } from '../shared/demo';
import { failure, spawnTimed, type TimedRun } from './spawnTimed';
import { median } from './timing';

const here = path.dirname(fileURLToPath(import.meta.url));
const cli = path.join(here, '..', 'cli', 'plotrate.mjs');

interface Contender {
  name: string;
  command: string;
  args: (csv: string, out: string) => string[];
}

const plotrate: Contender = {
  name: 'plotrate analyze --json --boot 0',
  command: process.execPath,
  args: (csv, out) => [cli, 'analyze', csv, '--json', out, '--boot', '0'],
};

/** The peer scripts whose interpreter is installed here. */
function installedPeers(): Contender[] {
  const found = (command: string, args: string[]): boolean =>
    spawnSync(command, args, { stdio: 'ignore' }).status === 0;
  const peers: Contender[] = [];
  if (found('Rscript', ['--version'])) {
    peers.push({
      name: 'R, lm + nls (bench/peers/plateauFits.R)',
      command: 'Rscript',
      args: (csv, out) => [path.join(here, 'peers', 'plateauFits.R'), csv, out],
    });
  } else console.log('Rscript not found: the R script is left out');
  if (found('python3', ['-c', 'import numpy, scipy'])) {
    peers.push({
      name: 'Python, numpy + SciPy curve_fit (bench/peers/plateau_fits.py)',
      command: 'python3',
      args: (csv, out) => [path.join(here, 'peers', 'plateau_fits.py'), csv, out],
    });
  } else console.log('python3 with numpy and scipy not found: the Python script is left out');
  return peers;
}

/** Median wall and CPU time (s) of `runs` runs after one uncounted warm-up, and the highest peak memory (kB). */
function timeRuns(c: Contender, csv: string, out: string, runs: number): TimedRun | null {
  const walls: number[] = [];
  const cpus: number[] = [];
  let last: TimedRun | null = null;
  let rssKb = 0;
  for (let i = 0; i <= runs; i++) {
    const r = spawnTimed(c.command, c.args(csv, out));
    if (!r.ok) {
      console.log(failure(c.name, r));
      return null;
    }
    if (i > 0) {
      walls.push(r.wallS);
      cpus.push(r.cpuS);
    }
    rssKb = Math.max(rssKb, r.rssKb);
    last = r;
  }
  return last && { ...last, wallS: median(walls), cpuS: median(cpus), rssKb };
}

const line = (name: string, r: TimedRun): string =>
  `  ${name.padEnd(64)} ${r.wallS.toFixed(2).padStart(6)} s wall, ${r.cpuS.toFixed(2).padStart(6)} s CPU, ${(r.rssKb / 1024).toFixed(0).padStart(5)} MB peak`;

/** Runs the comparison and prints each median, its peak memory and the ratios. */
export async function run(): Promise<void> {
  await buildCli();
  const sites = Number(process.env.PLOTRATE_BENCH_SITES ?? 1000);
  const runs = Number(process.env.PLOTRATE_BENCH_PEER_RUNS ?? 5);
  const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-peers-'));
  try {
    const csv = path.join(dir, 'trial.csv');
    writeFileSync(csv, syntheticCsv({ sites, seed: 7 }));
    console.log(
      `${sites} sites × 24 plots (generated CSV), whole process, median of ${runs} runs after a warm-up`,
    );
    const own = timeRuns(plotrate, csv, path.join(dir, 'plotrate.json'), runs);
    if (!own) return;
    console.log(line(plotrate.name, own));
    for (const peer of installedPeers()) {
      const r = timeRuns(peer, csv, path.join(dir, 'peer.csv'), runs);
      if (!r) continue;
      const said = r.stdout.trim().split('\n').pop() ?? '';
      console.log(line(peer.name, r));
      console.log(
        `    ${said}; it took ${(r.wallS / own.wallS).toFixed(1)} times Plotrate's wall time, ${(r.cpuS / own.cpuS).toFixed(1)} times its CPU time`,
      );
    }
    const large = sites * 10;
    const bigCsv = path.join(dir, `trial-${large}.csv`);
    writeFileSync(bigCsv, syntheticCsv({ sites: large, seed: 7 }));
    const big = timeRuns(plotrate, bigCsv, path.join(dir, 'plotrate-large.json'), 3);
    if (big) console.log(line(`${plotrate.name}, ${large} sites (median of 3)`, big));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
