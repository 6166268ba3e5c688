/**
 * `plotrate demo`: writes the invented demo trial workbook and its full
 * report (workbook, grower PDF, results JSON) for the corn sites in US units
 * and for the wheat site in metric units, and an invented rate × timing set (a curve per timing
 * from shared checks) with its report, so a new user sees every output.
 * Nitrogen is bought as urea (46 % N), so the grower page gives the rate in
 * product as well as in N; the prices are illustrative and every output says so.
 */
import { mkdirSync, existsSync } from 'node:fs';
import path from 'node:path';
import { writeFileAtomic } from '../electron/atomicWrite';
import {
  demoTimingCsv,
  demoTimingFileName,
  demoTrial,
  writeDemoWorkbook,
  demoSheetNames,
} from '../shared/demo';
import { illustrativePrices } from '../shared/economics/illustrativePrices';
import { quotePrices } from '../shared/economics/priceQuote';
import { displayUnits } from '../shared/units/displayUnits';
import { analyzeCommand, type Console2 } from './analyzeCommand';
import { analyzeDefaults } from './parseArgs';

/** The note every demo output carries beside its prices. */
export const DEMO_PRICE_NOTE =
  'Demo prices (grain and urea) are illustrative, not market prices: give your own before acting on any rate.';

/** The demo workbook's file name (the same as the copy bundled in demo/). */
export const demoFileName = 'wrenhollow-n-trials-2025.xlsx';

/**
 * Runs the demo command.
 * @param dir - folder to write into (created when missing)
 * @param log - where messages go
 * @param version - the app version
 */
export async function demoCommand(dir: string, log: Console2, version: string): Promise<void> {
  mkdirSync(dir, { recursive: true });
  const trial = demoTrial();
  const input = path.join(dir, demoFileName);
  // The demo file is ours to write, but a user's edited copy of it is not: keep it.
  if (existsSync(input)) {
    log.err(`plotrate: ${input} exists; analyzing that copy as it is.`);
  } else {
    await writeFileAtomic(path.resolve(input), await writeDemoWorkbook(trial));
    log.out(`Wrote ${input}`);
  }
  // The command line's own defaults, so the demo shows what a plain run gives.
  const base = analyzeDefaults([input]);
  const createdAt = new Date().toISOString().replace(/\.\d+Z$/, 'Z');
  const corn = trial.sites.filter((s) => s.crop === 'corn').map((s) => s.name);
  // The illustrative prices the workspace starts from (one owner), quoted in each run's units.
  const quoted = (crop: 'corn' | 'wheat', system: 'us' | 'metric') => {
    const p = illustrativePrices(crop);
    const q = quotePrices(p, displayUnits(system), crop, true);
    const grainPrice = q.grainPrice;
    const ureaPrice = q.product!.price;
    const nPrice = ureaPrice / (p.analysisPct / 100);
    const per = system === 'us' ? { grain: 'bu', n: 'lb' } : { grain: 't', n: 'kg' };
    const text = `illustrative prices ${grainPrice.toFixed(2)}/${per.grain} and urea at ${ureaPrice.toFixed(2)}/${per.n}, ${nPrice.toFixed(2)}/${per.n} N`;
    return { grainPrice, ureaPrice, text };
  };
  const cornPrices = quoted('corn', 'us');
  const wheatPrices = quoted('wheat', 'metric');
  const runs = [
    {
      name: 'corn',
      crop: 'corn' as const,
      units: 'us' as const,
      grainPrice: cornPrices.grainPrice,
      ureaPrice: cornPrices.ureaPrice,
      heading: `Corn sites (US units, ${cornPrices.text})`,
      sheets: corn,
    },
    {
      name: 'wheat',
      crop: 'wheat' as const,
      units: 'metric' as const,
      grainPrice: wheatPrices.grainPrice,
      ureaPrice: wheatPrices.ureaPrice,
      heading: `Wheat sites (metric units, ${wheatPrices.text})`,
      sheets: [demoSheetNames.wheat],
    },
  ];
  for (const r of runs) {
    const out = path.join(dir, `demo-${r.name}-report.xlsx`);
    const pdf = path.join(dir, `demo-${r.name}-recommendation.pdf`);
    const json = path.join(dir, `demo-${r.name}-results.json`);
    log.out(`\n${r.heading}`);
    await analyzeCommand(
      {
        ...base,
        out,
        pdf,
        json,
        crop: r.crop,
        units: r.units,
        grainPrice: r.grainPrice,
        nutrientPrice: null,
        product: 'urea',
        productPrice: r.ureaPrice,
      },
      log,
      version,
      { sheets: r.sheets, createdAt, warnings: [DEMO_PRICE_NOTE] },
    );
    log.out(`Wrote ${out}, ${pdf}, ${json}`);
  }
  // The rate × timing set: a Timing column on the plots sheet, so each timing gets its own curve
  // from the shared checks (shared/demo/demoTiming).
  const timingInput = path.join(dir, demoTimingFileName);
  if (existsSync(timingInput)) {
    log.err(`plotrate: ${timingInput} exists; analyzing that copy as it is.`);
  } else {
    await writeFileAtomic(path.resolve(timingInput), new TextEncoder().encode(demoTimingCsv()));
    log.out(`\nWrote ${timingInput}`);
  }
  const timingPrices = quoted('corn', 'metric');
  const out = path.join(dir, 'demo-timing-report.xlsx');
  const pdf = path.join(dir, 'demo-timing-recommendation.pdf');
  const json = path.join(dir, 'demo-timing-results.json');
  log.out(`\nCorn N timing trial (metric units, ${timingPrices.text})`);
  await analyzeCommand(
    {
      ...analyzeDefaults([timingInput]),
      out,
      pdf,
      json,
      crop: 'corn',
      units: 'metric',
      grainPrice: timingPrices.grainPrice,
      nutrientPrice: null,
      product: 'urea',
      productPrice: timingPrices.ureaPrice,
    },
    log,
    version,
    { createdAt, warnings: [DEMO_PRICE_NOTE] },
  );
  log.out(`Wrote ${out}, ${pdf}, ${json}`);
}
