// The invented two-season fixture of tests/fixtures/siteyears (made by makeSiteYears.ts with the
// project's seeded generator; the year comparison is checked against R on it) as the CSV a user
// would keep for one harvest: one file per year, one row per plot.
import { readRCsv } from './analysis.fixtures';

/** The fixture's harvest years, one file each. */
export const HARVEST_YEARS = ['2024', '2025'] as const;

/**
 * One harvest year of the fixture as CSV text.
 * @param year - 2024 or 2025
 * @param yearColumn - whether the file carries a Year column (false: the year only in its name)
 * @returns the CSV, header first, ending in a line break
 */
export function harvestCsv(year: (typeof HARVEST_YEARS)[number], yearColumn = true): string {
  const rows = readRCsv('../siteyears/siteYears.plots.csv').filter((r) => r.year === year);
  const header = yearColumn
    ? 'Site,Year,Block,Plot,N rate (kg N/ha),Yield (kg/ha)'
    : 'Site,Block,Plot,N rate (kg N/ha),Yield (kg/ha)';
  const lines = rows.map((r) =>
    (yearColumn
      ? [r.site, r.year, r.block, r.plot, r.rate, r.yield]
      : [r.site, r.block, r.plot, r.rate, r.yield]
    ).join(','),
  );
  return [header, ...lines].join('\n') + '\n';
}
