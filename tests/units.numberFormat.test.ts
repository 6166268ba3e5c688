// One Intl.NumberFormat per locale and options (shared/units/numberFormat): the same formatter
// comes back for the same settings, and it formats as a formatter made afresh would
// (ECMA-402, the platform's own Intl, is the reference).
import { describe, expect, it } from 'vitest';
import { numberFormat } from '../shared/units/numberFormat';

describe('numberFormat', () => {
  it('keeps one formatter per locale and options', () => {
    const a = numberFormat('en-US', { maximumFractionDigits: 1 });
    expect(numberFormat('en-US', { maximumFractionDigits: 1 })).toBe(a);
    expect(numberFormat('de-DE', { maximumFractionDigits: 1 })).not.toBe(a);
    expect(numberFormat('en-US', { maximumFractionDigits: 2 })).not.toBe(a);
  });

  it('formats as a new Intl.NumberFormat with the same settings', () => {
    const cases: [string | undefined, Intl.NumberFormatOptions, number][] = [
      ['en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 }, 1234.5],
      ['de-DE', { maximumSignificantDigits: 3 }, 0.0012345],
      ['fr-FR', { style: 'currency', currency: 'EUR' }, 1234.5],
      [undefined, {}, -0.5],
    ];
    for (const [locale, options, v] of cases) {
      expect(numberFormat(locale, options).format(v)).toBe(
        new Intl.NumberFormat(locale, options).format(v),
      );
    }
  });

  it('refuses an unknown currency code as Intl does, keeping nothing', () => {
    expect(() => numberFormat('en-US', { style: 'currency', currency: 'bushels' })).toThrow(
      RangeError,
    );
  });
});
