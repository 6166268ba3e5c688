/**
 * Checks a mapping before it is used. A mapping is plain data that may come
 * from a project file edited elsewhere or saved by an older version, so every
 * field is checked and a wrong one is named (sheet, column) in an ImportError
 * rather than failing later with a TypeError.
 */
import { MAPPED_ROLES, ROLE_LABELS, UNITS_BY_ROLE, type ColumnMapping } from './columnMapping';
import { ImportError } from './importError';
import { isCropId } from '../units/crops';

/**
 * Validates a column mapping.
 * @param mapping - the mapping to check (any value: it may come from a file)
 * @param file - the file it is for, for messages
 * @returns the same mapping, typed
 * @throws {ImportError} "bad-mapping" naming the sheet and column at fault
 * @example
 * validateMapping(JSON.parse(saved), 'trial.xlsx')
 */
export function validateMapping(mapping: unknown, file: string): ColumnMapping {
  const bad = (what: string, sheet?: string) =>
    new ImportError(
      'bad-mapping',
      `The column mapping for "${file}" ${what}; detect the columns again or correct it.`,
      {
        file,
        ...(sheet !== undefined ? { sheet } : {}),
      },
    );
  const m = mapping as ColumnMapping;
  if (!m || typeof m !== 'object' || !Array.isArray(m.sheets)) throw bad('has no list of sheets');
  for (const s of m.sheets as unknown[]) {
    const sh = s as ColumnMapping['sheets'][number];
    if (!sh || typeof sh !== 'object' || typeof sh.sheet !== 'string')
      throw bad('has a sheet entry without a name');
    const at = `sheet "${sh.sheet}"`;
    if (!['plots', 'treatment-key', 'ignore'].includes(sh.use)) {
      throw bad(
        `gives ${at} the use "${String(sh.use)}" (allowed: plots, treatment-key, ignore)`,
        sh.sheet,
      );
    }
    if (sh.use === 'ignore') continue;
    if (!Number.isInteger(sh.headerRow) || sh.headerRow < 1) {
      throw bad(
        `gives ${at} the header row ${String(sh.headerRow)}; it must be a row number from 1`,
        sh.sheet,
      );
    }
    const site = sh.site as { from?: string; value?: unknown } | undefined;
    if (
      !site ||
      !['column', 'sheet-name', 'fixed'].includes(String(site.from)) ||
      (site.from === 'fixed' && typeof site.value !== 'string')
    ) {
      throw bad(
        `does not say where the site of ${at} comes from (column, sheet name or a fixed name)`,
        sh.sheet,
      );
    }
    if (!Array.isArray(sh.columns)) throw bad(`has no columns for ${at}`, sh.sheet);
    if (sh.cropHint !== undefined && sh.cropHint !== null && !isCropId(String(sh.cropHint))) {
      throw bad(`gives ${at} the unknown crop "${String(sh.cropHint)}"`, sh.sheet);
    }
    for (const c of sh.columns) {
      if (!c || !Number.isInteger(c.col) || c.col < 1 || c.col > 16384) {
        throw bad(`has a column of ${at} without a valid column number`, sh.sheet);
      }
      const col = `column ${c.letter ?? c.col} ("${c.header ?? ''}") of ${at}`;
      if (!MAPPED_ROLES.includes(c.role))
        throw bad(`gives ${col} the unknown role "${String(c.role)}"`, sh.sheet);
      const units = UNITS_BY_ROLE[c.role];
      if (units && c.unit !== null && c.unit !== undefined && !units.includes(c.unit)) {
        throw bad(
          `gives ${col} the unit "${String(c.unit)}", which a ${ROLE_LABELS[c.role].toLowerCase()} column cannot have; choose one of ${units.join(', ')}`,
          sh.sheet,
        );
      }
      if (
        c.basis !== undefined &&
        c.basis !== null &&
        c.basis !== 'product' &&
        c.basis !== 'nutrient'
      ) {
        throw bad(
          `gives ${col} the rate basis "${String(c.basis)}" (allowed: product, nutrient)`,
          sh.sheet,
        );
      }
      if (
        c.moistureBasis !== undefined &&
        c.moistureBasis !== 'harvest' &&
        c.moistureBasis !== 'standard'
      ) {
        throw bad(
          `gives ${col} the moisture basis "${String(c.moistureBasis)}" (allowed: harvest, standard)`,
          sh.sheet,
        );
      }
    }
  }
  return m;
}
