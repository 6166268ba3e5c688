// An invented two-site nitrogen trial (fictional farms) as a complete project,
// for the project-file and shell tests. Sizes scale with `repeats` so the
// interrupted-save test can make a large file.
import { plotTableForFile } from '../shared/project/serializeProject';
import { parseAddress } from '../shared/table/cellAddress';
import { createHash } from 'node:crypto';
import { createProject } from '../shared/project/createProject';
import type { PlotrateProject, PlotrateProjectV1 } from '../shared/project/projectFormat';
import type { Plot } from '../shared/table/plotTable';

const RATES_KG_HA = [0, 40, 80, 120, 160, 200];
const SITES = [
  { site: 'Hollow Creek', file: 'Hollow Creek 2025.xlsx', sheet: 'Plots' },
  { site: 'Marl Ridge', file: 'marl-ridge-n.csv', sheet: '' },
];

/** A plausible linear-plateau yield, kg/ha, with a fixed wobble per plot so values differ. */
function yieldFor(rate: number, block: number, site: number): number {
  const plateau = site === 0 ? 11_200 : 9_800;
  const base = plateau - 32 * Math.max(0, 150 - rate);
  return Math.round(base + ((block * 37 + rate * 3 + site * 11) % 120) - 60);
}

/**
 * A version 2 project with `repeats` × 4 blocks × 6 rates plots per site.
 * One plot is excluded by the sheet, one by the user.
 */
export function exampleProject(repeats = 1): PlotrateProject {
  const plots: Plot[] = [];
  SITES.forEach((s, si) => {
    let row = 2;
    for (let rep = 0; rep < repeats; rep++)
      for (let block = 1; block <= 4; block++)
        for (const rate of RATES_KG_HA) {
          const y = yieldFor(rate, block + rep, si);
          const ref = (col: string) => ({
            file: s.file,
            sheet: s.sheet,
            ...parseAddress(`${col}${row}`)!,
          });
          plots.push({
            id: `${s.file}|${s.sheet}|${row}`,
            site: s.site,
            year: 2025,
            block: `B${block}`,
            plotLabel: `${block}${String(row).padStart(3, '0')}`,
            treatment: `N${rate}`,
            rateKgHa: rate,
            yieldKgHa: y,
            moisturePct: 15.5,
            testWeight: 72.4,
            notes: row === 5 ? 'hail strip — see field book' : null,
            groups: { 'previous crop': si === 0 ? 'soybean' : 'wheat' },
            excluded:
              row === 7
                ? { reason: 'flooded after planting', by: 'sheet' }
                : row === 9 && si === 1
                  ? { reason: 'sprayer skip', by: 'user' }
                  : null,
            original: {
              site: { text: s.site, ...ref('A') },
              block: { text: String(block), ...ref('B') },
              rate: { text: `${rate} kg N/ha`, ...ref('C') },
              yield: { text: (y / 1000).toFixed(2).replace('.', ','), ...ref('D') },
            },
          });
          row++;
        }
  });
  const sources = SITES.map((s) => ({
    name: s.file,
    bytes: 18_000 + s.file.length,
    sha256: createHash('sha256').update(s.file).digest('hex'),
  }));
  const project = createProject(new Date('2026-02-11T09:30:00.000Z'), '0.1.0');
  return {
    ...project,
    sources,
    table: { crop: 'corn', standardMoisturePct: 15.5, plots, sources },
    mapping: {
      sheet: 'Plots',
      headerRow: 1,
      columns: { A: 'site', B: 'block', C: 'rate', D: 'yield' },
      rateUnit: 'kg N/ha',
      decimalComma: true,
    },
    units: { rate: 'kg/ha', yield: 't/ha' },
    prices: { currency: 'EUR', nutrientPerKg: 1.15, grainPerKg: 0.19 },
    models: {
      fitted: ['linearPlateau', 'quadraticPlateau', 'quadratic'],
      preferred: 'quadraticPlateau',
    },
    bootstrap: { resamples: 2000, seed: 20250911, confidenceLevel: 0.9 },
    notes: 'Split N: 40 at planting, rest at V6. Müller field, östliche Hälfte.',
    view: { selectedSite: 'Marl Ridge', tab: 'fits' },
  };
}

/** The same trial as a version 1 file would have stored it (user exclusions in a separate list). */
export function exampleProjectV1(): PlotrateProjectV1 {
  const v2 = exampleProject();
  const table = v2.table!;
  const userExcluded = table.plots.filter((p) => p.excluded?.by === 'user');
  const sheetExcluded = table.plots.find((p) => p.excluded?.by === 'sheet')!;
  return {
    format: 'plotrate-project',
    version: 1,
    createdAt: v2.createdAt,
    savedAt: '2026-02-12T16:00:00.000Z',
    appVersion: '0.0.9',
    sources: v2.sources,
    table: {
      ...table,
      plots: table.plots.map((p) => (p.excluded?.by === 'user' ? { ...p, excluded: null } : p)),
    },
    mapping: v2.mapping,
    units: v2.units,
    currency: 'EUR',
    fertilizerPrice: 1.15,
    grainPrice: 0.19,
    exclusions: [
      ...userExcluded.map((p) => ({ plotId: p.id, reason: p.excluded!.reason })),
      // The sheet already excludes this plot; its own reason must win.
      { plotId: sheetExcluded.id, reason: 'looked low' },
      // Names a plot that is not in the table: the reason must survive in the notes.
      { plotId: 'old-sheet.xlsx|Plots|99', reason: 'deer damage' },
    ],
    models: v2.models,
    bootstrap: { n: 500, seed: 7 },
    notes: 'First season.',
  };
}

/**
 * A project's file text as JSON.stringify would write it, with the table in the file's form
 * (original cells with their references spelled out) but without the rest of serializeProject.
 */
export function projectFileText(project: PlotrateProject | PlotrateProjectV1, indent = 0): string {
  return JSON.stringify(
    { ...project, table: project.table && plotTableForFile(project.table) },
    null,
    indent,
  );
}
