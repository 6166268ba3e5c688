// parseArgs: every mistake in the command line becomes one sentence naming
// the option and what is allowed; good input becomes the typed command.
import { describe, expect, it } from 'vitest';
import { parseArgs, type AnalyzeArgs } from '../cli/parseArgs';

describe('parseArgs', () => {
  it('reads an analyze command with every option', () => {
    const c = parseArgs([
      'analyze',
      'a.csv',
      'b.xlsx',
      '--out',
      'r.xlsx',
      '--pdf',
      'r.pdf',
      '--json',
      'r.json',
      '--crop',
      'wheat',
      '--units',
      'metric',
      '--grain-price',
      '220',
      '--product',
      'UAN 32',
      '--product-price',
      '0.35',
      '--boot',
      '50',
      '--seed',
      '9',
      '--threads',
      '3',
      '--blocks',
      'fixed',
      '--shortfall-tolerance',
      '7.5',
      '--currency',
      'eur',
      '--site-charts',
      '40',
      '--plot-area',
      '12.5',
      '--yield-moisture',
      'standard',
      '--map',
      'yield=Grain (t/ha)',
      'block=Rep',
      'factor=Source',
      '--level-price',
      'Stabilised urea=0.75',
      'UAN=0.62',
      '--column-unit',
      'plotArea=ft2',
      '--page-field',
      'grower=Ada Brinkwater',
      '--page-field',
      'season= 2026 ',
    ]);
    expect(c).toEqual({
      command: 'analyze',
      files: ['a.csv', 'b.xlsx'],
      out: 'r.xlsx',
      pdf: 'r.pdf',
      json: 'r.json',
      crop: 'wheat',
      units: 'metric',
      grainPrice: 220,
      currency: 'EUR',
      nutrientPrice: null,
      product: 'uan32',
      productPrice: 0.35,
      boot: 50,
      seed: 9,
      threads: 3,
      blocks: 'fixed',
      map: [
        { role: 'yield', header: 'Grain (t/ha)' },
        { role: 'block', header: 'Rep' },
        { role: 'factor', header: 'Source' },
      ],
      levelPrices: { 'Stabilised urea': 0.75, UAN: 0.62 },
      columnUnits: [{ role: 'plotArea', unit: 'ft2' }],
      pageFields: { grower: 'Ada Brinkwater', advisor: '', field: '', season: '2026' },
      shortfallTolerance: 7.5,
      siteChartLimit: 40,
      plotAreaM2: 12.5,
      yieldMoisture: 'standard',
    });
  });

  it.each([
    [['--column-unit', 'plotWeight=t/ha'], /a plotWeight column takes kg, g, lb/],
    [['--column-unit', 'block=m'], /"block" is not a role with a unit/],
    [['--column-unit', 'kg'], /write role=unit/],
    [['--column-unit'], /needs at least one role=unit/],
    [['--currency', 'euro'], /three-letter currency code such as USD/],
    [['--page-field', 'farm=North'], /a name of grower, field, season, advisor/],
    [['--page-field', `field=${'x'.repeat(121)}`], /at most 120 characters/],
    [['--currency'], /--currency \(missing\)/],
    [['--level-price', 'Split'], /write Level=price with a price above 0/],
    [['--level-price', 'Split=-1'], /write Level=price with a price above 0/],
    [['--level-price'], /needs at least one Level=price/],
    [['--yield-moisture', 'dry'], /--yield-moisture dry: use harvest or standard/],
  ])('refuses %j with a line that says what it takes', (words, message) => {
    expect(() => parseArgs(['analyze', 'a.csv', ...words])).toThrow(message);
  });

  it('has defaults: the crop the files name, input units, 200 resamples, seed 1, block terms where labelled', () => {
    const c = parseArgs(['analyze', 'a.csv']);
    expect(c).toMatchObject({
      crop: null,
      units: null,
      boot: 200,
      seed: 1,
      threads: null,
      blocks: 'fixed',
      out: null,
      shortfallTolerance: null,
      siteChartLimit: 1000,
      plotAreaM2: null,
      yieldMoisture: null,
    });
  });

  it.each([
    [['analyze'], /at least one trial file/],
    [['analyze', 'a.csv', '--boot', '-1'], /--boot -1: a whole number from 0 to 100000/],
    [['analyze', 'a.csv', '--boot'], /--boot needs a value/],
    [['analyze', 'a.csv', '--threads', '0'], /--threads 0: a whole number from 1 to 256/],
    [['analyze', 'a.csv', '--plot-area', '0'], /--plot-area 0: a plot area, e\.g\. 55\.7/],
    [['analyze', 'a.csv', '--plot-area', '12yd2'], /--plot-area 12yd2: .*units m2, ft2, ha, ac/],
    [['analyze', 'a.csv', '--units', 'imperial'], /--units imperial: use us or metric/],
    [['analyze', 'a.csv', '--crop', 'rice'], /--crop rice: use one of corn, wheat/],
    [['analyze', 'a.csv', '--grain-price', '0'], /--grain-price 0: a price above 0/],
    [['analyze', 'a.csv', '--map', 'color=Red'], /"color" is not a role/],
    [
      ['analyze', 'a.csv', '--shortfall-tolerance', '-3'],
      /--shortfall-tolerance -3: an amount of 0 or more/,
    ],
    [['analyze', 'a.csv', '--map', 'yield'], /write role=Header/],
    [
      ['analyze', 'a.csv', '--site-charts', '2.5'],
      /--site-charts 2.5: the most sites .*0 for none/,
    ],
    [
      ['analyze', 'a.csv', '--product', 'water', '--product-price', '1'],
      /--product water: use one of urea/,
    ],
    [['analyze', 'a.csv', '--product', 'urea'], /--product and --product-price go together/],
    [['analyse', 'a.csv'], /Unknown command "analyse"/],
    [['demo', '--folder', 'x'], /Unknown option for demo: --folder/],
  ])('refuses %j', (argv, message) => {
    expect(() => parseArgs(argv)).toThrow(message);
  });

  it('reads --plot-area in m², or in the unit written after the number', () => {
    const area = (v: string) =>
      (parseArgs(['analyze', 'a.csv', '--plot-area', v]) as AnalyzeArgs).plotAreaM2;
    expect(area('55.7')).toBe(55.7);
    // 1 ft = 0.3048 m exactly (NIST SP 811, appendix B): 600 ft² = 55.741824 m².
    expect(area('600ft2')).toBeCloseTo(55.741824, 9);
    expect(area('600 ft²')).toBeCloseTo(55.741824, 9);
    expect(area('0.01ha')).toBeCloseTo(100, 9);
  });

  it('answers help and version', () => {
    expect(parseArgs([])).toEqual({ command: 'help' });
    expect(parseArgs(['analyze', '--help'])).toEqual({ command: 'help' });
    expect(parseArgs(['--version'])).toEqual({ command: 'version' });
    expect(parseArgs(['demo'])).toEqual({ command: 'demo', dir: 'plotrate-demo' });
  });
});
