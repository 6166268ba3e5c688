/**
 * Which crops a set of files names, and how many plots sheets name each (sheet name, title rows,
 * a crop column or the file name, as detectColumns read them). One count for the command line's
 * choice of crop (importFiles: the crop most sheets name) and the workspace's (it takes the same
 * crop on the first files, offers a picker when several are named, and asks when none is).
 */
import type { CropId } from '../table/plotTable';
import type { ColumnMapping } from './columnMapping';

export interface CropNamed {
  crop: CropId;
  /** Plots sheets naming it. */
  sheets: number;
  /** Where it was first read: "the file name …", "sheet "Wheat 2025" in "trial.xlsx"", … */
  where: string;
}

/**
 * The crops the plots sheets name, most-named first (the first named on a tie).
 * @param files - each file's name and column mapping, in file order
 * @param only - sheets to count (default every plots sheet)
 * @returns one entry per crop named; [] when no sheet names one
 * @example
 * cropsNamed([{ name: 'wheat 2025.csv', mapping }])[0] // { crop: 'wheat', sheets: 1, where: 'the file name …' }
 */
export function cropsNamed(
  files: readonly { name: string; mapping: ColumnMapping }[],
  only?: readonly string[],
): CropNamed[] {
  const named: CropNamed[] = [];
  for (const { name, mapping } of files) {
    for (const s of mapping.sheets) {
      if (s.use !== 'plots' || !s.cropHint || (only && !only.includes(s.sheet))) continue;
      const seen = named.find((c) => c.crop === s.cropHint);
      if (seen) seen.sheets++;
      else
        named.push({
          crop: s.cropHint,
          sheets: 1,
          where: s.cropEvidence?.startsWith('the file name')
            ? s.cropEvidence
            : `${s.cropEvidence ?? `sheet "${s.sheet}"`} in "${name}"`,
        });
    }
  }
  // A stable sort keeps the first named ahead on a tie.
  return named.sort((a, b) => b.sheets - a.sheets);
}
