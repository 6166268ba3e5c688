import { describe, expect, it } from 'vitest';
import { checkSession } from '../renderer/src/lib/session';
import { ILLUSTRATIVE_PRICES } from '../renderer/src/analysis/priceInputs';
import { reportDisplay } from '../renderer/src/analysis/reportInput';
import { priceTerms } from '../shared/economics/priceQuote';
import { canonicalPrices } from '../renderer/src/analysis/priceInputs';

const good = {
  version: 1,
  files: [{ name: 'a.csv', base64: 'aGk=' }],
  edits: { mappings: {}, settings: { crop: 'corn', rateBasis: 'nutrient' }, decisions: {} },
  prices: ILLUSTRATIVE_PRICES,
  unitSystem: 'us',
  locale: 'en-US',
  choices: {},
  blocks: 'fixed',
  step: 'site',
  selectedSite: null,
};

/** { a: { a: … } } nested `levels` deep, built without recursion. */
function deeplyNested(levels: number): Record<string, unknown> {
  let v: Record<string, unknown> = {};
  for (let i = 0; i < levels; i++) v = { a: v };
  return v;
}

describe('checkSession', () => {
  it('accepts a session this build wrote', () => {
    expect(checkSession(JSON.parse(JSON.stringify(good)))).toEqual(good);
  });

  it('accepts model choices by name and a session nested as deep as Plotrate writes', () => {
    const withChoice = { ...good, choices: { 'Site A': 'quadraticPlateau' } };
    expect(checkSession(withChoice)).toEqual(withChoice);
    const nested = { ...good, edits: { ...good.edits, decisions: deeplyNested(20) } };
    expect(checkSession(nested)).toEqual(nested);
  });

  it('accepts a shortfall tolerance of the user’s, the default (null), or none (older sessions)', () => {
    for (const t of [12.5, 0, null]) {
      const withTolerance = { ...good, shortfallTolerancePerHa: t };
      expect(checkSession(withTolerance)).toEqual(withTolerance);
    }
  });

  it('keeps the grower page fields, blanking one that is not text or too long rather than the session', () => {
    const fields = { grower: 'Ada', advisor: 'Ben', field: 'Long Acre', season: '2026' };
    expect(checkSession({ ...good, pageFields: fields })).toEqual({ ...good, pageFields: fields });
    const odd = { ...fields, season: 2026, advisor: 'x'.repeat(500) };
    expect(checkSession({ ...good, pageFields: odd })!.pageFields).toEqual({
      ...fields,
      season: '',
      advisor: '',
    });
  });

  it('keeps value corrections, and refuses corrections that are not a value with a reason', () => {
    const corrections = { 'f|s|4': { yield: { toKgHa: 9876, reason: 'decimal slipped' } } };
    const withCorrections = { ...good, edits: { ...good.edits, corrections } };
    expect(checkSession(withCorrections)).toEqual(withCorrections);
    for (const bad of [
      { 'f|s|4': { moisture: { toKgHa: 1, reason: '' } } },
      { 'f|s|4': { yield: { toKgHa: -5, reason: '' } } },
      { 'f|s|4': { yield: { toKgHa: 9876 } } },
    ])
      expect(checkSession({ ...good, edits: { ...good.edits, corrections: bad } })).toBeNull();
  });

  it.each([
    ['another version', { ...good, version: 2 }],
    ['files without bytes', { ...good, files: [{ name: 'a.csv' }] }],
    ['prices as text', { ...good, prices: { ...ILLUSTRATIVE_PRICES, grainPerKg: '0.2' } }],
    ['an unknown unit system', { ...good, unitSystem: 'imperial' }],
    ['edits without decisions', { ...good, edits: { ...good.edits, decisions: undefined } }],
    ['a negative shortfall tolerance', { ...good, shortfallTolerancePerHa: -1 }],
    ['a shortfall tolerance as text', { ...good, shortfallTolerancePerHa: '12' }],
    // The bounds a project file's values are held to (shared/project/parseProject).
    ['a negative grain price', { ...good, prices: { ...ILLUSTRATIVE_PRICES, grainPerKg: -0.2 } }],
    [
      'a product price of 1e308',
      { ...good, prices: { ...ILLUSTRATIVE_PRICES, productPerKg: 1e308 } },
    ],
    ['an analysis of 0 %', { ...good, prices: { ...ILLUSTRATIVE_PRICES, analysisPct: 0 } }],
    ['an analysis over 100 %', { ...good, prices: { ...ILLUSTRATIVE_PRICES, analysisPct: 146 } }],
    ['a model choice no build knows', { ...good, choices: { 'Site A': 'cubicSpline' } }],
    [
      'a record nested 10,000 levels deep',
      {
        ...good,
        step: 'site',
        choices: {},
        edits: { ...good.edits, decisions: deeplyNested(10_000) },
      },
    ],
  ])('refuses %s', (_label, data) => {
    expect(checkSession(data)).toBeNull();
  });
});

describe('reportDisplay', () => {
  it.each([
    ['as listed (urea 46 %)', { ...ILLUSTRATIVE_PRICES }],
    ['with a changed analysis', { ...ILLUSTRATIVE_PRICES, analysisPct: 40 }],
    [
      'with application cost 0 and another product',
      { ...ILLUSTRATIVE_PRICES, productId: 'uan32' as const, analysisPct: 32 },
    ],
    ['with an application cost', { ...ILLUSTRATIVE_PRICES, applicationPerHa: 14.5 }],
  ])('gives the report the nitrogen and grain prices the screen uses, %s', (_label, prices) => {
    for (const [system, units] of [
      ['us', { rate: 'lb/ac', yield: 'bu/ac' }],
      ['metric', { rate: 'kg/ha', yield: 't/ha' }],
    ] as const) {
      const display = reportDisplay(prices, units, system, 'corn');
      const terms = priceTerms({ ...display, crop: 'corn' });
      const screen = canonicalPrices(prices);
      expect(terms.nutrientPricePerKg).toBeCloseTo(screen.nutrientPricePerKg, 10);
      expect(terms.grainPricePerKg).toBeCloseTo(screen.grainPricePerKg, 10);
      expect(terms.applicationCostPerHa).toBe(screen.applicationCostPerHa);
    }
  });
});
