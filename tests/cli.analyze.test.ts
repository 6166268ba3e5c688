// The real command line, run as a child process (node cli/plotrate.mjs) in a
// temporary folder: exit codes, one-line reasons that name the file or cell,
// inputs never written over, and the outputs read back by independent tools
// (SheetJS for the workbook, poppler's pdfinfo for the PDF, JSON.parse).
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from './support/runCli';
import * as XLSX from 'xlsx';
import { syntheticCsv } from '../shared/demo';
import { recommendationCautions } from '../shared/economics/recommendationCautions';

const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-cli-'));

const run = (args: string[]) => runCli(dir, args);

const sha = (file: string): string => createHash('sha256').update(readFileSync(file)).digest('hex');

beforeAll(() => {
  // Invented trial from the seeded generator: 3 sites × 24 plots, lb N/ac and bu/ac.
  writeFileSync(path.join(dir, 'trial.csv'), syntheticCsv({ sites: 3, seed: 5 }));
  writeFileSync(
    path.join(dir, 'badcell.csv'),
    'Site,Block,N rate (lb N/ac),Yield (bu/ac)\nA,1,0,120\nA,1,100,170\nA,2,0,abc\nA,2,100,175\n',
  );
  writeFileSync(
    path.join(dir, 'onerate.csv'),
    'Site,Block,N rate (lb N/ac),Yield (bu/ac)\nA,1,100,120\nA,2,100,170\nA,3,100,160\n',
  );
});

describe('plotrate --help', () => {
  it('lists the commands and options and carries the cautions', () => {
    const r = run(['--help']);
    expect(r.code).toBe(0);
    for (const o of [
      'analyze',
      'demo',
      '--out',
      '--pdf',
      '--json',
      '--crop',
      '--grain-price',
      '--nutrient-price',
      '--product',
      '--product-price',
      '--units',
      '--boot',
      '--seed',
      '--blocks',
      '--map',
    ]) {
      expect(r.out).toContain(o);
    }
    const flat = r.out.replace(/\s+/g, ' ');
    for (const c of recommendationCautions) expect(flat).toContain(c);
  });
});

describe('plotrate analyze: bad input', () => {
  it('exits 2 with one line for an unknown option', () => {
    const r = run(['analyze', 'trial.csv', '--color', 'red']);
    expect(r.code).toBe(2);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/Unknown option --color/);
  });

  it('exits 2 naming a file that does not exist', () => {
    const r = run(['analyze', 'missing.csv']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/Cannot read missing\.csv: does not exist/);
  });

  it('refuses an --out that is the input and leaves the input as it was', () => {
    const input = path.join(dir, 'trial.csv');
    const before = sha(input);
    const r = run(['analyze', 'trial.csv', '--json', './trial.csv']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--json \.\/trial\.csv is the input file "trial\.csv"/);
    expect(sha(input)).toBe(before);
  });

  it('exits 2 naming the file and listing its headers when --map names a header it lacks', () => {
    const r = run(['analyze', 'trial.csv', '--map', 'yield=Grain']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(
      /--map yield=Grain: no plot sheet in "trial\.csv" has a column headed "Grain"/,
    );
    expect(r.err).toContain('"Yield (bu/ac)"');
  });

  it('names the cell of a yield that is not a number', () => {
    const r = run([
      'analyze',
      'badcell.csv',
      '--grain-price',
      '4',
      '--nutrient-price',
      '0.5',
      '--boot',
      '0',
    ]);
    expect(r.err).toMatch(/badcell\.csv › D4 should hold the yield as a number but says "abc"/);
  });

  it('exits 1 when no site can be fitted', () => {
    const r = run(['analyze', 'onerate.csv', '--grain-price', '4', '--nutrient-price', '0.5']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/analysis failed: No site could be fitted: Only 1 distinct rate/);
  });

  it('exits 2 for conflicting price options', () => {
    const r = run([
      'analyze',
      'trial.csv',
      '--nutrient-price',
      '1',
      '--product',
      'urea',
      '--product-price',
      '0.3',
    ]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/either --nutrient-price or --product/);
  });
});

describe('plotrate analyze --plot-area', () => {
  it('stops on plot weights without an area, naming the option, and reads them with it', () => {
    // Plot weights in kg from 10 m² plots: w kg is w × 1,000 kg/ha (10,000 m²/ha ÷ 10 m²),
    // so a weight of 6 + 0.03·min(N, 120) kg is that many t/ha.
    const rows = ['Site,Block,N rate (kg N/ha),Plot wt (kg)'];
    for (let b = 1; b <= 3; b++) {
      for (const x of [0, 50, 100, 150, 200])
        rows.push(`Ash Mere,${b},${x},${(6 + 0.03 * Math.min(x, 120) + 0.05 * b).toFixed(2)}`);
    }
    writeFileSync(path.join(dir, 'weights.csv'), `${rows.join('\n')}\n`);
    const args = ['analyze', 'weights.csv', '--boot', '0', '--units', 'metric'];
    const plain = run(args);
    expect(plain.code).toBe(2);
    expect(plain.err).toMatch(/gives plot weights \(column D\) but no plot area.*--plot-area/);
    const given = run([...args, '--plot-area', '10', '--json', 'weights.json']);
    expect(given.code, given.err).toBe(0);
    // Before fitting, the run says which columns the rates and yields come from and how.
    expect(given.err).toContain(
      'rate from "N rate (kg N/ha)" (kg/ha of N); plot weight from "Plot wt (kg)" (kg taken as at 15.5 % moisture, with no moisture column); --map gives a column another role',
    );
    const j = JSON.parse(readFileSync(path.join(dir, 'weights.json'), 'utf8'));
    const lp = j.sites[0].models.find((m: { model: string }) => m.model === 'linearPlateau');
    expect(j.settings.units.yield).toBe('t/ha');
    expect(lp.params.b).toBeCloseTo(0.03, 6);
  });
});

describe('plotrate analyze --yield-moisture', () => {
  it('says the yields were adjusted from harvest moisture, and takes them as they are when told', () => {
    // Invented: corn yields in t/ha with a harvest moisture of 20 % on every plot. Adjusting to
    // corn's 15.5 % keeps the dry matter: yield × (100 − 20) / (100 − 15.5) (common practice), so
    // every fitted level scales by 80 / 84.5 and the linear-plateau's slope with it.
    const rows = ['Site,Block,N rate (kg N/ha),Yield (t/ha),Moisture (%)'];
    for (let b = 1; b <= 3; b++) {
      for (const x of [0, 50, 100, 150, 200])
        rows.push(`Ash Mere,${b},${x},${(7 + 0.03 * Math.min(x, 120) + 0.05 * b).toFixed(2)},20`);
    }
    writeFileSync(path.join(dir, 'moist.csv'), `${rows.join('\n')}\n`);
    const args = ['analyze', 'moist.csv', '--boot', '0', '--units', 'metric', '--crop', 'corn'];
    const wet = run([...args, '--json', 'wet.json']);
    expect(wet.code, wet.err).toBe(0);
    expect(wet.err).toContain(
      'yield from "Yield (t/ha)" (t/ha at harvest moisture, adjusted to 15.5 % moisture with "Moisture (%)"); --map gives a column another role, --yield-moisture standard says the yields are already at standard moisture',
    );
    const dry = run([...args, '--yield-moisture', 'standard', '--json', 'dry.json']);
    expect(dry.code, dry.err).toBe(0);
    expect(dry.err).toContain('yield from "Yield (t/ha)" (t/ha at standard moisture, 15.5 %);');
    const slope = (file: string) =>
      JSON.parse(readFileSync(path.join(dir, file), 'utf8')).sites[0].models.find(
        (m: { model: string }) => m.model === 'linearPlateau',
      ).params.b;
    expect(slope('dry.json')).toBeCloseTo(0.03, 6);
    expect(slope('wet.json') / slope('dry.json')).toBeCloseTo(80 / 84.5, 9);
  });
});

describe('plotrate analyze, a site with no rate replicated', () => {
  it('prints no rate for it, says why in a word, and still analyses the replicated site', () => {
    // Invented: one plot per rate at Lone Strip; Ash Mere has three blocks.
    const rows = ['Site,Block,N rate (kg N/ha),Yield (t/ha)'];
    for (const x of [0, 40, 80, 120, 160, 200])
      rows.push(`Lone Strip,1,${x},${(9 + 0.025 * Math.min(x, 120)).toFixed(2)}`);
    for (let b = 1; b <= 3; b++)
      for (const x of [0, 50, 100, 150, 200])
        rows.push(`Ash Mere,${b},${x},${(7 + 0.03 * Math.min(x, 120) + 0.05 * b).toFixed(2)}`);
    writeFileSync(path.join(dir, 'lone.csv'), `${rows.join('\n')}\n`);
    const r = run(['analyze', 'lone.csv', '--boot', '0', '--units', 'metric']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toContain(
      'Lone Strip: no rate recommended: the site has no replicated rate (see the report)',
    );
    expect(r.out).toMatch(/Ash Mere: [^\n]+, optimum \d+ kg N\/ha/);
  });
});

describe('plotrate analyze, a trial whose yields still rise at its highest rate', () => {
  it('says the optimum is at or above that rate, not that it is there', () => {
    // Invented: a check and one rate, the rate paying well. Two rates cannot place an optimum
    // (common practice: an optimum at the top of the tested range is not located).
    const rows = ['Site,Block,N rate (kg N/ha),Grain (t/ha)'];
    for (let b = 1; b <= 4; b++)
      rows.push(`Fenwick Hill,${b},0,${3 + 0.1 * b}`, `Fenwick Hill,${b},150,${5 + 0.1 * b}`);
    writeFileSync(path.join(dir, 'two-rates.csv'), `${rows.join('\n')}\n`);
    const r = run(['analyze', 'two-rates.csv', '--boot', '20', '--json', 'two-rates.json']);
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(
      /Fenwick Hill: .*optimum at or above the highest tested rate, 150 kg N\/ha/,
    );
    const j = JSON.parse(readFileSync(path.join(dir, 'two-rates.json'), 'utf8'));
    expect(j.sites[0].recommendation.basis).toBe('no-plateau');
    expect(j.sites[0].warnings.join(' ')).toMatch(/did not test high enough/);
  });
});

describe('plotrate analyze, rates of a product the sheet names without its grade', () => {
  it('asks which product instead of guessing, and --product answers', () => {
    // Invented: UAN rates in lb of product per acre; UAN is 28 or 32 % N (common practice).
    const rows = ['Site,Block,UAN (lb/ac),Yield (bu/ac)'];
    for (let b = 1; b <= 3; b++)
      for (const x of [0, 150, 300, 450])
        rows.push(`Orrin Bend,${b},${x},${150 + 0.1 * Math.min(x, 300) + b}`);
    writeFileSync(path.join(dir, 'uan.csv'), `${rows.join('\n')}\n`);
    const asked = run(['analyze', 'uan.csv', '--boot', '0']);
    expect(asked.code).toBe(2);
    expect(asked.err).toMatch(
      /is a rate of product, but no product is named.*--product with --product-price/,
    );
    const given = run([
      'analyze',
      'uan.csv',
      '--boot',
      '0',
      '--product',
      'uan32',
      '--product-price',
      '0.3',
      '--json',
      'uan.json',
    ]);
    expect(given.code, given.err).toBe(0);
    expect(given.err).toContain('rate from "UAN (lb/ac)" (lb/ac of product: UAN 32 %)');
    // 450 lb/ac of UAN 32 % is 144 lb N/ac: the highest tested rate in the results' lb/ac.
    const j = JSON.parse(readFileSync(path.join(dir, 'uan.json'), 'utf8'));
    const optimum = j.sites[0].recommendation.rate;
    expect(optimum).toBeLessThanOrEqual(144 + 1e-6);
  });
});

describe('plotrate analyze --map', () => {
  it('fails without the mapping and succeeds when --map names the rate, site and block columns', () => {
    // Headers the detector cannot read as a rate, a site or a block.
    const rows = ['Field,Rep,Amount,Harvest (t/ha)'];
    for (let b = 1; b <= 3; b++) {
      for (const x of [0, 50, 100, 150, 200])
        rows.push(`Elm Hollow,${b},${x},${(6 + 0.03 * Math.min(x, 120) + 0.05 * b).toFixed(2)}`);
    }
    writeFileSync(path.join(dir, 'map.csv'), `${rows.join('\n')}\n`);
    const priced = [
      'analyze',
      'map.csv',
      '--boot',
      '0',
      '--grain-price',
      '200',
      '--nutrient-price',
      '1.2',
    ];
    const plain = run(priced);
    expect(plain.code).toBe(2);
    expect(plain.err).toMatch(/"map\.csv" has no rate column/);
    // The columns nothing reads are listed, so the user sees which to map.
    expect(plain.err).toMatch(/map the rate column \(not read: [A-D] "[^"]+"(, [A-D] "[^"]+")*\)/);
    expect(plain.err).toContain('"Amount"');
    const mapped = run([
      ...priced,
      '--map',
      'rate=Amount',
      'site=Field',
      'block=Rep',
      '--blocks',
      'fixed',
      '--json',
      'map.json',
    ]);
    expect(mapped.code, mapped.err).toBe(0);
    const j = JSON.parse(readFileSync(path.join(dir, 'map.json'), 'utf8'));
    expect(j.settings.blocks).toBe('fixed');
    expect(j.sites.map((x: { site: string }) => x.site)).toEqual(['Elm Hollow']);
    expect(j.sites[0].n).toBe(15);
    // The generating line rises 0.03 t/ha per kg N up to 120 kg/ha: the linear-plateau's join is found there.
    const lp = j.sites[0].models.find((m: { model: string }) => m.model === 'linearPlateau');
    expect(lp.params.x0).toBeGreaterThan(100);
    expect(lp.params.x0).toBeLessThanOrEqual(150);
    expect(lp.params.b).toBeCloseTo(0.03, 6);
  });
});

describe('plotrate analyze: a run with every output', () => {
  let r: ReturnType<typeof run>;
  beforeAll(() => {
    r = run([
      'analyze',
      'trial.csv',
      '--out',
      'report.xlsx',
      '--pdf',
      'rec.pdf',
      '--json',
      'results.json',
      '--units',
      'metric',
      '--grain-price',
      '180',
      '--nutrient-price',
      '1.2',
      '--boot',
      '30',
      '--seed',
      '3',
      '--shortfall-tolerance',
      '20',
    ]);
  });

  it('exits 0, prints a summary and reports progress on stderr', () => {
    expect(r.code, r.err).toBe(0);
    expect(r.out).toMatch(/Site 0001: .*optimum \d+ kg N\/ha/);
    expect(r.out).toMatch(/Across 3 sites:/);
    // The summary's rates go out with the cautions (shared/economics/recommendationCautions.ts).
    expect(r.out).toMatch(
      /Before acting on any rate:\n- This rate comes from these trials[^]*\n- Defer to a licensed or certified agronomist/,
    );
    expect(r.err).toMatch(/plotrate: 72 plots at 3 sites/);
    expect(r.err).toMatch(/writing report\.xlsx/);
  });

  it('writes results JSON in the units asked for', () => {
    const j = JSON.parse(readFileSync(path.join(dir, 'results.json'), 'utf8'));
    expect(j.tool.name).toBe('Plotrate');
    expect(j.settings.units).toEqual({ rate: 'kg/ha', yield: 't/ha' });
    expect(j.settings.boot).toBe(30);
    expect(j.settings.seed).toBe(3);
    // 1.2 per kg N over 180 per t (0.18 per kg): 6.667 kg grain per kg N.
    expect(j.settings.priceRatio).toBeCloseTo(1.2 / 0.18, 10);
    expect(j.settings.priceRatioUnit).toBe('kg/kg N');
    expect(j.sites).toHaveLength(3);
    expect(j.acrossSites.profitableRange[0]).toBeLessThanOrEqual(j.acrossSites.bestRate);
    // The tolerance as given, per hectare with metric units, in every risk table.
    expect(j.settings.shortfallTolerance).toBe(20);
    expect(j.settings.shortfallToleranceDefault).toBe(false);
    expect(j.sites[0].shortfallRisk.tolerance).toBe(20);
    expect(j.acrossSites.shortfallRisk.tolerance).toBe(20);
  });

  it('writes a workbook SheetJS can read, with one sheet per site', () => {
    const wb = XLSX.read(readFileSync(path.join(dir, 'report.xlsx')));
    expect(wb.SheetNames).toEqual([
      'Overview',
      'Site 0001',
      'Site 0002',
      'Site 0003',
      'Across sites',
      'Regional model',
      'Economics',
      'Price ratio and risk',
      'Recommendations',
      'Provenance',
    ]);
    const csv = XLSX.utils.sheet_to_csv(wb.Sheets['Provenance']);
    expect(csv).toContain(sha(path.join(dir, 'trial.csv')));
  });

  it('writes an A4 PDF with one page per site and one for the region', () => {
    const info = spawnSync('/usr/bin/pdfinfo', [path.join(dir, 'rec.pdf')], {
      encoding: 'utf8',
    }).stdout;
    expect(info).toMatch(/Pages:\s+4\n/);
    expect(info).toMatch(/Page size:\s+595\.2\d+ x 841\.8\d+ pts \(A4\)/);
  });

  it('leaves no partial files behind', () => {
    // The atomic writer's temporaries (electron/atomicWrite.ts): .NAME.PID-HEX.tmp.
    expect(readdirSync(dir).filter((f) => f.endsWith('.tmp') || f.endsWith('.part'))).toEqual([]);
  });
});

describe('plotrate analyze --threads', () => {
  it('gives the same results drawn on one thread and on three', () => {
    const results = ['1', '3'].map((threads) => {
      const json = `threads-${threads}.json`;
      const r = run(['analyze', 'trial.csv', '--boot', '25', '--threads', threads, '--json', json]);
      expect(r.code, r.err).toBe(0);
      if (threads === '3') expect(r.err).toContain('drawing the resamples on 3 threads');
      else expect(r.err).not.toContain('drawing the resamples');
      const j = JSON.parse(readFileSync(path.join(dir, json), 'utf8'));
      return { sites: j.sites, acrossSites: j.acrossSites };
    });
    // Every site has its interval from the resamples, and the two runs agree to the last digit.
    expect(
      results[1].sites.every((s: { optimumCIBootstrap: unknown }) => s.optimumCIBootstrap),
    ).toBe(true);
    expect(results[1]).toEqual(results[0]);
  });
});

describe('plotrate demo', () => {
  it('writes the demo workbook and its reports', () => {
    const r = run(['demo', '--dir', 'demo-out']);
    expect(r.code, r.err).toBe(0);
    for (const f of [
      'wrenhollow-n-trials-2025.xlsx',
      'demo-corn-report.xlsx',
      'demo-corn-recommendation.pdf',
      'demo-corn-results.json',
      'demo-wheat-report.xlsx',
      'wrenhollow-timing-2025.csv',
      'demo-timing-report.xlsx',
      'demo-timing-recommendation.pdf',
      'demo-timing-results.json',
    ]) {
      expect(existsSync(path.join(dir, 'demo-out', f)), f).toBe(true);
    }
    const j = JSON.parse(
      readFileSync(path.join(dir, 'demo-out', 'demo-corn-results.json'), 'utf8'),
    );
    expect(j.settings.units).toEqual({ rate: 'lb/ac', yield: 'bu/ac' });
    expect(j.sites).toHaveLength(6);
    expect(r.out).toContain('Demo prices (grain and urea) are illustrative');
    // The rate × timing set: the Timing column found as the factor, a curve per timing.
    const t = JSON.parse(
      readFileSync(path.join(dir, 'demo-out', 'demo-timing-results.json'), 'utf8'),
    );
    expect(t.sites.map((s: { site: string }) => s.site)).toEqual([
      'Larkspur Bottom',
      'Fennimore Rise',
    ]);
    for (const s of t.sites) {
      expect(s.levels.map((l: { level: string }) => l.level)).toEqual([
        'At planting',
        'Split (V6)',
      ]);
      expect(s.levelTest.factor).toBe('Timing');
    }
    expect(r.out).toMatch(/ {2}Timing Split \(V6\): /);
  });

  it("prints the demo's grower pages with the rate in urea and N, one page per site, the region and each group", () => {
    for (const [name, pages, product, ratio] of [
      // Urea at 520 per short ton (0.26/lb) over 4.50/bu: 0.26 / 0.46 / 4.5 = 0.1256 bu/lb N; at
      // 0.5732/kg over 220/t: 0.5732 / 0.46 / 0.22 = 5.664 kg/kg N (shared/economics/illustrativePrices).
      // Corn: six sites, the region, and a page per previous crop (corn, soybean).
      ['corn', 9, /≈ [\d,]+ lb\/ac of Urea 46-0-0/, /0\.126 bu\/lb N/],
      ['wheat', 3, /≈ [\d,]+ kg\/ha of Urea 46-0-0/, /5\.66 kg\/kg N/],
    ] as const) {
      const pdf = path.join(dir, 'demo-out', `demo-${name}-recommendation.pdf`);
      const info = spawnSync('/usr/bin/pdfinfo', [pdf], { encoding: 'utf8' }).stdout;
      expect(info).toMatch(new RegExp(`Pages:\\s+${pages}\\n`));
      // The charts are drawn as vectors, so the document holds no picture at all (poppler's
      // pdfimages lists none) and each page's chart is found by its labels below.
      const images = spawnSync('/usr/bin/pdfimages', ['-list', pdf], { encoding: 'utf8' })
        .stdout.split('\n')
        .slice(2)
        .filter((l) => l.trim() !== '');
      expect(images).toEqual([]);
      for (let page = 1; page <= pages; page++) {
        const text = spawnSync(
          '/usr/bin/pdftotext',
          ['-f', String(page), '-l', String(page), '-layout', pdf, '-'],
          { encoding: 'utf8' },
        ).stdout.replace(/\s+/g, ' ');
        // A page that advises no N has no product amount; every other page gives both.
        if (text.includes('Apply no N')) expect(text).not.toMatch(product);
        else expect(text).toMatch(product);
        expect(text).toMatch(ratio);
        // Every page carries its chart (a group's page its own regional chart): its rate axis.
        expect(text).toMatch(/N rate \((lb N\/ac|kg N\/ha)\)/);
        expect(text).toContain('Demo prices (grain and urea) are illustrative');
        // The cautions end each page: nothing spilled onto a next one.
        expect(text).toContain('Defer to a licensed or certified agronomist');
      }
    }
  });
});
