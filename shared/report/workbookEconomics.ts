/**
 * The economics sheet: the prices as given, the product and its analysis, the
 * nutrient price they imply and the price ratio every optimum was read at.
 */
import type ExcelJS from 'exceljs';
import { products } from '../units/products';
import { priceWeightName } from '../units/unitWeights';
import type { TrialReport } from './trialReport';
import { fitColumns, setupPage, styleTitle } from './workbookFormat';

/**
 * Adds the economics sheet.
 * @param wb - the workbook
 * @param report - the analysis (settings and price terms)
 * @param paper - paper for printing
 * @returns the sheet
 */
export function workbookEconomics(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  paper: 'letter' | 'a4',
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet('Economics');
  const { settings, prices } = report;
  const yw = priceWeightName(settings.units.yield);
  const rw = priceWeightName(settings.units.rate);
  ws.getCell('A1').value = 'Prices and price ratio';
  styleTitle(ws.getCell('A1'), 14);
  const rows: [string, string | number, string?][] = [
    [`Grain price (${settings.currency}/${yw})`, settings.prices.grainPrice, '0.00'],
  ];
  if (settings.prices.product) {
    const p = products(settings.prices.product.id);
    rows.push(['Product', p.label]);
    rows.push(['Product N content (%)', p.nitrogenPct, '0']);
    rows.push([
      `Product price (${settings.currency}/${rw} of product)`,
      settings.prices.product.price,
      '0.000',
    ]);
  }
  rows.push([
    `Nitrogen price (${settings.currency}/${rw} N)`,
    prices.nutrientPriceDisplay,
    '0.000',
  ]);
  rows.push([`Price ratio (${prices.priceRatioUnit})`, prices.priceRatioDisplay, '0.0000']);
  rows.push(['Price ratio (kg grain/kg N)', prices.priceRatioKgPerKg, '0.00']);
  rows.push([`Grain price (${settings.currency}/kg)`, prices.grainPricePerKg, '0.0000']);
  rows.push([`Nitrogen price (${settings.currency}/kg N)`, prices.nutrientPricePerKg, '0.000']);
  rows.push([
    'Prices given by the user',
    settings.prices.defaulted ? 'no: illustrative defaults, replace them with your own' : 'yes',
  ]);
  let r = 3;
  for (const [label, value, numFmt] of rows) {
    ws.getCell(r, 1).value = label;
    const c = ws.getCell(r, 2);
    c.value = value;
    if (numFmt) c.numFmt = numFmt;
    r++;
  }
  r++;
  ws.getCell(r++, 1).value =
    'The economic optimum is the rate where one more unit of N returns exactly its cost in grain: the slope of the response curve equals the price ratio.';
  fitColumns(ws, 10, 60, new Set([1, r - 1]));
  setupPage(ws, paper, 'portrait');
  return ws;
}
