// Money has one owner (shared/units/formatMoney): every amount a view writes carries the user's
// currency and the display area. Expected texts follow the Unicode CLDR currency patterns that
// Node's Intl implements (en-US "$1.20", de-DE "1,20 €"); the area rule (per acre with lb/ac
// rates) is Plotrate's, and 1 ha = 2.4710538 ac (NIST Handbook 44, Appendix C).
import { describe, expect, it } from 'vitest';
import { formatMoney, formatMoneyPerArea, moneyArea } from '../shared/units/formatMoney';
import { growerPage } from '../shared/report/growerPage';
import { resultsJson } from '../shared/report/resultsJson';
import { reportRegionalChart } from '../shared/report/growerPageChart';
import { demoReport } from './report.fixture';

describe('formatMoney', () => {
  it('writes the currency as the locale does, and a label of the user’s own after the number', () => {
    expect(formatMoney(1.2, 'USD', 'en-US')).toBe('$1.20');
    expect(formatMoney(1.2, 'EUR', 'de-DE')).toBe('1,20\u00a0€');
    expect(formatMoney(0.573, 'EUR', 'en-GB', 3)).toBe('€0.573');
    // A third decimal only where the price has one: 1.2 never reads as "1.200" (twelve hundred?).
    expect(formatMoney(1.2, 'USD', 'en-US', 3)).toBe('$1.20');
    expect(formatMoney(2.6087, 'USD', 'en-US', 3)).toBe('$2.609');
    expect(formatMoney(12.5, 'bushels of goodwill', 'en-US')).toBe('12.50 bushels of goodwill');
    expect(formatMoney(null, 'USD')).toBe('–');
  });

  it('quotes per acre with lb/ac rates and per hectare otherwise', () => {
    expect(moneyArea('lb/ac')).toBe('ac');
    expect(moneyArea('kg/ha')).toBe('ha');
    // 100 per ha is 100 / 2.4710538 = 40.47 per acre.
    expect(formatMoneyPerArea(100, 'USD', 'lb/ac', 'en-US')).toBe('$40.47/ac');
    expect(formatMoneyPerArea(100, 'EUR', 'kg/ha', 'de-DE')).toBe('100,00\u00a0€/ha');
  });
});

describe('every amount in the reports carries the currency', () => {
  it('on the grower pages, in the JSON units and on the regional chart', async () => {
    const us = await demoReport('us', 20);
    for (const report of [us, { ...us, settings: { ...us.settings, currency: 'EUR' } }]) {
      const symbol = report.settings.currency === 'USD' ? '$' : '€';
      const pages = [growerPage(report, 'region'), growerPage(report, report.sites[0].site)];
      for (const page of pages) {
        const money = [...page.prices, ...page.facts].filter((f) => /price|return/i.test(f.label));
        expect(money.length).toBeGreaterThan(0);
        for (const f of money) {
          if (/ratio/i.test(f.label)) continue;
          expect(f.value, `${f.label}: ${f.value}`).toContain(symbol);
        }
      }
      const json = resultsJson(report);
      expect(json.settings.currency).toBe(report.settings.currency);
      const chart = reportRegionalChart(report)!;
      expect(chart.panels[0].y.unit).toBe(`${report.settings.currency}/ac`);
    }
  });
});
