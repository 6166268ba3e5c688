/**
 * The provenance sheet: enough to run the same analysis again and get the
 * same numbers: tool version, time, every source file with its SHA-256, the
 * column mapping and units, the settings, the bootstrap seed and count, and
 * every plot left out with its reason.
 */
import { originalRef } from '../table/originalCell';
import type ExcelJS from 'exceljs';
import type { TrialReport } from './trialReport';
import { fitColumns, setupPage, styleTitle, tableHeading } from './workbookFormat';

/**
 * Adds the provenance sheet.
 * @param wb - the workbook
 * @param report - the analysis
 * @param paper - paper for printing
 * @returns the sheet
 */
export function workbookProvenance(
  wb: ExcelJS.Workbook,
  report: TrialReport,
  paper: 'letter' | 'a4',
): ExcelJS.Worksheet {
  const ws = wb.addWorksheet('Provenance');
  const s = report.settings;
  const titles = new Set<number>([1]);
  ws.getCell('A1').value = 'Provenance: how to repeat this analysis';
  styleTitle(ws.getCell('A1'), 14);
  let r = 3;
  const kv: [string, string | number][] = [
    ['Tool', report.tool.name],
    ['Version', report.tool.version],
    ['Created', report.createdAt],
    ['Crop', report.crop],
    ['Rate unit shown', `${s.units.rate} of N`],
    ['Yield unit shown', s.units.yield],
    ['Unit system', s.unitSystem ?? 'as in the input'],
    ['Block terms in the curve fits', s.blocks],
    ['Bootstrap resamples', s.boot],
    ['Bootstrap seed', s.seed],
    ['Interval level', s.intervalLevel],
    ['Internal units', 'rates kg N/ha; yields kg/ha at the crop’s standard moisture'],
  ];
  for (const [k, v] of kv) {
    ws.getCell(r, 1).value = k;
    ws.getCell(r, 2).value = v;
    r++;
  }
  r++;
  r = tableHeading(ws, r, 'Source files', ['File', 'Bytes', 'SHA-256'], titles);
  for (const f of report.sources) {
    ws.getRow(r++).values = [f.name, f.bytes, f.sha256];
  }
  r++;
  r = tableHeading(
    ws,
    r,
    'Column mapping',
    ['File', 'Sheet', 'Role', 'Header', 'Unit', 'Read as'],
    titles,
  );
  for (const m of report.mapping) {
    ws.getRow(r++).values = [m.file, m.sheet, m.role, m.header, m.unit, m.readAs];
  }
  r++;
  r = tableHeading(
    ws,
    r,
    'Plots left out',
    ['Site', 'Plot', 'Reason', 'Decided by', 'Source'],
    titles,
  );
  let any = false;
  for (const site of report.sites) {
    for (const p of site.plots) {
      if (!p.excluded) continue;
      any = true;
      const cell = p.original.yield ?? p.original.rate;
      const ref = cell ? originalRef(cell) : null;
      ws.getRow(r++).values = [
        site.site,
        p.plotLabel ?? p.id,
        p.excluded.reason,
        p.excluded.by,
        ref ? `${ref.file} ${ref.sheet} ${ref.cell}`.trim() : p.id,
      ];
    }
  }
  if (!any) ws.getCell(r++, 1).value = 'none';
  r++;
  // Values the user corrected: the cell's own text beside the value read and the one used.
  r = tableHeading(
    ws,
    r,
    'Values corrected',
    ['Site', 'Plot', 'Value', 'Cell text', 'Read (kg/ha)', 'Used (kg/ha)', 'Reason', 'Source'],
    titles,
  );
  let corrected = false;
  for (const site of report.sites) {
    for (const p of site.plots) {
      for (const c of p.corrections ?? []) {
        corrected = true;
        const cell = p.original[c.role];
        const ref = cell ? originalRef(cell) : null;
        ws.getRow(r++).values = [
          site.site,
          p.plotLabel ?? p.id,
          c.role,
          cell?.text ?? '',
          c.fromKgHa ?? '',
          c.toKgHa,
          c.reason,
          ref ? `${ref.file} ${ref.sheet} ${ref.cell}`.trim() : p.id,
        ];
      }
    }
  }
  if (!corrected) ws.getCell(r, 1).value = 'none';
  fitColumns(ws, 8, 70, titles);
  ws.views = [{ state: 'frozen', ySplit: 1 }];
  setupPage(ws, paper, 'portrait');
  return ws;
}
