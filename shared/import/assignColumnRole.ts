/**
 * Giving a column a role: the one rule that detection's overrides, the screen's role edits and
 * the command line's --map follow. Apart from columnMapping because it reads the header's unit
 * (headerWords), which itself reads the mapping's types.
 */
import {
  UNITS_BY_ROLE,
  roleTakesOneColumn,
  type ColumnAssignment,
  type HeaderUnit,
  type MappedRole,
} from './columnMapping';
import { rateHeaderBasis, unitFromHeader } from './headerWords';

/**
 * The unit a column takes with a new role: the one its header names, else the one it had, else
 * the role's first unit (the user sees it selected and can change it), or null for a role
 * without units.
 * @example unitForRole({ header: 'Harvested grain (lb)', unit: 't/ha', … }, 'plotWeight') // 'lb'
 */
export function unitForRole(
  column: Pick<ColumnAssignment, 'header' | 'unit'>,
  role: MappedRole,
): HeaderUnit | null {
  const units = UNITS_BY_ROLE[role];
  if (!units) return null;
  const named = unitFromHeader(column.header)?.unit;
  if (named && units.includes(named)) return named;
  return column.unit && units.includes(column.unit) ? column.unit : units[0];
}

/**
 * Gives one column a role; when the role takes one column, the column that had it is set aside
 * ('ignore'), so a sheet never reads two yields. Returns new column objects for the changed ones.
 * @param columns - the sheet's columns
 * @param col - 1-based number of the column that gets the role
 * @param role - the new role
 * @param evidence - why, for the chosen column and for a column set aside
 * @returns the sheet's columns after the change
 * @example
 * assignColumnRole(sheet.columns, 6, 'yield', { chosen: 'set by you', setAside: 'set aside' })
 */
export function assignColumnRole(
  columns: readonly ColumnAssignment[],
  col: number,
  role: MappedRole,
  evidence: { chosen: (was: MappedRole) => string; setAside: string },
): ColumnAssignment[] {
  const one = roleTakesOneColumn(role);
  return columns.map((c) => {
    if (c.col === col) {
      // The user's role settles any question; the unit stays when the new role takes it.
      const { question: _settled, ...rest } = c;
      const unit = unitForRole(c, role);
      // A column that becomes the rate reads its header for product or nutrient, as detection does.
      const said = role === 'rate' && c.role !== 'rate' ? rateHeaderBasis(c.header) : null;
      return {
        ...rest,
        role,
        unit,
        ...(said ? { basis: said.basis, product: said.product } : {}),
        evidence: evidence.chosen(c.role),
      };
    }
    if (one && c.role === role) return { ...c, role: 'ignore', evidence: evidence.setAside };
    return c;
  });
}
