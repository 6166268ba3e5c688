// Hostile and malformed inputs against the real command line, each in a child process with V8's
// heap capped at 1 GiB and its peak memory measured (tests/support/runCliCapped.ts): every case
// ends with the exit code the README promises (0 done, 2 bad input or usage naming the file,
// sheet and cell), its reason on one line of stderr (the last; the lines before are progress,
// each "plotrate: …"), no stack trace, and under 1 GiB. Every file is generated here into a
// temporary folder, from the seeded generator (invented sites) or byte by byte; nothing large is
// committed. Wall time is not asserted (speed belongs to `npm run bench`); the cases run two at
// a time. The bounds behind "impossible" yields and rates are shared/table/plotTable.ts's
// impossibleValue (common practice, stated there).
import { spawnSync } from 'node:child_process';
import {
  closeSync,
  ftruncateSync,
  mkdirSync,
  mkdtempSync,
  openSync,
  readFileSync,
  rmSync,
  symlinkSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import { strToU8, zipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { syntheticCsv, syntheticRows } from '../shared/demo';
import { minimalXlsx, xlsxRow } from './fixtures/import/minimalXlsx';
import { zipBombXlsx } from './fixtures/import/zipBomb';
import { runCliCapped, type CappedRun } from './support/runCliCapped';

const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-hostile-'));
const MiB = 1024 * 1024;
/** The memory budget of every run: 1 GiB, in KiB as GNU time reports it. */
const BUDGET_KIB = 1024 * 1024;

// ---------------------------------------------------------------------------------------------
// Inputs, built in the test

/** The seeded generator's two-site trial (48 plots) as CSV text. */
const trialCsv = () => syntheticCsv({ sites: 2, seed: 11 });

/** The trial with one column's values rewritten (5 = N rate, 6 = yield; 1-based). */
function rewritten(column: number, change: (value: string, row: number) => string): string {
  return trialCsv()
    .split('\n')
    .map((line, row) => {
      if (row === 0 || line === '') return line;
      const cells = line.split(',');
      cells[column - 1] = change(cells[column - 1], row);
      return cells.join(',');
    })
    .join('\n');
}

/** The trial as sheet rows: header, then site, block, rate, yield per plot. */
function trialRows(
  cell: (
    rateLbAc: number,
    yieldBuAc: number,
    row: number,
  ) => [string | number | Date, string | number],
): string {
  const rows = [xlsxRow(1, ['Site', 'Block', 'N rate (lb N/ac)', 'Yield (bu/ac)'])];
  syntheticRows({ sites: 1, seed: 5 }).forEach((p, i) =>
    rows.push(xlsxRow(i + 2, [p.site, p.block, ...cell(p.rateLbAc, p.yieldBuAc, i + 2)])),
  );
  return rows.join('');
}

/** A sheet whose cells are written as raw XML, with the trial's first rows beside them. */
const withTrial = (more: string) => trialRows((r, y) => [r, y]) + more;

function utf16(text: string, bigEndian: boolean): Uint8Array {
  const out = new Uint8Array(2 + text.length * 2);
  out.set(bigEndian ? [0xfe, 0xff] : [0xff, 0xfe]);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    out[2 + 2 * i + (bigEndian ? 0 : 1)] = c >> 8;
    out[2 + 2 * i + (bigEndian ? 1 : 0)] = c & 0xff;
  }
  return out;
}

/** Windows-1252 bytes of text whose characters all lie in Latin-1 (é is 0xE9 in both). */
const latin1 = (text: string) => Uint8Array.from(text, (c) => c.charCodeAt(0));

const bytes = (n: number, f: (i: number) => number) =>
  Uint8Array.from({ length: n }, (_, i) => f(i));

const files: Record<string, () => Uint8Array | string> = {
  'trial.csv': trialCsv,
  'empty.csv': () => '',
  'blank.csv': () => ' \n\t\r\n  \n',
  'header-only.csv': () => trialCsv().split('\n')[0] + '\n',
  'junk.csv': () => bytes(4096, (i) => (i * 97 + 13) % 256),
  'junk.xlsx': () => bytes(4096, (i) => (i * 31 + 7) % 256),
  'pdf.xlsx': () => '%PDF-1.7\n%âãÏÓ\n1 0 obj\n<<>>\nendobj\n',
  'nul.csv': () => trialCsv().replace(/,/g, ',\0'),
  'giant-line.csv': () => '1,'.repeat(4 * MiB),
  'giant-cell.csv': () => 'x'.repeat(8 * MiB),
  'many-columns.csv': () =>
    Array.from({ length: 1100 }, (_, i) => `Column ${i + 1}`).join(',') + '\n' + trialCsv(),
  'mib-cell.csv': () => trialCsv().replace('Site 0001,', `Site 0001 ${'x'.repeat(MiB)},`),
  'mib-header.csv': () => `"${'Yield '.repeat(MiB / 6)}",` + trialCsv(),
  'open-quote.csv': () => trialCsv().replace('Site 0002', '"Site 0002') + '9,9\n'.repeat(20_000),
  'too-many-rows.csv': () => 'Plot,Yield (bu/ac)\n' + '1,150\n'.repeat(250_001),
  'too-many-cells.csv': () =>
    'Plot,Yield (bu/ac),' +
    Array.from({ length: 19 }, (_, i) => `c${i}`).join(',') +
    '\n' +
    `1,150${',1'.repeat(19)}\n`.repeat(100_000),
  'utf16le.csv': () => utf16(trialCsv().replace(/Site /g, 'Clos Ébène '), false),
  'utf16be.csv': () => utf16(trialCsv().replace(/Site /g, 'Clos Ébène '), true),
  'bom.csv': () => '\ufeff' + trialCsv(),
  'latin1.csv': () => latin1(trialCsv().replace(/Site /g, 'Château Rivière ')),
  'utf16-no-bom.csv': () => utf16(trialCsv(), false).subarray(2),
  'cr-only.csv': () => trialCsv().replace(/\n/g, '\r'),
  'semicolon-comma.csv': () =>
    trialCsv()
      .split('\n')
      .map((l) => l.replace(/(\d),(?=\d)/g, '$1;').replace(/(\d)\.(\d)/g, '$1,$2'))
      .join('\n')
      .replace(/","/g, '";"'),
  'formula-text.csv': () => trialCsv().replace(/Site 0001/g, '"=HYPERLINK(""http://x"",""y"")"'),
  'negative-yields.csv': () => rewritten(6, (v) => `-${v}`),
  'one-negative-yield.csv': () => rewritten(6, (v, row) => (row === 3 ? `-${v}` : v)),
  'nan-yields.csv': () => rewritten(6, () => 'NaN'),
  'infinite-yields.csv': () => rewritten(6, () => 'Infinity'),
  'huge-yields.csv': () => rewritten(6, (v) => `${v}e300`),
  'huge-rates.csv': () => rewritten(5, (v) => `${v}e300`),
  'negative-rates.csv': () => rewritten(5, (v) => (v === '0' ? '0' : `-${v}`)),
  'text-rates.csv': () => rewritten(5, (v) => (Number(v) > 100 ? 'high' : 'low')),
  'duplicate-headers.csv': () =>
    trialCsv()
      .split('\n')
      .map((l, i) => (l === '' ? l : `${l},${i === 0 ? '"Yield (bu/ac)"' : '1'}`))
      .join('\n'),
  'no-rate-or-yield.csv': () => rewritten(5, () => '').replace(/,[\d.]+,([\d.]+)$/gm, ',,$1'),
  'one-plot.csv': () => trialCsv().split('\n').slice(0, 2).join('\n'),
  'equal-yields.csv': () => rewritten(6, () => '150'),
  '-dash.csv': trialCsv,
  'dates-as-rates.xlsx': () =>
    minimalXlsx({
      sheetData: trialRows((r, y) => [new Date(Date.UTC(2024, 0, 1 + r)), y]),
    }),
  'formulas.xlsx': () =>
    minimalXlsx({
      sheetData: trialRows((r, y) => [r, y]).replace(
        /<c r="(D\d+)"><v>([\d.]+)<\/v><\/c>/g,
        '<c r="$1"><f>$2*1</f></c>',
      ),
    }),
  'trial.xlsx': () => minimalXlsx({ sheetData: trialRows((r, y) => [r, y]) }),
  'xfd.xlsx': () =>
    minimalXlsx({
      sheetData: Array.from(
        { length: 20_000 },
        (_, i) => `<row r="${i + 1}"><c r="XFD${i + 1}"><v>1</v></c></row>`,
      ).join(''),
    }),
  'declared-range.xlsx': () =>
    minimalXlsx({ sheetData: trialRows((r, y) => [r, y]), dimension: 'A1:XFD1048576' }),
  'last-row.xlsx': () =>
    minimalXlsx({ sheetData: withTrial('<row r="1048576"><c r="A1048576"><v>1</v></c></row>') }),
  'mib-string.xlsx': () =>
    minimalXlsx({
      sheetData: withTrial('<row r="40"><c r="A40" t="s"><v>0</v></c></row>'),
      strings: `<si><t>${'n'.repeat(MiB)}</t></si>`,
    }),
  'xml-bomb.xlsx': () =>
    minimalXlsx({
      prolog: `<?xml version="1.0"?><!DOCTYPE lolz [<!ENTITY lol "lol">${Array.from(
        { length: 9 },
        (_, i) => `<!ENTITY lol${i + 1} "${`&lol${i || ''};`.repeat(10)}">`,
      ).join('')}]>`,
      sheetData: trialRows((r, y) => [r, y]).replace('<t>Site</t>', '<t>&lol9;</t>'),
    }),
  'zip-bomb.xlsx': () => zipBombXlsx(1024 * MiB, true),
  'zip-bomb-liar.xlsx': () => zipBombXlsx(1024 * MiB, false),
  'bad-crc.xlsx': () => {
    const b = minimalXlsx({ sheetData: trialRows((r, y) => [r, y]) });
    // PKWARE APPNOTE 4.3.12: the worksheet's central directory header (signature 0x02014b50,
    // its name at offset 46) holds the part's CRC-32 at offset 16.
    const name = new TextEncoder().encode('xl/worksheets/sheet1.xml');
    for (let i = b.length - 46; i >= 0; i--) {
      if (b[i] === 0x50 && b[i + 1] === 0x4b && b[i + 2] === 1 && b[i + 3] === 2) {
        if (name.every((c, k) => b[i + 46 + k] === c)) {
          b[i + 16] ^= 0xff;
          break;
        }
      }
    }
    return b;
  },
  'cut.xlsx': () => minimalXlsx({ sheetData: trialRows((r, y) => [r, y]) }).subarray(0, 700),
  'many-parts.xlsx': () =>
    zipSync({
      '[Content_Types].xml': strToU8('<Types/>'),
      'xl/workbook.xml': strToU8('<workbook><sheets/></workbook>'),
      ...Object.fromEntries(
        Array.from({ length: 2498 }, (_, i) => [`xl/p${i}.xml`, strToU8('<a/>')]),
      ),
    }),
  'ole2.xlsx': () =>
    Uint8Array.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, ...new Uint8Array(1024)]),
  'no-sheets.xlsx': () => zipSync({ 'xl/workbook.xml': strToU8('<workbook><sheets/></workbook>') }),
};

beforeAll(() => {
  for (const [name, make] of Object.entries(files)) writeFileSync(path.join(dir, name), make());
  spawnSync('mkfifo', [path.join(dir, 'pipe.csv')]);
  symlinkSync(path.join(dir, 'loop-b.csv'), path.join(dir, 'loop-a.csv'));
  symlinkSync(path.join(dir, 'loop-a.csv'), path.join(dir, 'loop-b.csv'));
  mkdirSync(path.join(dir, 'folder.csv'));
  // A sparse file past the 64 MiB cap: no disk is used, and it must be refused by its size.
  const fd = openSync(path.join(dir, 'sparse.csv'), 'w');
  ftruncateSync(fd, 65 * MiB);
  closeSync(fd);
});

afterAll(() => rmSync(dir, { recursive: true, force: true }));

// ---------------------------------------------------------------------------------------------
// The cases

interface HostileCase {
  /** What the input is. */
  name: string;
  /** The words after `plotrate`. */
  args: string[];
  code: 0 | 1 | 2;
  /** For exit 1 or 2: the reason, the last line of stderr. */
  reason?: RegExp;
  /** Anything more to check of the run. */
  check?: (r: CappedRun) => void | Promise<void>;
}

/** `analyze FILE --boot 0 --json FILE.json`: no resampling, the inputs are what is tested. */
const analyze = (file: string, ...more: string[]) => [
  'analyze',
  file,
  '--boot',
  '0',
  '--json',
  `${path.basename(file)}.json`,
  ...more,
];

const refused = (name: string, file: string, reason: RegExp): HostileCase => ({
  name,
  args: analyze(file),
  code: 2,
  reason,
});
const analyzed = (name: string, file: string, check?: HostileCase['check']): HostileCase => ({
  name,
  args: analyze(file),
  code: 0,
  check,
});

/** The results file of a run, parsed. */
const results = (file: string) =>
  JSON.parse(readFileSync(path.join(dir, `${file}.json`), 'utf8')) as {
    sites: { site: string; n: number }[];
  };

const cases: HostileCase[] = [
  analyzed('a valid trial (the baseline)', 'trial.csv', () =>
    expect(results('trial.csv').sites).toHaveLength(2),
  ),
  analyzed('a valid one-sheet workbook written part by part', 'trial.xlsx'),
  refused('an empty file', 'empty.csv', /empty\.csv" is empty \(0 bytes\)/),
  refused('only blanks and line breaks', 'blank.csv', /blank\.csv" holds no text/),
  refused('a header and no plots', 'header-only.csv', /header-only\.csv.*no plot|No plot rows/i),
  refused('junk bytes named .csv', 'junk.csv', /junk\.csv/),
  refused('junk bytes named .xlsx', 'junk.xlsx', /junk\.xlsx/),
  refused('a PDF named .xlsx', 'pdf.xlsx', /pdf\.xlsx" is a PDF/),
  refused('NUL bytes between fields', 'nul.csv', /nul\.csv/),
  refused(
    'one giant line (8 MiB, no line break)',
    'giant-line.csv',
    /giant-line\.csv" has a field at AMK1, beyond the 1,024 columns/,
  ),
  refused(
    'one giant cell (8 MiB)',
    'giant-cell.csv',
    /giant-cell\.csv": cell A1 holds more than 32,767 characters/,
  ),
  refused('1,100 columns', 'many-columns.csv', /many-columns\.csv" has a field at AMK1/),
  refused('a 1 MiB cell', 'mib-cell.csv', /mib-cell\.csv": cell A\d+ holds more than 32,767/),
  refused(
    'a 1 MiB quoted header cell',
    'mib-header.csv',
    /mib-header\.csv": cell A1 .*stray double quote/,
  ),
  refused(
    'a quote never closed',
    'open-quote.csv',
    /open-quote\.csv": cell A\d+ .*stray double quote/,
  ),
  refused('250,001 rows', 'too-many-rows.csv', /more than 250,000 rows/),
  refused(
    'over 2,000,000 filled cells',
    'too-many-cells.csv',
    /too-many-cells\.csv" holds more than 2,000,000 filled cells \(passed at [A-Z]+\d+\)/,
  ),
  refused('a file past the 64 MiB cap (sparse)', 'sparse.csv', /sparse\.csv.*65 MiB.*64 MiB/),
  analyzed('UTF-16 LE with a BOM', 'utf16le.csv', () =>
    expect(results('utf16le.csv').sites[0].site).toBe('Clos Ébène 0001'),
  ),
  analyzed('UTF-16 BE with a BOM', 'utf16be.csv', () =>
    expect(results('utf16be.csv').sites[0].site).toBe('Clos Ébène 0001'),
  ),
  analyzed('UTF-8 with a BOM', 'bom.csv'),
  analyzed('Windows-1252 (Latin-1) text', 'latin1.csv', () =>
    expect(results('latin1.csv').sites[0].site).toBe('Château Rivière 0001'),
  ),
  refused('UTF-16 without a BOM', 'utf16-no-bom.csv', /utf16-no-bom\.csv/),
  analyzed('old Mac line ends (CR only)', 'cr-only.csv'),
  analyzed('semicolons and decimal commas', 'semicolon-comma.csv'),
  analyzed('a formula-like site name stays plain text', 'formula-text.csv', () =>
    expect(results('formula-text.csv').sites[0].site).toBe('=HYPERLINK("http://x","y")'),
  ),
  refused(
    'all yields negative',
    'negative-yields.csv',
    /negative-yields\.csv › F\d+: the yield is negative/,
  ),
  analyzed('one negative yield: that plot left out', 'one-negative-yield.csv', (r) => {
    expect(r.err).toMatch(
      /one-negative-yield\.csv › F4: the yield is negative .* left out of the fits/,
    );
    // Both generated sites have 24 plots; the first loses the one with the negative yield.
    expect(results('one-negative-yield.csv').sites.map((s) => s.n)).toEqual([23, 24]);
  }),
  refused('all yields NaN', 'nan-yields.csv', /nan-yields\.csv/),
  refused('all yields Infinity', 'infinite-yields.csv', /infinite-yields\.csv/),
  refused('all yields 1e300', 'huge-yields.csv', /huge-yields\.csv › F\d+/),
  refused(
    'all rates 1e300',
    'huge-rates.csv',
    /huge-rates\.csv › E\d+: the rate is beyond any practice/,
  ),
  refused('negative rates', 'negative-rates.csv', /negative-rates\.csv › E\d+/),
  refused(
    'no plot with both a rate and a yield',
    'no-rate-or-yield.csv',
    /no plot in "no-rate-or-yield\.csv" has both a rate and a yield/,
  ),
  refused('rates written as words', 'text-rates.csv', /text-rates\.csv/),
  refused('dates where rates belong', 'dates-as-rates.xlsx', /dates-as-rates\.xlsx › Plots › C2/),
  refused(
    'formulas saved without a calculated result',
    'formulas.xlsx',
    /formulas\.xlsx › Plots D2 .* is a formula .* without a calculated result/,
  ),
  // The first yield column is read (the second, all 1s, is left for the user to choose), so
  // the results are the baseline's to the last digit.
  analyzed('a duplicated yield header', 'duplicate-headers.csv', async (r) => {
    const baseline = await runCliCapped(dir, ['analyze', 'trial.csv', '--boot', '0']);
    // The first column is read, and the second is named as set aside (buildPlotTable).
    const note =
      /^Note: .*column H "Yield \(bu\/ac\)" also looks like a yield and is not used.*\n/m;
    expect(r.out).toMatch(note);
    expect(r.out.replace(note, '')).toBe(baseline.out);
  }),
  {
    // A valid file that cannot be analysed: exit 1, as the README promises, never a rate.
    name: 'a single plot',
    args: analyze('one-plot.csv'),
    code: 1,
    reason: /^plotrate: analysis failed: .*Only 1 distinct rate/,
  },
  analyzed('every yield equal', 'equal-yields.csv'),
  refused(
    'a cell in column XFD on 20,000 rows',
    'xfd.xlsx',
    /xfd\.xlsx › Plots › XFD1|XFD1, beyond the 1,024 columns/,
  ),
  refused(
    'a declared range of the whole sheet',
    'declared-range.xlsx',
    /has 1,048,576 rows, more than the limit/,
  ),
  refused(
    'a cell on the last row of a sheet',
    'last-row.xlsx',
    /has 1,048,576 rows, more than the limit/,
  ),
  refused('a 1 MiB shared string', 'mib-string.xlsx', /cell A40 holds more than 32,767 characters/),
  // Entities are never expanded (the reader takes no DOCTYPE), so the bomb is inert text.
  analyzed('an XML entity bomb', 'xml-bomb.xlsx', (r) => {
    expect(readFileSync(path.join(dir, 'xml-bomb.xlsx.json'), 'utf8')).not.toMatch(/lollol/);
    expect(r.peakKiB ?? 0).toBeLessThan(256 * 1024);
  }),
  refused('a zip bomb declaring 1 GiB', 'zip-bomb.xlsx', /zip-bomb\.xlsx" declares 1(\.0)? GiB/),
  refused('a zip bomb whose sizes lie', 'zip-bomb-liar.xlsx', /zip-bomb-liar\.xlsx/),
  refused('a part whose CRC-32 is wrong', 'bad-crc.xlsx', /bad-crc\.xlsx/),
  refused(
    'a workbook cut short',
    'cut.xlsx',
    /cut\.xlsx" looks like an \.xlsx workbook but is damaged/,
  ),
  refused('2,500 zip parts', 'many-parts.xlsx', /holds 2,500 parts, more than the limit of 2,000/),
  refused('an OLE2 container named .xlsx', 'ole2.xlsx', /ole2\.xlsx/),
  refused('a zip with no worksheets', 'no-sheets.xlsx', /no-sheets\.xlsx/),
  refused('a pipe with no writer', 'pipe.csv', /pipe\.csv: is not a regular file/),
  refused('/dev/zero', '/dev/zero', /\/dev\/zero: is not a regular file/),
  refused('a folder', 'folder.csv', /folder\.csv: is a folder, not a file/),
  refused('a loop of symbolic links', 'loop-a.csv', /loop-a\.csv: is a loop of symbolic links/),
  refused('a file that does not exist', 'absent.csv', /absent\.csv: does not exist/),
  {
    name: 'a file named -dash.csv after --',
    args: ['analyze', '--boot', '0', '--json', 'dash.json', '--', '-dash.csv'],
    code: 0,
  },
  {
    name: 'a file named -dash.csv without --',
    args: ['analyze', '--boot', '0', '--json', 'dash2.json', '-dash.csv'],
    code: 2,
    reason: /-dash\.csv/,
  },
  {
    name: 'the results file is the input',
    args: ['analyze', 'trial.csv', '--boot', '0', '--json', 'trial.csv'],
    code: 2,
    reason: /trial\.csv/,
    check: () => expect(readFileSync(path.join(dir, 'trial.csv'), 'utf8')).toBe(trialCsv()),
  },
];

/** What every run must show, whatever the input: no crash, no stack, within the budget. */
function expectOrderly(r: CappedRun): void {
  expect(r.signal, r.err).toBeNull();
  expect(r.err).not.toMatch(
    /^\s+at |node:internal|FATAL ERROR|\b(Type|Range|Reference|Syntax)Error\b/m,
  );
  for (const line of r.err.trimEnd().split('\n').filter(Boolean))
    expect(line, 'every line of stderr is the command speaking').toMatch(/^plotrate: /);
  if (r.peakKiB !== null) expect(r.peakKiB).toBeLessThan(BUDGET_KIB);
}

describe('plotrate analyze on hostile inputs: exit code, one reason, bounded memory', () => {
  it('has at least 40 named cases', () => {
    expect(cases.length).toBeGreaterThanOrEqual(40);
    expect(new Set(cases.map((c) => c.name)).size).toBe(cases.length);
  });

  it.concurrent.each(cases.map((c) => [c.name, c] as const))(
    '%s',
    async (_, c) => {
      const r = await runCliCapped(dir, c.args);
      // PLOTRATE_HOSTILE_PRINT=1 lists each case's outcome (for a report; never asserted).
      if (process.env.PLOTRATE_HOSTILE_PRINT)
        console.log(
          `${c.name} | exit ${r.code} | ${r.peakKiB === null ? '?' : Math.round(r.peakKiB / 1024)} MB | ${r.err.trimEnd().split('\n').at(-1)?.slice(0, 160)}`,
        );
      expectOrderly(r);
      expect(r.code, r.err).toBe(c.code);
      if (c.code !== 0) {
        const reason = r.err.trimEnd().split('\n').at(-1) ?? '';
        expect(reason).toMatch(c.reason!);
        expect(r.out, 'no results are printed for a refused input').not.toMatch(/optimum/);
      }
      await c.check?.(r);
    },
    60_000,
  );
});

// ---------------------------------------------------------------------------------------------
// Properties: whatever arrives, the run is orderly

/**
 * Runs per property: each is a process start, so few by default; PLOTRATE_HOSTILE_RUNS=200 for a
 * longer search. Shrinking is off (endOnFailure): every step would be another process.
 */
const RUNS = Number(process.env.PLOTRATE_HOSTILE_RUNS ?? 8);
/** Generous: two runs at a time, each a few seconds at most on a loaded machine. */
const PROPERTY_TIMEOUT_MS = Math.max(120_000, RUNS * 10_000);

/** Writes bytes under a fresh name and runs analyze on them. */
let serial = 0;
async function runOn(bytes: Uint8Array | string, ext: string): Promise<CappedRun> {
  const name = `prop-${++serial}${ext}`;
  writeFileSync(path.join(dir, name), bytes);
  return runCliCapped(dir, analyze(name));
}

/** Exit 0 with a results file, 2 with a reason naming the file, or 1 only as "analysis failed". */
function expectSettled(r: CappedRun, allowAnalysisFailure: boolean): void {
  expectOrderly(r);
  const reason = r.err.trimEnd().split('\n').at(-1) ?? '';
  if (r.code === 2) expect(reason).toMatch(/^plotrate: .*prop-\d+\./);
  else if (r.code === 1 && allowAnalysisFailure)
    expect(reason).toMatch(/^plotrate: analysis failed: /);
  else expect(r.code, r.err).toBe(0);
}

describe('plotrate analyze on generated inputs', () => {
  it.concurrent(
    'random bytes under any trial file name: 0 or 2, never a crash',
    async () => {
      await fc.assert(
        fc.asyncProperty(
          fc.uint8Array({ maxLength: 4000 }),
          fc.constantFrom('.csv', '.tsv', '.txt', '.xlsx'),
          async (b, ext) => expectSettled(await runOn(b, ext), false),
        ),
        { numRuns: RUNS, endOnFailure: true },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );

  const value = fc.oneof(
    fc.double({ noNaN: false }).map(String),
    fc.integer({ min: -300, max: 400 }).map(String),
    fc.constantFrom('', 'NA', '-', '1e300', '-0', '2024-05-01', '=1+1', '"', '12,5', ' 80 '),
    fc.string({ maxLength: 8 }),
  );
  const header = fc.constantFrom(
    'Site',
    'Block',
    'Plot',
    'N rate (lb N/ac)',
    'Rate (kg N/ha)',
    'Yield (bu/ac)',
    'Yield (t/ha)',
    'Moisture (%)',
    'Exclude',
    'x',
  );
  const table = fc.tuple(
    fc.array(header, { minLength: 1, maxLength: 7 }),
    fc.array(fc.array(value, { maxLength: 8 }), { maxLength: 40 }),
  );

  it.concurrent(
    'structured CSV with any headers and values: 0, 2 or "analysis failed"',
    async () => {
      await fc.assert(
        fc.asyncProperty(table, fc.constantFrom(',', ';', '\t'), async ([head, rows], sep) => {
          const text = [head, ...rows]
            .map((r) => r.map((v) => v.replace(/[\r\n]/g, ' ')).join(sep))
            .join('\n');
          expectSettled(await runOn(text, '.csv'), true);
        }),
        { numRuns: RUNS, endOnFailure: true },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );

  it.concurrent(
    'structured workbooks with any cell types, addresses and declared ranges',
    async () => {
      const col = fc.oneof(fc.integer({ min: 1, max: 8 }), fc.integer({ min: 1, max: 16_384 }));
      const rowNo = fc.oneof(
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 1, max: 1_048_576 }),
      );
      const letters = (n: number): string =>
        n > 0 ? letters(Math.floor((n - 1) / 26)) + String.fromCharCode(65 + ((n - 1) % 26)) : '';
      const cell = fc.record({
        col,
        t: fc.constantFrom('n', 's', 'str', 'inlineStr', 'b', 'e', 'd', 'bogus'),
        v: value,
        formula: fc.boolean(),
      });
      await fc.assert(
        fc.asyncProperty(
          fc.array(fc.tuple(rowNo, fc.array(cell, { maxLength: 6 })), { maxLength: 30 }),
          fc.option(fc.tuple(rowNo, col)),
          fc.array(fc.string({ maxLength: 10 }), { maxLength: 5 }),
          async (rows, dim, strings) => {
            const esc = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;');
            const sheetData = rows
              .map(
                ([r, cells]) =>
                  `<row r="${r}">${cells
                    .map(
                      (c) =>
                        `<c r="${letters(c.col)}${r}" t="${c.t}">${c.formula ? `<f>${esc(c.v)}</f>` : ''}${
                          c.t === 'inlineStr' ? `<is><t>${esc(c.v)}</t></is>` : `<v>${esc(c.v)}</v>`
                        }</c>`,
                    )
                    .join('')}</row>`,
              )
              .join('');
            const book = minimalXlsx({
              sheetData,
              strings: strings.map((s) => `<si><t>${esc(s)}</t></si>`).join(''),
              ...(dim ? { dimension: `A1:${letters(dim[1])}${dim[0]}` } : {}),
            });
            expectSettled(await runOn(book, '.xlsx'), true);
          },
        ),
        { numRuns: RUNS, endOnFailure: true },
      );
    },
    PROPERTY_TIMEOUT_MS,
  );
});
