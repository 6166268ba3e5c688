// The roles and units the column review offers (names for people, codes for the mapping).
import type { HeaderUnit, MappedRole } from '../../../../shared/import/columnMapping';

export const ROLE_LABELS: Record<MappedRole, string> = {
  site: 'Site',
  year: 'Year',
  block: 'Block (replicate)',
  plot: 'Plot',
  treatment: 'Treatment',
  rate: 'N rate',
  yield: 'Yield',
  plotWeight: 'Plot grain weight',
  plotArea: 'Plot area',
  plotLength: 'Plot length',
  plotWidth: 'Plot width',
  moisture: 'Grain moisture',
  testWeight: 'Test weight',
  notes: 'Notes',
  exclude: 'Exclude flag',
  group: 'Grouping (soil, previous crop…)',
  product: 'Product (key)',
  timing: 'Timing (key)',
  ignore: 'Not used',
};

export const ROLES = Object.keys(ROLE_LABELS) as MappedRole[];

/** Units that make sense for a role; empty when the role has none. */
export function unitsFor(role: MappedRole): HeaderUnit[] {
  switch (role) {
    case 'rate':
      return ['kg/ha', 'lb/ac', 'g/m2'];
    case 'yield':
      return ['kg/ha', 't/ha', 'lb/ac', 'bu/ac', 'g/m2'];
    case 'plotWeight':
      return ['kg', 'g', 'lb'];
    case 'plotArea':
      return ['m2', 'ft2', 'ha', 'ac'];
    case 'plotLength':
    case 'plotWidth':
      return ['m', 'ft'];
    case 'moisture':
      return ['%'];
    case 'testWeight':
      return ['lb/bu', 'kg/hl'];
    default:
      return [];
  }
}
