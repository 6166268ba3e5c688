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
  /**
   * How the column's numbers were read: a rate's "of N" or "of product: Urea 46-0-0"; a yield's
   * moisture ("at harvest moisture, adjusted to 15.5 % moisture with "Moisture"", "at standard
   * moisture, 15.5 %"); "" for other roles.
   */
  readAs: string;
}

/** What the entries need of the import settings to say how rates and yields were read. */
export type ReadAsSettings = Pick<ImportSettings, 'rateBasis' | 'product'> & {
  /** The moisture yields are adjusted to, % wet basis (the table's); absent: not yet known. */
  standardMoisturePct?: number;
};

/** How a rate column's numbers are read: the header's basis and product, else the settings'. */
function rateReadAs(c: ColumnAssignment, settings: ReadAsSettings | undefined): string {
  if (c.role !== 'rate') return '';
  const basis = c.basis ?? settings?.rateBasis ?? null;
  if (basis === 'nutrient') return 'of N';
  if (basis !== 'product') return '';
  const product = c.product ?? settings?.product ?? null;
  return product ? `of product: ${products(product).label}` : 'of product';
}

/**
 * How a yield column's numbers were read as to moisture, as readPlotsSheet reads them: a yield
 * weighed at harvest moisture is adjusted to the standard with the sheet's moisture column (a
 * plot weight always is), and a yield at standard moisture, or one without a moisture column, is
 * taken as it is. Said because the basis is often guessed (harvest when the sheet has a moisture
 * column and the header does not say "dry", "adjusted" or "@ 15 %") and moves every yield.
 */
function yieldReadAs(
  c: ColumnAssignment,
  moisture: ColumnAssignment | undefined,
  standardMoisturePct: number | undefined,
): string {
  if (c.role !== 'yield' && c.role !== 'plotWeight') return '';
  const pct = standardMoisturePct === undefined ? '' : `${standardMoisturePct} % `;
  if (c.role === 'yield' && c.moistureBasis === 'standard')
    return `at standard moisture${standardMoisturePct === undefined ? '' : `, ${standardMoisturePct} %`}`;
  if (!moisture) return `taken as at ${pct || 'standard '}moisture, with no moisture column`;
  return `at harvest moisture, adjusted to ${pct || 'standard '}moisture with "${moisture.header}"`;
}

/**
 * The mapping entries of some files.
 * @param files - each file's name and mapping
 * @param sheets - the sheets imported (default every sheet in use)
 * @param settings - the import settings, for a rate whose header does not say product or N, and
 *   the table's standard moisture, for the yields' reading
 * @returns one entry per column with a role, sheets marked "ignore" left out
 * @example
 * mappingEntries([{ file: 'trial.csv', mapping }])[0] // { file: 'trial.csv', sheet: 'trial', role: 'site', header: 'Farm', unit: '', readAs: '' }
 */
export function mappingEntries(
  files: readonly { file: string; mapping: ColumnMapping }[],
  sheets?: readonly string[],
  settings?: ReadAsSettings,
): MappingEntry[] {
  const out: MappingEntry[] = [];
  for (const { file, mapping } of files) {
    for (const s of mapping.sheets) {
      if (s.use === 'ignore' || (sheets && !sheets.includes(s.sheet))) continue;
      const moisture = s.columns.find((c) => c.role === 'moisture');
      for (const c of s.columns) {
        if (c.role === 'ignore') continue;
        const readAs =
          rateReadAs(c, settings) || yieldReadAs(c, moisture, settings?.standardMoisturePct);
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
