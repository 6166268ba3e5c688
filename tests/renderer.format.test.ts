import { describe, expect, it } from 'vitest';
import {
  displayUnits,
  formatMoney,
  formatNumber,
  formatRate,
  formatRateInterval,
  formatSignificant,
  formatYield,
  readTypedNumber,
} from '../renderer/src/lib/format';

describe('renderer format', () => {
  it('displayUnits switches every unit with the one unit-system switch', () => {
    expect(displayUnits('metric')).toEqual({
      rate: 'kg/ha',
      yield: 't/ha',
      area: 'ha',
      mass: 'kg',
    });
    expect(displayUnits('us')).toEqual({ rate: 'lb/ac', yield: 'bu/ac', area: 'ac', mass: 'lb' });
  });

  it('formatNumber follows the locale separators', () => {
    expect(formatNumber(1234.5, 1, 'en-US')).toBe('1,234.5');
    expect(formatNumber(1234.5, 1, 'de-DE')).toBe('1.234,5');
    expect(formatNumber(Number.NaN, 1, 'en-US')).toBe('–');
    expect(formatNumber(null, 1, 'en-US')).toBe('–');
  });

  it('formatRate converts kg/ha to the display unit and names it', () => {
    expect(formatRate(112.0851, 'lb/ac', 'en-US')).toBe('100 lb/ac');
    expect(formatRate(150.4, 'kg/ha', 'en-US')).toBe('150 kg/ha');
    expect(formatRate(25, 'g/m2', 'en-US')).toBe('2.5 g/m²');
  });

  it('formatRateInterval writes a profile interval once in the display unit, marking open ends', () => {
    const closed = { lowKgHa: 112.0851, highKgHa: 224.1702, lowOpen: false, highOpen: false };
    expect(formatRateInterval(closed, 'lb/ac', 'en-US')).toBe('100 to 200 lb/ac');
    expect(formatRateInterval({ ...closed, highOpen: true }, 'kg/ha', 'en-US')).toBe(
      '112 to ≥ 224 kg/ha',
    );
    expect(formatRateInterval({ ...closed, lowKgHa: 0, lowOpen: true }, 'kg/ha', 'en-US')).toBe(
      '≤ 0 to 224 kg/ha',
    );
    expect(formatRateInterval(null, 'kg/ha', 'en-US')).toBe('–');
  });

  it('formatYield uses the crop bushel and a precision per unit', () => {
    // 200 bu/ac of corn = 200 × 56 lb × 1.120851 kg/ha per lb/ac
    const kgHa = 200 * 56 * 1.1208511519;
    expect(formatYield(kgHa, 'bu/ac', 'corn', 'en-US')).toBe('200.0 bu/ac');
    expect(formatYield(11254, 't/ha', 'corn', 'fr-FR')).toBe('11,25 t/ha');
    // Wheat bushels are heavier, so the same kg/ha is fewer bushels.
    expect(formatYield(kgHa, 'bu/ac', 'wheat', 'en-US')).toBe('186.7 bu/ac');
  });

  it('formatSignificant keeps significant digits for small numbers', () => {
    expect(formatSignificant(0.0012345, 3, 'en-US')).toBe('0.00123');
    expect(formatSignificant(0.5, 3, 'en-US')).toBe('0.5');
  });

  it('formatMoney formats ISO currencies and falls back for a user label', () => {
    expect(formatMoney(1.2, 'USD', 'en-US')).toBe('$1.20');
    expect(formatMoney(1.2, 'bushels-of-goodwill', 'en-US')).toBe('1.20 bushels-of-goodwill');
  });
});

describe('plotlySeparators', () => {
  it('takes the decimal and group marks from the locale', async () => {
    const { plotlySeparators } = await import('../renderer/src/lib/format');
    expect(plotlySeparators('en-US')).toBe('.,');
    expect(plotlySeparators('de-DE')).toBe(',.');
  });
});

describe('readTypedNumber', () => {
  // The decimal marks and groups of CLDR as Intl gives them (en-US: "1,234.5"; de-DE: "1.234,5").
  it.each([
    ['0.62', 'en-US', 0.62],
    ['0,62', 'en-US', 0.62],
    ['0,62', 'de-DE', 0.62],
    ['0.62', 'de-DE', 0.62],
    ['1,250', 'en-US', 1250],
    ['1,250', 'de-DE', 1.25],
    ['1.250,5', 'de-DE', 1250.5],
    ['1,250.5', 'en-US', 1250.5],
    [' 177 ', 'fr-FR', 177],
    ['12 kg', 'en-US', null],
    ['', 'en-US', null],
  ])('reads %j in %s as %j', (text, locale, expected) => {
    expect(readTypedNumber(text, locale)).toBe(expected);
  });
});
