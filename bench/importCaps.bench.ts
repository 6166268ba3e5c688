// The import caps at full size, through the command line as a user runs it (whole process,
// peak memory from GNU time, as in cli.bench.ts): files near the 64 MiB size cap, refused by a
// cap while reading or read whole under every cap. Invented data from the seeded generator.
//   - one line of 50 MB ("1,1,1,…"): refused at the 1,025th field;
//   - one cell of 50 MB: refused at the 32,768th character;
//   - 1,500,000 rows of 5 short fields (38 MB): refused at the 250,001st row;
//   - 249,998 plots × 8 columns with a distinct note on each (63 MB, 1,999,992 filled cells,
//     every cap met): read and analyzed (50 sites of 5,000 plots, no resampling, JSON only);
//   - the same as an .xlsx of 94 MiB of sheet XML, under the 96 MiB unzipped cap.
import { spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildCli } from '../scripts/buildCli.mjs';
import { strToU8, zipSync } from 'fflate';
import { mulberry32 } from '../shared/demo';

const here = path.dirname(fileURLToPath(import.meta.url));
const cli = path.join(here, '..', 'cli', 'plotrate.mjs');

/** Writes lines to a file in chunks, so the generator never holds the whole file. */
function writeLines(file: string, count: number, line: (i: number) => string, head = ''): void {
  const fd = openSync(file, 'w');
  if (head) writeSync(fd, head + '\n');
  let chunk: string[] = [];
  for (let i = 0; i < count; i++) {
    chunk.push(line(i));
    if (chunk.length === 10_000) {
      writeSync(fd, chunk.join('\n') + '\n');
      chunk = [];
    }
  }
  if (chunk.length) writeSync(fd, chunk.join('\n') + '\n');
  closeSync(fd);
}

/**
 * The under-every-cap trial: 50 sites × 5,000 plots, six rates, a previous-crop column and a
 * distinct note of about 200 characters on every plot; 1,999,992 filled cells, all distinct
 * but the site, year, rate and crop, and 63 MB: the most the caps let a file hold.
 */
function underEveryCap(file: string): void {
  const rng = mulberry32(15);
  const rates = [0, 40, 80, 120, 160, 200];
  const words = ['lodged', 'wet corner', 'hail', 'weedy', 'tile line', 'edge', 'sampled', 'ponded'];
  const crops = ['soybean', 'corn', 'wheat', 'alfalfa'];
  const head = 'Site,Year,Plot,N rate (lb N/ac),Yield (bu/ac),Moisture (%),Previous crop,Notes';
  writeLines(
    file,
    249_998,
    (i) => {
      const rate = rates[i % 6];
      const y = 110 + 80 * (1 - Math.exp(-rate / 60)) + (rng.next() - 0.5) * 20;
      const note = Array.from(
        { length: 14 },
        () => `${words[Math.floor(rng.next() * words.length)]} ${(rng.next() * 100).toFixed(3)}`,
      ).join('; ');
      return [
        `Larkspur Bend ${String(Math.floor(i / 5000) + 1).padStart(3, '0')}`,
        2025,
        1000 + (i % 5000),
        rate,
        y.toFixed(1),
        (18 + rng.next() * 3).toFixed(1),
        crops[Math.floor(i / 5000) % 4],
        `"${note}"`,
      ].join(',');
    },
    head,
  );
}

/**
 * The same trial as an .xlsx at the unzipped cap: inline strings, a note of six entries on each
 * plot, about 94 MiB of sheet XML (written part by part; the parts a reader needs and no more).
 */
function workbookAtCap(file: string): void {
  const rng = mulberry32(3);
  const main = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
  const rel = (type: string, target: string) =>
    `<Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/${type}" Target="${target}"/>`;
  const text = (ref: string, t: string) => `<c r="${ref}" t="inlineStr"><is><t>${t}</t></is></c>`;
  const num = (ref: string, v: number | string) => `<c r="${ref}"><v>${v}</v></c>`;
  const head = ['Site', 'Year', 'Plot', 'N rate (lb N/ac)', 'Yield (bu/ac)', 'Moisture (%)'];
  const rows = [
    `<row r="1">${[...head, 'Previous crop', 'Notes'].map((h, i) => text(`${'ABCDEFGH'[i]}1`, h)).join('')}</row>`,
  ];
  const rates = [0, 40, 80, 120, 160, 200];
  for (let i = 0; i < 249_998; i++) {
    const r = i + 2;
    const rate = rates[i % 6];
    const y = 110 + 80 * (1 - Math.exp(-rate / 60)) + (rng.next() - 0.5) * 20;
    const note = Array.from({ length: 6 }, () => `n ${(rng.next() * 100).toFixed(3)}`).join('; ');
    const site = `Larkspur Bend ${String(Math.floor(i / 5000) + 1).padStart(3, '0')}`;
    rows.push(
      `<row r="${r}">${text(`A${r}`, site)}${num(`B${r}`, 2025)}${num(`C${r}`, 1000 + (i % 5000))}${num(`D${r}`, rate)}${num(`E${r}`, y.toFixed(1))}${num(`F${r}`, (18 + rng.next() * 3).toFixed(1))}${text(`G${r}`, 'soybean')}${text(`H${r}`, note)}</row>`,
    );
  }
  const bytes = zipSync({
    '_rels/.rels': strToU8(
      `<Relationships>${rel('officeDocument', 'xl/workbook.xml')}</Relationships>`,
    ),
    'xl/workbook.xml': strToU8(
      `<workbook xmlns="${main}" xmlns:r="r"><sheets><sheet name="Plots" sheetId="1" r:id="rId1"/></sheets></workbook>`,
    ),
    'xl/_rels/workbook.xml.rels': strToU8(
      `<Relationships>${rel('worksheet', 'worksheets/sheet1.xml')}</Relationships>`,
    ),
    'xl/worksheets/sheet1.xml': strToU8(
      `<worksheet xmlns="${main}"><sheetData>${rows.join('')}</sheetData></worksheet>`,
    ),
  });
  const fd = openSync(file, 'w');
  writeSync(fd, bytes);
  closeSync(fd);
}

function measured(cwd: string, args: string[]): string {
  const gnu = existsSync('/usr/bin/time');
  const t = process.hrtime.bigint();
  const r = gnu
    ? spawnSync('/usr/bin/time', ['-f', '%M', process.execPath, cli, ...args], {
        cwd,
        encoding: 'utf8',
        maxBuffer: 64 << 20,
      })
    : spawnSync(process.execPath, [cli, ...args], { cwd, encoding: 'utf8', maxBuffer: 64 << 20 });
  const wall = Number(process.hrtime.bigint() - t) / 1e9;
  // GNU time adds "Command exited with non-zero status N" before its figure.
  const lines = r.stderr
    .trimEnd()
    .split('\n')
    .filter((l) => !l.startsWith('Command exited'));
  const peak = gnu ? `${(Number(lines.pop()) / 1024).toFixed(0)} MiB peak` : 'peak not measured';
  const reason = (lines.at(-1) ?? '').slice(0, 90);
  return `exit ${r.status}, ${wall.toFixed(1)} s, ${peak} — ${reason}`;
}

export async function run(): Promise<void> {
  await buildCli();
  const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-caps-'));
  try {
    const MB50 = 50 * 1024 * 1024;
    writeLines(path.join(dir, 'one-line.csv'), 1, () => '1,'.repeat(MB50 / 2));
    writeLines(path.join(dir, 'one-cell.csv'), 1, () => 'x'.repeat(MB50));
    writeLines(
      path.join(dir, 'rows.csv'),
      1_500_000,
      (i) => `S${i % 97},${i},${(i % 6) * 40},${150 + (i % 13)}.5,19.${i % 10}`,
      'Site,Plot,N rate (lb N/ac),Yield (bu/ac),Moisture (%)',
    );
    underEveryCap(path.join(dir, 'full.csv'));
    workbookAtCap(path.join(dir, 'full.xlsx'));
    for (const [file, what] of [
      ['one-line.csv', '50 MB, one line'],
      ['one-cell.csv', '50 MB, one cell'],
      ['rows.csv', '1.5 M rows × 5 fields'],
      ['full.csv', '250 k rows × 8 columns, every cap met'],
      ['full.xlsx', '.xlsx, 94 MiB of XML, every cap met'],
    ]) {
      const args = ['analyze', file, '--boot', '0', '--json', `${file}.json`];
      console.log(`${what.padEnd(40)} ${measured(dir, args)}`);
    }
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
