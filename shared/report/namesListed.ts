/**
 * Site names in a sentence, the first few and a count of the rest: a page that lists forty
 * site-years by name is a page nobody reads and one that no longer prints on one sheet. The
 * workbook's own sheets list every site.
 */

/** Names a sentence lists before it counts the rest. */
export const NAMES_LISTED = 12;

/**
 * The names joined with commas, the ones past `most` counted.
 * @param names - the names, in order
 * @param most - how many to list by name
 * @returns e.g. "Alder Flats, Brook End and 3 more"
 * @example
 * namesListed(['A', 'B', 'C'], 2) // 'A, B and 1 more'
 */
export function namesListed(names: readonly string[], most = NAMES_LISTED): string {
  if (names.length <= most) return names.join(', ');
  return `${names.slice(0, most).join(', ')} and ${names.length - most} more`;
}
