// The command line's outputs (written all or nothing): every target is checked
// before any fit runs, a run writes all its outputs or none, an interrupted run leaves no
// temporary file, and "--" lets a file name start with a dash. The real command line runs as a
// child process in a temporary folder, on an invented trial from the seeded generator.
// "Before any fit" is read from the progress lines: the command prints "fitting seven models"
// before it fits, so a refusal without that line came first.
import { execFileSync, spawn } from 'node:child_process';
import { once } from 'node:events';
import {
  existsSync,
  linkSync,
  mkdirSync,
  mkdtempSync,
  readFileSync,
  readdirSync,
  utimesSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { unzipSync } from 'fflate';
import { beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { cliPath as cli, runCli } from './support/runCli';
import { syntheticCsv } from '../shared/demo';
import { removeStaleTemporaries, writeFilesAtomic } from '../electron/atomicWrite';
import { collectGarbage } from '../cli/collectGarbage';

const dir = mkdtempSync(path.join(tmpdir(), 'plotrate-outputs-'));

const run = (args: string[]) => runCli(dir, args);

const temporaries = (folder: string) => readdirSync(folder).filter((n) => n.endsWith('.tmp'));

beforeAll(() => {
  writeFileSync(path.join(dir, 'trial.csv'), syntheticCsv({ sites: 2, seed: 5 }));
  writeFileSync(path.join(dir, '-dash.csv'), syntheticCsv({ sites: 1, seed: 6 }));
  mkdirSync(path.join(dir, 'a-folder.xlsx'));
  linkSync(path.join(dir, 'trial.csv'), path.join(dir, 'hardlink.json'));
});

describe('plotrate analyze: outputs checked before any work', () => {
  it.each([
    [['--out', 'missing/r.xlsx'], /folder .*missing does not exist/],
    [['--out', 'a-folder.xlsx'], /a-folder\.xlsx is a folder/],
    [['--json', 'trial.csv/r.json'], /is not a folder/],
    [['--json', 'hardlink.json'], /is the input file "trial\.csv"/],
    [['--json', 'same.json', '--pdf', 'same.json'], /\.pdf|also given/],
  ])('%j is refused with exit 2, one line, before fitting', (outs, reason) => {
    const r = run(['analyze', 'trial.csv', '--boot', '20', ...outs]);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(reason);
    expect(r.err).not.toMatch(/fitting/);
    expect(r.err.trim().split('\n')).toHaveLength(1);
  });
});

describe('plotrate analyze: all outputs or none', () => {
  it('writes every output of a run', () => {
    const r = run([
      'analyze',
      'trial.csv',
      '--boot',
      '20',
      '--json',
      'ok.json',
      '--out',
      'ok.xlsx',
    ]);
    expect(r.code).toBe(0);
    expect(existsSync(path.join(dir, 'ok.json'))).toBe(true);
    expect(existsSync(path.join(dir, 'ok.xlsx'))).toBe(true);
    expect(temporaries(dir)).toEqual([]);
  });

  it('leaves no first output and no temporary file when a later one fails', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'plotrate-none-'));
    const first = path.join(folder, 'first.json');
    const second = path.join(folder, 'gone', 'second.json');
    await expect(
      writeFilesAtomic([
        { target: first, make: async () => '{"a": 1}\n' },
        { target: second, make: async () => '{"b": 2}\n' },
      ]),
    ).rejects.toMatchObject({ code: 'ENOENT' });
    expect(existsSync(first)).toBe(false);
    expect(temporaries(folder)).toEqual([]);
  });

  it('streams an output into its temporary file, in order, and renames it with the rest', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'plotrate-stream-'));
    const streamed = path.join(folder, 'big.txt');
    const made = path.join(folder, 'small.json');
    // 3 MiB in 1,000-byte lines: more than the writer's 1 MiB chunk, so order and splits show.
    const lines = Array.from(
      { length: 3 * 1024 + 7 },
      (_, i) => `${String(i).padStart(999, '.')}\n`,
    );
    const seen: string[] = [];
    await writeFilesAtomic(
      [
        {
          target: streamed,
          stream: async (out) => {
            for (const l of lines) if (!out.write(l)) await once(out, 'drain');
            out.end();
          },
        },
        { target: made, make: async () => '{}\n' },
      ],
      (t) => seen.push(path.basename(t)),
    );
    expect(seen).toEqual(['big.txt', 'small.json']);
    expect(readFileSync(streamed, 'utf8')).toBe(lines.join(''));
    expect(readFileSync(made, 'utf8')).toBe('{}\n');
    expect(temporaries(folder)).toEqual([]);
  });

  it('leaves no output and no temporary file when a streamed output fails half-way', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'plotrate-stream-fail-'));
    const first = path.join(folder, 'first.json');
    await expect(
      writeFilesAtomic([
        { target: first, make: async () => '{"a": 1}\n' },
        {
          target: path.join(folder, 'second.pdf'),
          stream: async (out) => {
            out.write('%PDF-1.3\n');
            throw new Error('drawing failed');
          },
        },
      ]),
    ).rejects.toThrow('drawing failed');
    expect(readdirSync(folder)).toEqual([]);
  });

  it('leaves no temporary file and no output when stopped by SIGTERM while writing', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'plotrate-term-'));
    writeFileSync(path.join(folder, 'trial.csv'), syntheticCsv({ sites: 6, seed: 7 }));
    const proc = spawn(
      process.execPath,
      [cli, 'analyze', 'trial.csv', '--boot', '20', '--out', 'r.xlsx', '--json', 'r.json'],
      { cwd: folder, stdio: ['ignore', 'ignore', 'pipe'] },
    );
    let err = '';
    let sent = false;
    const exit = new Promise<number | null>((resolve) =>
      proc.on('exit', (code) => {
        resolve(code);
      }),
    );
    await new Promise<void>((resolve) => {
      proc.stderr.on('data', (d: Buffer) => {
        err += d.toString();
        // The first output has started: stop the run while its bytes are being made or written.
        if (err.includes('writing') && !sent) {
          sent = true;
          proc.kill('SIGTERM');
          resolve();
        }
      });
      proc.on('exit', () => resolve());
    });
    const code = await exit;
    if (code === 0) return; // finished before the signal landed: nothing to check
    expect(code).toBe(143);
    expect(temporaries(folder)).toEqual([]);
    expect(existsSync(path.join(folder, 'r.xlsx'))).toBe(false);
    expect(existsSync(path.join(folder, 'r.json'))).toBe(false);
  });
});

describe('plotrate analyze: site charts past --site-charts', () => {
  it('leaves them out and says so on stderr, in the overview and on every grower page', async () => {
    const r = run([
      'analyze',
      'trial.csv',
      '--boot',
      '20',
      '--site-charts',
      '1',
      '--out',
      'few.xlsx',
      '--pdf',
      'few.pdf',
    ]);
    expect(r.code).toBe(0);
    const note = /Site charts are left out: 2 sites is more than the 1 a run draws a chart for/;
    expect(r.err).toMatch(note);
    // Read back by SheetJS (an independent reader): the note heads the overview, and the only
    // picture left is the regional one, on the across-sites sheet.
    const bytes = readFileSync(path.join(dir, 'few.xlsx'));
    const wb = XLSX.read(bytes);
    const overview = XLSX.utils.sheet_to_csv(wb.Sheets.Overview);
    expect(overview).toMatch(note);
    const media = Object.keys(unzipSync(new Uint8Array(bytes))).filter((n) =>
      n.startsWith('xl/media/'),
    );
    expect(media).toHaveLength(1);
    // The PDF's pages as text (poppler's pdftotext, Debian poppler-utils): every page says it.
    const pages = execFileSync('pdftotext', ['-layout', path.join(dir, 'few.pdf'), '-'], {
      encoding: 'utf8',
    })
      .split('\f')
      .filter((p) => p.trim());
    expect(pages.length).toBeGreaterThanOrEqual(2);
    for (const p of pages) expect(p.replace(/\s+/g, ' ')).toMatch(/Site charts are left out/);
  });
});

describe('collectGarbage (between outputs and every 200 sheets)', () => {
  it('frees an object nothing refers to any more, without --expose-gc', async () => {
    // 8 MB in V8's large-object space: only a full collection frees it.
    const ref = new WeakRef(new Array<number>(1_000_000).fill(1));
    // A WeakRef keeps its target to the end of the current job (ECMA-262, AddToKeptObjects).
    await new Promise((resolve) => setImmediate(resolve));
    collectGarbage();
    expect(ref.deref()).toBeUndefined();
  });
});

describe('plotrate analyze: "--" ends the options', () => {
  it('reads a file whose name starts with a dash after "--", and says how when it is not', () => {
    const bare = run(['analyze', '-dash.csv', '--boot', '20']);
    expect(bare.code).toBe(2);
    expect(bare.err).toMatch(/write -- before a file/);
    const escaped = run(['analyze', '--boot', '20', '--', '-dash.csv']);
    expect(escaped.code).toBe(0);
  });
});

describe('temporary files of a dead run', () => {
  it('are removed on the next write once their process is gone and a minute has passed', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'plotrate-stale-'));
    const target = path.join(folder, 'r.json');
    // A process id far above Linux's default pid_max (4,194,304) runs nowhere.
    const dead = path.join(folder, '.r.json.99999999-0badc0de.tmp');
    const mine = path.join(folder, `.r.json.${process.pid}-0badc0de.tmp`);
    const recent = path.join(folder, '.r.json.99999998-0badc0de.tmp');
    for (const f of [dead, mine, recent]) writeFileSync(f, 'partial');
    const twoMinutesAgo = (Date.now() - 120_000) / 1000;
    utimesSync(dead, twoMinutesAgo, twoMinutesAgo);
    utimesSync(mine, twoMinutesAgo, twoMinutesAgo);
    const removed = await removeStaleTemporaries(target);
    expect(removed).toEqual([path.basename(dead)]);
    expect(existsSync(mine)).toBe(true); // its process runs: a write may be going on
    expect(existsSync(recent)).toBe(true); // under a minute old: maybe another machine's
  });
});

describe('a run killed outright (SIGKILL, no handler runs)', () => {
  it('leaves the previous report whole: the target is the old file or a complete new one', async () => {
    const folder = mkdtempSync(path.join(tmpdir(), 'plotrate-kill-'));
    writeFileSync(path.join(folder, 'trial.csv'), syntheticCsv({ sites: 8, seed: 5 }));
    const previous = Buffer.from('{"the previous report": true}\n');
    const target = path.join(folder, 'r.json');
    writeFileSync(target, previous);
    const outcomes: string[] = [];
    // Kill at a few moments after writing starts, so at least one lands mid-write.
    for (const delayMs of [0, 5, 20, 60]) {
      const proc = spawn(
        process.execPath,
        [cli, 'analyze', 'trial.csv', '--boot', '20', '--out', 'r.xlsx', '--json', 'r.json'],
        { cwd: folder, stdio: ['ignore', 'ignore', 'pipe'] },
      );
      let err = '';
      const exit = new Promise<string | null>((resolve) =>
        proc.on('exit', (_code, signal) => resolve(signal)),
      );
      proc.stderr.on('data', (d: Buffer) => {
        err += d.toString();
        if (err.includes('writing')) setTimeout(() => proc.kill('SIGKILL'), delayMs);
      });
      const signal = await exit;
      const now = readFileSync(target);
      if (now.equals(previous)) outcomes.push(`${signal}: previous kept`);
      else {
        // Renamed into place whole: the new results parse.
        expect(() => JSON.parse(now.toString('utf8'))).not.toThrow();
        outcomes.push(`${signal}: new report whole`);
        writeFileSync(target, previous);
      }
    }
    // At least one kill landed before the rename, or the test proved nothing.
    expect(outcomes.some((o) => o === 'SIGKILL: previous kept')).toBe(true);
  }, 120_000);
});
