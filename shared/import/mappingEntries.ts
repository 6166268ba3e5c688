/**
 * The column mapping in the flat form the provenance sheet and the results
 * file list: which header of which sheet went to which role, in which unit.
 * The command line and the workspace both list their mapping through this, so
 * a report says the same thing whichever made it.
 */
import type { ColumnMapping } from './columnMapping';

/** What a user told import: which header went to which role, in which unit. */
export interface MappingEntry {
  file: string;
  sheet: string;
  role: string;
  header: string;
  unit: string;
}

/**
 * The mapping entries of some files.
 * @param files - each file's name and mapping
 * @param sheets - the sheets imported (default every sheet in use)
 * @returns one entry per column with a role, sheets marked "ignore" left out
 * @example
 * mappingEntries([{ file: 'trial.csv', mapping }])[0] // { file: 'trial.csv', sheet: 'trial', role: 'site', header: 'Farm', unit: '' }
 */
export function mappingEntries(
  files: readonly { file: string; mapping: ColumnMapping }[],
  sheets?: readonly string[],
): MappingEntry[] {
  const out: MappingEntry[] = [];
  for (const { file, mapping } of files) {
    for (const s of mapping.sheets) {
      if (s.use === 'ignore' || (sheets && !sheets.includes(s.sheet))) continue;
      for (const c of s.columns) {
        if (c.role === 'ignore') continue;
        out.push({ file, sheet: s.sheet, role: c.role, header: c.header, unit: c.unit ?? '' });
      }
    }
  }
  return out;
}
