/**
 * Writes the demo trial as an .xlsx workbook, untidy the way real trial books
 * are: an "About" sheet, a treatment key, one sheet per corn site with title
 * rows above the header, a long wheat sheet with a site column, a missing plot,
 * a yield stored as text and an exclude column.
 *
 * Byte-stable: exceljs stamps the current time into the zip, so its output is
 * unzipped and zipped again by fflate with a fixed time and fixed workbook dates.
 */
import ExcelJS from 'exceljs';
import { unzipSync, zipSync } from 'fflate';
import { demoTrial, type DemoTrial } from './demoTrial';

/** The fixed timestamp written into the demo workbook and its zip entries. */
export const demoTimestamp = new Date(Date.UTC(2025, 10, 3, 9, 0, 0));

/** Sheet names of the demo workbook, in order. */
export const demoSheetNames = {
  about: 'About',
  key: 'Treatments',
  wheat: 'Wheat (metric)',
} as const;

/**
 * Re-zips workbook bytes with a fixed entry time so the same content gives the same bytes.
 * @param bytes - an .xlsx from exceljs
 * @returns the same entries, deflated, stamped with {@link demoTimestamp}
 * @example
 * stableZip(await wb.xlsx.writeBuffer())
 */
export function stableZip(bytes: Uint8Array): Uint8Array {
  const entries = unzipSync(bytes);
  return zipSync(entries, { level: 6, mtime: demoTimestamp });
}

/**
 * Generates the demo workbook.
 * @param trial - the scenario (default: {@link demoTrial} with its fixed seed)
 * @returns the .xlsx bytes
 * @example
 * const bytes = await writeDemoWorkbook(); // ≈ 30 kB
 */
export async function writeDemoWorkbook(trial: DemoTrial = demoTrial()): Promise<Uint8Array> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Plotrate demo generator';
  wb.lastModifiedBy = 'Plotrate demo generator';
  wb.created = demoTimestamp;
  wb.modified = demoTimestamp;

  const about = wb.addWorksheet(demoSheetNames.about);
  about.getColumn(1).width = 90;
  [
    `${trial.farm} — ${trial.year} nitrogen rate trials (invented demonstration data)`,
    '',
    'Corn: six N rates as UAN, four blocks, one sheet per site; rates are on the Treatments sheet.',
    'Corn yields are bu/ac as weighed at harvest moisture; the moisture column is beside them.',
    'Wheat: two sites in metric units on one sheet (t/ha at harvest moisture, kg N/ha).',
    `Every farm, site and person here is fictional. Generated from seed ${trial.seed}.`,
  ].forEach((t, i) => (about.getCell(i + 1, 1).value = t));

  const key = wb.addWorksheet(demoSheetNames.key);
  key.getCell('A1').value = 'Treatment key — corn';
  key.getRow(3).values = ['Trt', 'N rate (lb N/ac)', 'Source', 'Timing'];
  trial.cornTreatments.forEach((t, i) => {
    key.getRow(4 + i).values = [t.treatment, t.rateLbAc, t.source, t.timing];
  });

  for (const site of trial.sites.filter((s) => s.crop === 'corn')) {
    const ws = wb.addWorksheet(site.name);
    ws.getCell('A1').value = `${trial.farm} · ${trial.year} corn N rate trial · ${site.name}`;
    ws.getCell('A2').value = 'Yield as weighed at harvest moisture. Rates: see Treatments.';
    ws.getRow(4).values = [
      'Plot',
      'Block',
      'Trt',
      'Grain yield (bu/ac)',
      'Moisture (%)',
      'Test wt (lb/bu)',
      'Previous crop',
      'Exclude',
      'Notes',
    ];
    ws.getRow(4).font = { bold: true };
    let r = 5;
    for (const p of trial.cornPlots.filter((q) => q.site === site.name)) {
      ws.getRow(r).values = [
        Number(p.plot),
        p.block,
        p.treatment,
        p.yieldAsText ? p.yieldWet.toFixed(1) : p.yieldWet,
        p.moisturePct,
        p.testWeight,
        p.previousCrop,
        p.exclude || null,
        p.notes || null,
      ];
      r++;
    }
    ws.getColumn(4).numFmt = '0.0';
  }

  const wheat = wb.addWorksheet(demoSheetNames.wheat);
  wheat.getCell('A1').value = `${trial.farm} · ${trial.year} winter wheat N trial (metric)`;
  wheat.getRow(3).values = [
    'Site',
    'Year',
    'Rep',
    'Plot',
    'N applied (kg N/ha)',
    'Yield (t/ha)',
    'Moisture %',
    'Soil',
  ];
  trial.wheatPlots.forEach((p, i) => {
    wheat.getRow(4 + i).values = [
      p.site,
      p.year,
      p.block,
      p.plot,
      p.rate,
      p.yieldWet,
      p.moisturePct,
      p.soil,
    ];
  });

  const out = new Uint8Array((await wb.xlsx.writeBuffer()) as ArrayBuffer);
  return stableZip(out);
}
