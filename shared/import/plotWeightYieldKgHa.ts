/**
 * A plot's yield from its harvested weight and its area: the area from an area column, from
 * length × width, or from the import settings, in that order.
 */
import {
  areaToM2,
  lengthToM,
  plotWeightToKgHa,
  type AreaUnit,
  type LengthUnit,
  type MassUnit,
} from '../units/convertYield';
import type { ColumnRole } from '../table/plotTable';
import type { ColumnAssignment } from './columnMapping';

/** The columns a weighed plot may use; plotWeight must be present. */
export interface PlotWeightColumns {
  plotWeight?: ColumnAssignment;
  plotArea?: ColumnAssignment;
  plotLength?: ColumnAssignment;
  plotWidth?: ColumnAssignment;
}

/**
 * The yield of one weighed plot, before any moisture adjustment.
 * @param cols - the sheet's weight, area, length and width columns
 * @param num - reads the row's number in a column (keeping its original cell), null when none
 * @param areaFromSettingsM2 - the plot area of the import settings, m², when the sheet has none
 * @returns kg/ha, or null when the weight or a usable (positive) area is missing
 * @example
 * plotWeightYieldKgHa({ plotWeight, plotArea }, num, undefined) // e.g. 11 250
 */
export function plotWeightYieldKgHa(
  cols: PlotWeightColumns,
  num: (role: ColumnRole, a: ColumnAssignment | undefined) => number | null,
  areaFromSettingsM2: number | undefined,
): number | null {
  if (!cols.plotWeight) return null;
  const w = num('plotWeight', cols.plotWeight);
  let areaM2: number | null;
  if (cols.plotArea) {
    const a = num('plotArea', cols.plotArea);
    areaM2 = a !== null && a > 0 ? areaToM2(a, (cols.plotArea.unit as AreaUnit) ?? 'm2') : null;
  } else if (cols.plotLength && cols.plotWidth) {
    const l = num('plotLength', cols.plotLength);
    const wd = num('plotWidth', cols.plotWidth);
    areaM2 =
      l !== null && wd !== null && l > 0 && wd > 0
        ? lengthToM(l, (cols.plotLength.unit as LengthUnit) ?? 'm') *
          lengthToM(wd, (cols.plotWidth.unit as LengthUnit) ?? 'm')
        : null;
  } else areaM2 = areaFromSettingsM2 ?? null;
  if (w === null || areaM2 === null) return null;
  return plotWeightToKgHa(w, (cols.plotWeight.unit as MassUnit) ?? 'kg', areaM2, 'm2');
}
