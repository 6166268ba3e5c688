// Reading the R-generated fixtures in tests/fixtures/sites/ into the shapes the
// across-site code takes. Shared by the sites tests; not a test itself.
import { readFileSync } from 'node:fs';
import type { Plot, PlotTable } from '../shared/table/plotTable';

/** Splits one CSV line written by R's write.csv (quoted strings, no embedded quotes). */
function splitCsvLine(line: string): string[] {
  const out: string[] = [];
  const re = /"([^"]*)"|([^,]+)|(?<=,|^)(?=,|$)/g;
  for (const m of line.matchAll(re)) out.push((m[1] ?? m[2] ?? '').trim());
  return out;
}

/** Rows of an R CSV fixture as header → text; lines starting with # are comments. */
export function readRCsv(file: string): Record<string, string>[] {
  const text = readFileSync(new URL(`./fixtures/sites/${file}`, import.meta.url), 'utf8');
  const lines = text.split(/\r?\n/).filter((l) => l.trim() !== '' && !l.startsWith('#'));
  const header = splitCsvLine(lines[0]);
  return lines.slice(1).map((l) => {
    const cells = splitCsvLine(l);
    return Object.fromEntries(header.map((h, i) => [h, cells[i]]));
  });
}

/** The first comment line of a fixture (it names the R version that wrote it). */
export function fixtureHeader(file: string): string {
  return readFileSync(new URL(`./fixtures/sites/${file}`, import.meta.url), 'utf8').split(
    /\r?\n/,
  )[0];
}

/** A plot table from pooled.plots.csv: site, previousCrop, block, rate (kg/ha), yield (kg/ha). */
export function pooledPlotTable(): PlotTable {
  return sitesPlotTable('pooled.plots.csv');
}

/**
 * A plot table from an R-written plots CSV of tests/fixtures/sites/: site, block, rate (kg/ha),
 * yield (kg/ha), and previousCrop as a group when the file has it.
 */
export function sitesPlotTable(file: string): PlotTable {
  const rows = readRCsv(file);
  const plots: Plot[] = rows.map((r, i) => ({
    id: `${file}||${i + 2}`,
    site: r.site,
    year: null,
    block: r.block,
    plotLabel: null,
    treatment: null,
    rateKgHa: Number(r.rate),
    yieldKgHa: Number(r.yield),
    moisturePct: null,
    testWeight: null,
    notes: null,
    groups: groupsOf(r),
    excluded: null,
    original: {},
  }));
  return { crop: 'corn', standardMoisturePct: 15.5, plots, sources: [] };
}

/** The previousCrop group of a plots row, when the file has that column. */
function groupsOf(row: Record<string, string>): Record<string, string> {
  return row.previousCrop === undefined ? {} : { previousCrop: row.previousCrop };
}
