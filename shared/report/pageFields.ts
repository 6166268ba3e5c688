/**
 * The four lines a grower page is addressed with: who it is for, who advises, which field and
 * which season. Typed by the user (the workspace's report step, the command line's --page-field),
 * kept with the project, printed under the page's title; a blank one prints as a line to write on.
 */

export interface PageFields {
  grower: string;
  advisor: string;
  field: string;
  season: string;
}

export type PageFieldName = keyof PageFields;

/** The fields in the order the page prints them, with their labels. */
export const PAGE_FIELD_LABELS: Readonly<Record<PageFieldName, string>> = {
  grower: 'Grower',
  field: 'Field',
  season: 'Season',
  advisor: 'Advisor',
};

export const PAGE_FIELD_NAMES = Object.keys(PAGE_FIELD_LABELS) as PageFieldName[];

/** Longest text a field keeps: a name or a field description, not a document. */
export const PAGE_FIELD_MAX_CHARS = 120;

export const EMPTY_PAGE_FIELDS: Readonly<PageFields> = {
  grower: '',
  advisor: '',
  field: '',
  season: '',
};

/**
 * Reads page fields kept in a session or a project, field by field: a field that is missing, not
 * text or too long is left blank rather than failing the whole file.
 * @param value - what was stored (any JSON value)
 * @returns the fields, trimmed, each at most PAGE_FIELD_MAX_CHARS characters
 * @example
 * readPageFields({ grower: ' Ada ', season: 2025 }) // { grower: 'Ada', advisor: '', field: '', season: '' }
 */
export function readPageFields(value: unknown): PageFields {
  const out: PageFields = { ...EMPTY_PAGE_FIELDS };
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return out;
  const given = value as Record<string, unknown>;
  for (const name of PAGE_FIELD_NAMES) {
    const v = given[name];
    if (typeof v === 'string' && v.trim().length <= PAGE_FIELD_MAX_CHARS) out[name] = v.trim();
  }
  return out;
}

/**
 * The fields as the page's rows, in print order; a blank field keeps its row with an empty value
 * (the page draws a line to write on).
 * @param fields - the user's fields, or undefined for none
 * @returns one row per field
 * @example pageFieldRows({ ...EMPTY_PAGE_FIELDS, grower: 'Ada' })[0] // { label: 'Grower', value: 'Ada' }
 */
export function pageFieldRows(fields: PageFields | undefined): { label: string; value: string }[] {
  const f = fields ?? EMPTY_PAGE_FIELDS;
  return PAGE_FIELD_NAMES.map((name) => ({ label: PAGE_FIELD_LABELS[name], value: f[name] }));
}
