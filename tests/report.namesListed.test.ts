// A page lists the first site names and counts the rest (the workbook lists every site).
import { describe, expect, it } from 'vitest';
import { NAMES_LISTED, namesListed } from '../shared/report/namesListed';

describe('namesListed', () => {
  it('lists every name up to the limit and counts the ones past it', () => {
    expect(namesListed(['Alder Flats', 'Brook End'])).toBe('Alder Flats, Brook End');
    const many = Array.from({ length: NAMES_LISTED + 3 }, (_, i) => `Site ${i + 1}`);
    const text = namesListed(many);
    expect(text.endsWith(`Site ${NAMES_LISTED} and 3 more`)).toBe(true);
    expect(text).not.toContain(`Site ${NAMES_LISTED + 1}`);
    expect(namesListed(many.slice(0, NAMES_LISTED))).toBe(many.slice(0, NAMES_LISTED).join(', '));
  });
});
