/**
 * The units a trial's files were written in: results are shown in them unless the user picks a
 * system, on the command line and in the workspace alike.
 */
import { rateUnits, type RateUnit } from '../units/convertRate';
import { yieldUnits, type YieldUnit } from '../units/convertYield';
import type { DisplayUnits } from '../units/displayUnits';
import type { ColumnMapping } from './columnMapping';

/**
 * The rate and yield units of the first plots sheets' rate and yield columns.
 * @param mappings - each file's column mapping
 * @param sheets - the sheets imported, or undefined for every plots sheet
 * @returns the units; kg/ha when no rate column names one, and the yield unit that goes with
 *   the rate's system when no yield column does (bu/ac beside lb/ac, else t/ha)
 * @example
 * inputUnitsOf([detectColumns(raw)]) // { rate: 'lb/ac', yield: 'bu/ac' }
 */
export function inputUnitsOf(
  mappings: readonly ColumnMapping[],
  sheets?: readonly string[],
): DisplayUnits {
  let rate: RateUnit | null = null;
  let yld: YieldUnit | null = null;
  for (const mapping of mappings) {
    for (const s of mapping.sheets) {
      if (s.use !== 'plots' || (sheets && !sheets.includes(s.sheet))) continue;
      for (const c of s.columns) {
        if (!c.unit) continue;
        if (c.role === 'rate' && !rate && (rateUnits as readonly string[]).includes(c.unit))
          rate = c.unit as RateUnit;
        if (c.role === 'yield' && !yld && (yieldUnits as readonly string[]).includes(c.unit))
          yld = c.unit as YieldUnit;
      }
    }
  }
  return { rate: rate ?? 'kg/ha', yield: yld ?? (rate === 'lb/ac' ? 'bu/ac' : 't/ha') };
}
