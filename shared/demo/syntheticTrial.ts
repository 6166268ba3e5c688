/**
 * Large invented trials for benchmarks of every stage: N sites × 24 plots
 * (6 N rates × 4 blocks), each site a quadratic-plateau response with its own
 * plateau and join, plot noise near 7 %. Long layout with a site column.
 */
import ExcelJS from 'exceljs';
import type { Plot, PlotTable } from '../table/plotTable';
import { mulberry32 } from './mulberry32';
import { stableZip } from './writeDemoWorkbook';

export interface SyntheticOptions {
  /** Number of sites (24 plots each). */
  sites: number;
  seed?: number;
}

export interface SyntheticRow {
  site: string;
  year: number;
  block: number;
  plot: number;
  rateLbAc: number;
  yieldBuAc: number;
  moisturePct: number;
}

/** Header of the synthetic long layout. */
export const syntheticHeader = [
  'Site',
  'Year',
  'Block',
  'Plot',
  'N rate (lb N/ac)',
  'Yield (bu/ac)',
  'Moisture (%)',
];

/**
 * Generates the plot rows of a synthetic trial.
 * @param options - number of sites and seed
 * @returns sites × 24 rows, yields in bu/ac at harvest moisture, rates in lb N/ac
 * @example
 * syntheticRows({ sites: 2 }).length // 48
 */
export function syntheticRows(options: SyntheticOptions): SyntheticRow[] {
  const rng = mulberry32(options.seed ?? 7);
  const rates = [0, 40, 80, 120, 180, 240];
  const rows: SyntheticRow[] = [];
  for (let s = 0; s < options.sites; s++) {
    const plateau = 170 + 50 * rng.next();
    const x0 = 110 + 90 * rng.next();
    const a = plateau - 60 - 40 * rng.next();
    const c = (a - plateau) / (x0 * x0);
    const mean = 16 + 6 * rng.next();
    for (let block = 1; block <= 4; block++) {
      rates.forEach((rate, i) => {
        const std = (plateau + c * Math.min(rate - x0, 0) ** 2) * (1 + 0.07 * rng.normal());
        const m = Math.round((mean + 0.8 * rng.normal()) * 10) / 10;
        rows.push({
          site: `Site ${String(s + 1).padStart(4, '0')}`,
          year: 2025,
          block,
          plot: block * 100 + i + 1,
          rateLbAc: rate,
          yieldBuAc: Math.round(((std * 84.5) / (100 - m)) * 10) / 10,
          moisturePct: m,
        });
      });
    }
  }
  return rows;
}

/**
 * A synthetic trial as CSV text (comma separated, header first).
 * @param options - number of sites and seed
 * @returns the CSV text
 * @example
 * syntheticCsv({ sites: 1 }).split('\n').length // 26 (header, 24 rows, final newline)
 */
export function syntheticCsv(options: SyntheticOptions): string {
  const lines = [syntheticHeader.map((h) => `"${h}"`).join(',')];
  for (const r of syntheticRows(options)) {
    lines.push([r.site, r.year, r.block, r.plot, r.rateLbAc, r.yieldBuAc, r.moisturePct].join(','));
  }
  return lines.join('\n') + '\n';
}

/**
 * A synthetic trial as an .xlsx workbook with one sheet "Plots".
 * @param options - number of sites and seed
 * @returns the .xlsx bytes
 * @example
 * await syntheticWorkbook({ sites: 100 }) // 2 400 plot rows
 */
export async function syntheticWorkbook(options: SyntheticOptions): Promise<Uint8Array> {
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet('Plots');
  ws.addRow(syntheticHeader);
  for (const r of syntheticRows(options)) {
    ws.addRow([r.site, r.year, r.block, r.plot, r.rateLbAc, r.yieldBuAc, r.moisturePct]);
  }
  return stableZip(new Uint8Array((await wb.xlsx.writeBuffer()) as ArrayBuffer));
}

/**
 * A synthetic trial directly as a PlotTable in canonical units, for benchmarks
 * of the stages after import.
 * @param options - number of sites and seed
 * @returns a corn PlotTable at 15.5 % moisture
 * @example
 * syntheticPlotTable({ sites: 3 }).plots.length // 72
 */
export function syntheticPlotTable(options: SyntheticOptions): PlotTable {
  // lb/ac → kg/ha and bu (56 lb) → kg, from the exact pound and acre.
  const lbAcToKgHa = (0.45359237 * 10000) / 4046.8564224;
  const plots: Plot[] = syntheticRows(options).map((r, i) => ({
    id: `synthetic|Plots|${i + 2}`,
    site: r.site,
    year: r.year,
    block: String(r.block),
    plotLabel: String(r.plot),
    treatment: null,
    rateKgHa: r.rateLbAc * lbAcToKgHa,
    yieldKgHa: (r.yieldBuAc * 56 * lbAcToKgHa * (100 - r.moisturePct)) / 84.5,
    moisturePct: r.moisturePct,
    testWeight: null,
    notes: null,
    groups: {},
    excluded: null,
    original: {},
  }));
  return { crop: 'corn', standardMoisturePct: 15.5, plots, sources: [] };
}
