// The roles and units the column review offers (names for people from shared/import).
import {
  ROLE_LABELS,
  UNITS_BY_ROLE,
  type HeaderUnit,
  type MappedRole,
} from '../../../../shared/import/columnMapping';

export { ROLE_LABELS };

export const ROLES = Object.keys(ROLE_LABELS) as MappedRole[];

/** Units that make sense for a role; empty when the role has none. */
export function unitsFor(role: MappedRole): HeaderUnit[] {
  return [...(UNITS_BY_ROLE[role] ?? [])];
}
