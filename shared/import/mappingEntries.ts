/**
 * The column mapping in the flat form the provenance sheet and the results
 * file list: which header of which sheet went to which role, in which unit.
 * The command line and the workspace both list their mapping through this, so
 * a report says the same thing whichever made it.
 */
import type { ColumnAssignment, ColumnMapping } from './columnMapping';
import type { ImportSettings } from './importSettings';
import { products } from '../units/products';

/** What a user told import: which header went to which role, in which unit. */
export interface MappingEntry {
  file: string;
  sheet: string;
  role: string;
  header: string;
  unit: string;
  /** How a rate's numbers were read: "of N", "of product: Urea 46-0-0"; "" for other roles. */
  readAs: string;
}

/** How a rate column's numbers are read: the header's basis and product, else the settings'. */
function rateReadAs(
  c: ColumnAssignment,
  settings: Pick<ImportSettings, 'rateBasis' | 'product'> | undefined,
): string {
  if (c.role !== 'rate') return '';
  const basis = c.basis ?? settings?.rateBasis ?? null;
  if (basis === 'nutrient') return 'of N';
  if (basis !== 'product') return '';
  const product = c.product ?? settings?.product ?? null;
  return product ? `of product: ${products(product).label}` : 'of product';
}

/**
 * The mapping entries of some files.
 * @param files - each file's name and mapping
 * @param sheets - the sheets imported (default every sheet in use)
 * @param settings - the import settings, for a rate whose header does not say product or N
 * @returns one entry per column with a role, sheets marked "ignore" left out
 * @example
 * mappingEntries([{ file: 'trial.csv', mapping }])[0] // { file: 'trial.csv', sheet: 'trial', role: 'site', header: 'Farm', unit: '', readAs: '' }
 */
export function mappingEntries(
  files: readonly { file: string; mapping: ColumnMapping }[],
  sheets?: readonly string[],
  settings?: Pick<ImportSettings, 'rateBasis' | 'product'>,
): MappingEntry[] {
  const out: MappingEntry[] = [];
  for (const { file, mapping } of files) {
    for (const s of mapping.sheets) {
      if (s.use === 'ignore' || (sheets && !sheets.includes(s.sheet))) continue;
      for (const c of s.columns) {
        if (c.role === 'ignore') continue;
        const readAs = rateReadAs(c, settings);
        out.push({
          file,
          sheet: s.sheet,
          role: c.role,
          header: c.header,
          unit: c.unit ?? '',
          readAs,
        });
      }
    }
  }
  return out;
}
