/**
 * Years from file and sheet names, for files without a year column. Two files of the same sites for two
 * seasons ("Tamsin Hollow 2024.csv", "Tamsin Hollow 2025.csv") often carry the year only in
 * their names; without it their plots would become one site-year, block 1 of one season
 * merged with block 1 of the next. A name's year is used only when the files of one import
 * name different years, so a single file named for its season reads as it always did.
 */
import type { Plot } from '../table/plotTable';
import type { QualityFinding } from '../table/qualityFinding';

/** A year in a name: a four-digit number from 1950 to 2099 standing apart from other digits. */
const YEAR_IN_NAME = /(?<![0-9])(19[5-9][0-9]|20[0-9]{2})(?![0-9])/g;

/**
 * The one year a file name holds: a four-digit number from 1950 to 2099 standing apart from
 * other digits; null when there is none or more than one.
 * @param name - the file name, e.g. "Tamsin Hollow 2024.csv"
 * @returns the year, e.g. 2024, or null
 * @example
 * yearFromFileName('north_2025_final.xlsx') // 2025
 * yearFromFileName('plots 2024-2025.csv')   // null (two years)
 */
export function yearFromFileName(name: string): number | null {
  const years = [...name.matchAll(YEAR_IN_NAME)].map((m) => Number(m[1]));
  return new Set(years).size === 1 ? years[0] : null;
}

/**
 * Gives the plots of each file with no year of their own the year in the file's name, when the
 * files name different years; one finding per file so the user sees where a year came from.
 * @param files - each file's name and the plots read from it (changed in place)
 * @param findings - where the findings go
 * @example
 * yearsFromFileNames([{ name: 'a 2024.csv', plots }, { name: 'a 2025.csv', plots: later }], findings)
 */
export function yearsFromFileNames(
  files: readonly { name: string; plots: Plot[] }[],
  findings: QualityFinding[],
): void {
  const named = files.filter((f) => f.plots.length > 0 && f.plots.every((p) => p.year === null));
  const yearOf = new Map(named.map((f) => [f, yearFromFileName(f.name)]));
  const distinct = new Set([...yearOf.values()].filter((y) => y !== null));
  // No file name gives a year (the usual case): nothing to compare, so the years of every plot
  // of the other files are not gathered.
  if (distinct.size === 0) return;
  const withYears = files.filter((f) => f.plots.some((p) => p.year !== null));
  // Different years among the files: named ones differ, or a named year is not the others'.
  const otherYears = new Set(withYears.flatMap((f) => f.plots.map((p) => p.year)));
  const differ =
    distinct.size > 1 || [...distinct].some((y) => otherYears.size > 0 && !otherYears.has(y));
  if (!differ) return;
  for (const f of named) {
    const year = yearOf.get(f);
    if (year == null) continue;
    for (const p of f.plots) p.year = year;
    findings.push({
      code: 'year-from-file-name',
      severity: 'info',
      message: `"${f.name}" has no year column; its plots were given the year ${year} from the file's name, because the files imported together are from different years.`,
      refs: [],
    });
  }
}

/** A sheet's site and season read from its name, for sheets whose plots take their site from it. */
export interface SheetNameSiteYear {
  site: string;
  year: number;
}

/**
 * The sites and seasons that sheet names hold, where one site is named with two seasons or more
 * ("Ostmere 2025", "Ostmere 2026"): each such sheet's plots belong to the site "Ostmere" in its
 * year, so the seasons of one site are site-years of it, not two sites. As with file names, a
 * name's year is used only where it links seasons: a workbook of one season keeps its sheet
 * names as its sites.
 * @param sheets - the plots sheets whose site is their name and that have no year column, each
 *   with its file's name
 * @returns per sheet (key `file` + NUL + `sheet`) its site and year; sheets left as they are are absent
 * @example
 * sheetNameSiteYears([{ file: 'f.xlsx', sheet: 'Ostmere 2025' }, { file: 'f.xlsx', sheet: 'Ostmere 2026' }])
 * // Map { 'f.xlsx\u0000Ostmere 2025' => { site: 'Ostmere', year: 2025 }, … }
 */
export function sheetNameSiteYears(
  sheets: readonly { file: string; sheet: string }[],
): Map<string, SheetNameSiteYear> {
  const read = sheets.flatMap(({ file, sheet }) => {
    const year = yearFromFileName(sheet);
    if (year === null) return [];
    // The name without its year: the same year as yearFromFileName found, not digits inside
    // another number ("Plot 120251 2025").
    const site = sheet
      .replace(YEAR_IN_NAME, ' ')
      .replace(/[\s_\-–—,.;:()[\]]+/g, ' ')
      .trim();
    return site ? [{ key: `${file}\u0000${sheet}`, site, year }] : [];
  });
  const years = new Map<string, Set<number>>();
  for (const r of read) years.set(r.site, (years.get(r.site) ?? new Set()).add(r.year));
  return new Map(
    read
      .filter((r) => years.get(r.site)!.size > 1)
      .map((r) => [r.key, { site: r.site, year: r.year }]),
  );
}
