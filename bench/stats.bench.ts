// Statistics core speed: calls per second for the per-site analyses a report
// runs many times (intercept test, block ANOVA complete and with a missing plot,
// Pearson/Spearman), and one large one-way ANOVA (NIST StRD SmLs03, 18 009 values).
import { performance } from 'node:perf_hooks';
import { readFileSync } from 'node:fs';
import { testIntercept } from '../shared/stats/interceptTest';
import { randomizedBlockAnova } from '../shared/stats/randomizedBlockAnova';
import { oneWayAnova } from '../shared/stats/oneWayAnova';
import { pearsonCorrelation } from '../shared/stats/pearson';
import { spearmanCorrelation } from '../shared/stats/spearman';

function rate(name: string, calls: number, body: () => unknown): void {
  body(); // warm up
  const t0 = performance.now();
  for (let i = 0; i < calls; i++) body();
  const ms = performance.now() - t0;
  console.log(
    `${name}: ${Math.round((calls / ms) * 1000).toLocaleString('en-US')} calls/s (${((ms / calls) * 1000).toFixed(1)} µs each)`,
  );
}

export function run(): void {
  // An invented 6-rate × 4-block site (24 plots).
  const rates = [0, 40, 80, 120, 160, 200];
  const treatment: number[] = [];
  const block: string[] = [];
  const y: number[] = [];
  rates.forEach((r, i) =>
    ['I', 'II', 'III', 'IV'].forEach((b, j) => {
      treatment.push(r);
      block.push(b);
      y.push(5000 + 2000 * (1 - Math.exp(-r / 70)) + 60 * j + ((i * 7 + j * 13) % 11) * 25);
    }),
  );
  rate('testIntercept, 24 plots', 20_000, () => testIntercept(treatment, y));
  rate('pearsonCorrelation, 24 plots', 50_000, () => pearsonCorrelation(treatment, y));
  rate('spearmanCorrelation, 24 plots', 20_000, () => spearmanCorrelation(treatment, y));
  rate('randomizedBlockAnova, 6 × 4 complete', 20_000, () =>
    randomizedBlockAnova({ treatment, block, y }),
  );
  const keep = (_: unknown, i: number) => i !== 9;
  const missing = {
    treatment: treatment.filter(keep),
    block: block.filter(keep),
    y: y.filter(keep),
  };
  rate('randomizedBlockAnova, 6 × 4 one plot missing (least squares)', 5_000, () =>
    randomizedBlockAnova(missing),
  );

  const lines = readFileSync(
    new URL('../tests/fixtures/nist/SmLs03.dat', import.meta.url),
    'utf8',
  ).split(/\r?\n/);
  const start = lines.findLastIndex((l) => /^Data/.test(l));
  const t: number[] = [];
  const v: number[] = [];
  for (const line of lines.slice(start + 1)) {
    const parts = line.trim().split(/\s+/);
    if (parts.length === 2) {
      t.push(Number(parts[0]));
      v.push(Number(parts[1]));
    }
  }
  rate(`oneWayAnova, NIST SmLs03 (${v.length} values)`, 200, () =>
    oneWayAnova({ treatment: t, y: v }),
  );
}
