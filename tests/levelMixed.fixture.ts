// The invented rate × timing site-years of tests/fixtures/levelmixed (made by makeLevelMixed.ts,
// checked against R 4.2.2 nlme) as the CSV a user would open: one row per plot, yields in t/ha.
import { readFileSync } from 'node:fs';

/**
 * One data set of the fixture as CSV text.
 * @param dataset - "differ" (the split timing truly responds differently) or "same"
 * @param sites - how many of the 12 site-years, from the first
 * @returns the CSV, header first
 */
export function levelMixedCsv(dataset: 'differ' | 'same', sites = 12): string {
  const text = readFileSync(
    new URL('./fixtures/levelmixed/levelMixed.plots.csv', import.meta.url),
    'utf8',
  );
  const keep = new Set(
    Array.from({ length: sites }, (_, i) => `Site ${String(i + 1).padStart(2, '0')}`),
  );
  const rows = text
    .trim()
    .split('\n')
    .slice(1)
    .map((l) => l.replace(/"/g, '').split(','))
    .filter((c) => c[0] === dataset && keep.has(c[1]))
    .map(([, site, block, timing, rate, yieldKgHa]) =>
      [site, block, timing === '' ? 'none' : timing, rate, String(Number(yieldKgHa) / 1000)].join(
        ',',
      ),
    );
  return ['Site,Block,Timing,N rate (kg N/ha),Yield (t/ha)', ...rows].join('\n') + '\n';
}
