// The workspace end to end in real chromium against the built renderer.
import { execFileSync } from 'node:child_process';
import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { readFile } from 'node:fs/promises';
import { analyzeCommand } from '../../cli/analyzeCommand';
import { parseArgs, type AnalyzeArgs } from '../../cli/parseArgs';
import { syntheticWorkbook } from '../../shared/demo/syntheticTrial';
import { makeWorkbook } from '../fixtures/import/makeWorkbook';
import { recommendationCautions } from '../../shared/economics/recommendationCautions';
import { openSession, shot, SHOT_DIR, type Session } from './harness';

let session: Session;
/** The trial files the workspace has open, for the command line to analyze the same. */
const openedFiles = [
  path.join(
    path.dirname(new URL(import.meta.url).pathname),
    '..',
    '..',
    'demo',
    'wrenhollow-n-trials-2025.xlsx',
  ),
];

beforeAll(async () => {
  session = await openSession();
  await session.page.goto(session.url);
});
afterAll(async () => {
  await session?.close();
});

/** The number in a text such as "181 kg/ha" or "1,234 lb/ac". */
function leadingNumber(text: string | null): number {
  const m = /-?[\d,]+(\.\d+)?/.exec(text ?? '');
  if (!m) throw new Error(`no number in "${text}"`);
  return Number(m[0].replace(/,/g, ''));
}

describe('the workspace in chromium', () => {
  it('opens on the demo trial the first time and shows a site chart', async () => {
    const { page } = session;
    await page.getByRole('navigation', { name: 'Steps' }).waitFor();
    const chart = page.locator('[data-testid="chart"] .main-svg').first();
    await chart.waitFor({ timeout: 30_000 });
    await page.getByTestId('site-optimum').waitFor();
    await expect(page.getByTestId('site-optimum').textContent()).resolves.toMatch(/\d+ kg\/ha/);
    // The bootstrap interval arrives from the worker and is drawn as a band.
    await page.getByText(/90 % interval \d+ kg\/ha to \d+ kg\/ha/).waitFor({ timeout: 60_000 });
    // The demo's first site: the curves disagree (linear-plateau well below the quadratic), and
    // the panel says so with the range across them.
    await expect(page.getByTestId('model-spread').textContent()).resolves.toMatch(
      /anywhere from \d+ kg\/ha to \d+ kg\/ha: the choice of model matters/,
    );
    await expect
      // Before the interval the optimum line is the only shape; with the band there are two.
      .poll(() => page.locator('[data-testid="chart"] .shapelayer path').count())
      .toBeGreaterThanOrEqual(2);
    await page.waitForTimeout(300);
    await shot(page, '01-demo-site');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('moves the optimum’s marker and band within the plot when the price changes', async () => {
    const { page } = session;
    // The plot area's left and right edges, and each shape's left and right ends, in pixels.
    const geometry = () =>
      page.evaluate(() => {
        const gd = document.querySelector('[data-testid="chart"]')!;
        // The main subplot's drag rectangle covers its plot area.
        const bg = gd.querySelector('.draglayer .xy .nsewdrag')!.getBoundingClientRect();
        const shapes = [...gd.querySelectorAll('.shapelayer path')].map((p) => {
          const r = p.getBoundingClientRect();
          return [Math.round(r.left), Math.round(r.right)];
        });
        return { plot: [Math.round(bg.left), Math.round(bg.right)], shapes };
      });
    // The band arrives with the draws, after the optimum's line.
    await expect
      .poll(() => page.locator('[data-testid="chart"] .shapelayer path').count(), {
        timeout: 60_000,
      })
      .toBeGreaterThanOrEqual(2);
    const before = await geometry();
    const optimum = await page.getByTestId('site-optimum').textContent();
    const price = page.getByTestId('product-price');
    const was = await price.inputValue();
    await price.fill((Number(was) * 2).toFixed(2));
    await expect.poll(() => page.getByTestId('site-optimum').textContent()).not.toBe(optimum);
    await expect
      .poll(async () => JSON.stringify((await geometry()).shapes))
      .not.toBe(JSON.stringify(before.shapes));
    // A dearer N moves the optimum down, and every shape stays on the plot (a redraw against
    // stale axes once put them thousands of pixels to the right).
    const after = await geometry();
    expect(after.shapes.length).toBeGreaterThanOrEqual(2);
    for (const [left, right] of after.shapes) {
      expect(left).toBeGreaterThanOrEqual(after.plot[0] - 1);
      expect(right).toBeLessThanOrEqual(after.plot[1] + 1);
    }
    expect(Math.max(...after.shapes.map((s) => s[1]))).toBeLessThan(
      Math.max(...before.shapes.map((s) => s[1])),
    );
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('analyses a two-crop workbook one crop at a time, with a picker that switches and switches back', async () => {
    const { page } = session;
    // The demo workbook has corn sheets and two wheat sheets (the invented Skellwater sites).
    const picker = page.getByTestId('crop-picker');
    await picker.waitFor();
    await expect(page.getByTestId('crop-corn').getAttribute('aria-pressed')).resolves.toBe('true');
    const sites = () => page.getByTestId('site-picker').locator('option').allTextContents();
    await expect.poll(sites).toContain('Quillmere North');
    await page.getByTestId('crop-wheat').click();
    await expect.poll(sites, { timeout: 60_000 }).toEqual(['Skellwater Upper', 'Skellwater Lower']);
    await shot(page, '01b-crop-picker-wheat');
    await page.getByTestId('crop-corn').click();
    await expect.poll(sites, { timeout: 60_000 }).toContain('Quillmere North');
    await expect(sites()).resolves.not.toContain('Skellwater Upper');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it("offers only local actions on a chart's toolbar, and nothing leaves the computer", async () => {
    const { page } = session;
    const chart = page.getByTestId('chart').first();
    await chart.hover();
    const titles = await chart
      .locator('.modebar-btn')
      .evaluateAll((buttons) => buttons.map((b) => b.getAttribute('data-title') ?? ''));
    // Plotly 4 would add "Send data to cloud" (showSendToCloud defaults to true).
    expect(titles.length).toBeGreaterThanOrEqual(5);
    for (const title of titles) expect(title).not.toMatch(/cloud|upload|share|studio|edit/i);
    expect(titles).toContain('Download plot as a PNG');
    expect(session.offsiteRequests).toEqual([]);
  });

  it('takes a generated trial workbook through the file input', async () => {
    const { page } = session;
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-file-'));
    const file = path.join(dir, 'Synthetic three sites.xlsx');
    await writeFile(file, await syntheticWorkbook({ sites: 3, seed: 11 }));
    openedFiles.push(file);
    await page.getByRole('button', { name: /Columns/ }).click();
    const counts = async () => {
      const m = /(\d+) plots at (\d+) sites/.exec(
        (await page.getByTestId('table-summary').textContent()) ?? '',
      );
      return m ? [Number(m[1]), Number(m[2])] : null;
    };
    const [plots, sites] = (await counts())!;
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles(file);
    await page.getByTestId('sheet-Plots').waitFor({ timeout: 20_000 });
    // The demo's sites plus three synthetic sites of 24 plots each.
    await expect.poll(counts, { timeout: 10_000 }).toEqual([plots + 72, sites + 3]);
    await shot(page, '02-file-input-columns');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('changing a column role rebuilds the plot table, and undo brings it back', async () => {
    const { page } = session;
    const syntheticYield = page
      .getByTestId('preview-row')
      .filter({ hasText: 'Site 0001' })
      .first()
      .locator('td.num')
      .nth(1);
    const adjusted = await syntheticYield.textContent();
    // Moisture column set aside: yields are no longer brought to standard moisture.
    await page.getByTestId('role-Plots-G').selectOption('ignore');
    await expect.poll(() => syntheticYield.textContent()).not.toBe(adjusted);
    // The yield column made a plot weight: the unit box offers weights, with one chosen (the
    // header's "bu/ac" is no weight, so the first of kg, g, lb), and undo brings bu/ac back.
    await page.getByTestId('role-Plots-F').selectOption('plotWeight');
    const unit = page.getByLabel('Unit of column F (Yield (bu/ac))');
    await expect(unit.locator('option').allTextContents()).resolves.toEqual([
      '(not given)',
      'kg',
      'g',
      'lb',
    ]);
    await expect(unit.inputValue()).resolves.toBe('kg');
    await page.getByRole('button', { name: /^Undo/ }).click();
    await expect(unit.inputValue()).resolves.toBe('bu/ac');
    // The N rate column set aside: the synthetic sheet cannot be built, and the message names it.
    await page.getByTestId('role-Plots-E').selectOption('ignore');
    await page.getByTestId('build-problem').waitFor();
    await expect(page.getByTestId('build-problem').textContent()).resolves.toMatch(/Plots/);
    await shot(page, '03-column-role-changed');
    await page.getByRole('button', { name: /^Undo/ }).click();
    await page.getByTestId('build-problem').waitFor({ state: 'detached' });
    await page.getByRole('button', { name: /^Undo/ }).click();
    await expect.poll(() => syntheticYield.textContent()).toBe(adjusted);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('a price change moves the optimum on screen', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Prices/ }).click();
    const cell = page.getByTestId('optimum-Quillmere North');
    await cell.waitFor({ timeout: 30_000 });
    const before = leadingNumber(await cell.textContent());
    await page.getByTestId('product-price').fill('1.2');
    await expect
      .poll(async () => leadingNumber(await cell.textContent()), { timeout: 10_000 })
      .toBeLessThan(before);
    await shot(page, '04-price-changed');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('reads a price typed with either decimal mark in any locale, and says what it read', async () => {
    const { page } = session;
    const field = page.getByTestId('product-price');
    const cell = page.getByTestId('optimum-Quillmere North');
    const optimum = async () => leadingNumber(await cell.textContent());
    const at12 = await optimum();
    const locale = page.getByLabel('Locale for numbers and dates');
    await locale.selectOption('de-DE');
    // "0,62" in a decimal-comma locale is 0.62, never 62.
    await field.fill('0,62');
    await expect.poll(optimum, { timeout: 10_000 }).toBeGreaterThan(at12);
    const at062 = await optimum();
    // A plain point reads the same, and the field says what it read.
    await field.fill('0.62');
    await expect(page.getByTestId('product-price-read').textContent()).resolves.toBe(
      'read as 0,62',
    );
    await expect.poll(optimum).toBe(at062);
    await field.fill('0,62 EUR');
    await page.getByText('not a number').waitFor();
    await expect.poll(optimum).toBe(at062);
    await locale.selectOption('en-US');
    // 62 for 0.62: a price ratio 100 times the usual is asked about before any rate is shown.
    await field.fill('62');
    await page.getByTestId('confirm-price-ratio').waitFor();
    await expect(page.getByRole('alert').first().textContent()).resolves.toMatch(
      /times the usual .* no rate is shown until/,
    );
    await expect(cell.count()).resolves.toBe(0);
    await page.getByTestId('no-optima').waitFor();
    await shot(page, '04b-price-ratio-asked');
    await page.getByTestId('confirm-price-ratio').click();
    await cell.waitFor();
    await field.fill('1,2');
    await expect(page.getByTestId('product-price-read').textContent()).resolves.toBe('read as 1.2');
    await expect.poll(optimum, { timeout: 10_000 }).toBe(at12);
    await field.blur();
    await expect(field.inputValue()).resolves.toBe('1.2');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('lists quality findings with their cells, and an exclusion from the list refits the site', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Quality/ }).click();
    await page.getByRole('heading', { name: /Findings \(\d+\)/ }).waitFor();
    // The demo stores a yield as text; its finding names the sheet and cell.
    const finding = page.locator('li.finding', { hasText: 'stored as text' }).first();
    await expect(finding.textContent()).resolves.toMatch(/› [A-Z]+\d+/);
    await finding.getByRole('button', { name: 'Show row' }).click();
    const row = page.locator('tr.focus');
    await row.waitFor();
    await page.getByPlaceholder('e.g. hail damage').fill('lodged after storm');
    await row.getByRole('button', { name: 'Exclude' }).click();
    await expect(row.textContent()).resolves.toContain('excluded (user): lodged after storm');
    await shot(page, '05a-quality');
    await page.getByRole('button', { name: /^Undo/ }).click();
    await expect(page.locator('tr.focus').textContent()).resolves.toContain('in the fit');
    // The finding's reason box starts empty, and keeping a plot needs no reason.
    await expect(
      finding.getByLabel('Reason for the decision (optional)').inputValue(),
    ).resolves.toBe('');
    await finding.getByRole('button', { name: 'Keep' }).click();
    await expect(finding.textContent()).resolves.toMatch(/Decided: keep(?! —)/);
    await page.getByRole('button', { name: /^Undo/ }).click();
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('the US switch shows rates in lb/ac, yields in bu/ac and the gain over the check in bu/lb N everywhere', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /One site/ }).click();
    await page.getByText('US', { exact: true }).click();
    await expect(page.getByTestId('site-optimum').textContent()).resolves.toMatch(/\d+ lb\/ac/);
    await expect(page.getByTestId('model-table').textContent()).resolves.toContain('bu/ac');
    await expect(page.getByTestId('price-ratio').first().textContent()).resolves.toMatch(
      /bu\/lb N/,
    );
    // The gain over the check leads the intercept panel, in the price ratio's unit.
    const gain = page.getByTestId('gain-over-check');
    await expect(gain.textContent()).resolves.toMatch(
      /^Gain over each block’s check: -?[\d.,]+ bu\/lb N \(95 % interval -?[\d.,]+ to -?[\d.,]+\)\. The gains (bend|do not start from zero|start from zero) /,
    );
    await page.locator('[data-testid="chart"] .main-svg').first().waitFor();
    await page.waitForTimeout(500);
    await shot(page, '05b-us-units');
    await page.getByText('Metric', { exact: true }).click();
    await expect(page.getByTestId('site-optimum').textContent()).resolves.toMatch(/\d+ kg\/ha/);
    await expect(gain.textContent()).resolves.toMatch(/: [\d.,]+ kg\/kg N \(95 % interval/);
  });

  it('shows every site together with the regional rate and the pooling tests', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /All sites/ }).click();
    await page.getByTestId('best-rate').waitFor();
    await expect(page.getByTestId('best-rate').textContent()).resolves.toMatch(/\d+ kg\/ha/);
    await page.getByText('Do the sites share a response?').waitFor();
    // The interval from resampling site-years arrives with the bootstrap from the worker.
    await expect(
      page.getByTestId('regional-rate-interval').textContent({ timeout: 60_000 }),
    ).resolves.toMatch(
      /anywhere from \d+ kg\/ha to \d+ kg\/ha \(90 % interval from\s+resampling the \d+ site-years/,
    );
    await shot(page, '05-all-sites');
    // Side by side, every site's chart has the same axes.
    await page.getByLabel('side by side').check();
    const charts = page.locator('.grid [data-testid="chart"]');
    await expect.poll(() => charts.count()).toBeGreaterThan(1);
    await page.locator('.grid [data-testid="chart"] .main-svg').last().waitFor();
    const ranges = await charts.evaluateAll((els) =>
      els.map((el) => {
        const full = (el as unknown as { _fullLayout: Record<string, { range: number[] }> })
          ._fullLayout;
        return JSON.stringify([full.xaxis.range, full.yaxis.range]);
      }),
    );
    expect(new Set(ranges).size).toBe(1);
    await page.getByLabel('overlaid').check();
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('shows the price-ratio and risk tables with the cautions, for the region and a site', async () => {
    const { page } = session;
    // On the all-sites step: the region's tables, the 1× row being the regional rate above.
    const region = page.getByTestId('region-ratio-risk');
    await region.waitFor();
    const regionRows = page.getByTestId('region-ratio-table').locator('tbody tr');
    await expect(regionRows.count()).resolves.toBe(5);
    const best = await page.getByTestId('best-rate').textContent();
    await expect(regionRows.nth(2).locator('td').nth(2).textContent()).resolves.toBe(best);
    await expect(page.getByTestId('region-risk-note').textContent()).resolves.toMatch(
      /a risk between sites/,
    );
    const regionText = (await region.textContent()) ?? '';
    for (const c of recommendationCautions) expect(regionText).toContain(c);
    await region.scrollIntoViewIfNeeded();
    await region.screenshot({ path: path.join(SHOT_DIR, '05c-region-ratio-risk.png') });
    // On the one-site step: the site's tables under its optimum.
    await page.getByRole('button', { name: /One site/ }).click();
    const site = page.getByTestId('site-ratio-risk');
    await site.waitFor();
    const siteRows = page.getByTestId('site-ratio-table').locator('tbody tr');
    await expect(siteRows.nth(2).locator('td').first().textContent()).resolves.toBe('1× (now)');
    await expect(siteRows.nth(2).locator('td').nth(2).textContent()).resolves.toBe(
      await page.getByTestId('site-optimum').textContent(),
    );
    const siteText = (await site.textContent()) ?? '';
    for (const c of recommendationCautions) expect(siteText).toContain(c);
    await expect(page.getByTestId('site-risk-note').textContent()).resolves.toMatch(
      /Share of the 200 resamples .* \(the cost of 10 kg N\/ha at these prices\)/,
    );
    await site.scrollIntoViewIfNeeded();
    await site.screenshot({ path: path.join(SHOT_DIR, '05d-site-ratio-risk.png') });
    // A tolerance of one's own is used at once, and the default comes back.
    await page.getByRole('button', { name: /Prices/ }).click();
    await page.getByTestId('shortfall-tolerance').fill('40');
    await page.getByRole('button', { name: /One site/ }).click();
    await expect(page.getByTestId('site-risk-note').textContent()).resolves.toMatch(
      /by more than .?40[.,]00.*\/ha \(your tolerance\)/,
    );
    await page.getByRole('button', { name: /Prices/ }).click();
    await page.getByTestId('tolerance-default').click();
    await page.getByRole('button', { name: /One site/ }).click();
    await expect(page.getByTestId('site-risk-note').textContent()).resolves.toMatch(
      /the cost of 10 kg N\/ha/,
    );
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('previews the grower page and exports a workbook with the optimum shown on screen', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Prices/ }).click();
    const onScreen = leadingNumber(await page.getByTestId('optimum-Quillmere North').textContent());
    await page.getByRole('button', { name: /Report/ }).click();
    await page.getByTestId('grower-page').waitFor({ timeout: 60_000 });
    await expect(page.getByTestId('grower-recommendation').textContent()).resolves.toMatch(/\d/);
    await shot(page, '06-grower-page');
    // Printed: the grower page alone, with its cautions; the workspace around it stays off paper.
    await page.emulateMedia({ media: 'print' });
    await expect(page.getByRole('navigation', { name: 'Steps' }).isVisible()).resolves.toBe(false);
    await expect(page.getByTestId('export-workbook').isVisible()).resolves.toBe(false);
    await expect(page.getByTestId('grower-page').getByText('Cautions').isVisible()).resolves.toBe(
      true,
    );
    await shot(page, '06b-grower-page-print');
    await page.emulateMedia({ media: 'screen' });
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('export-workbook').click(),
    ]);
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-download-'));
    const saved = path.join(dir, download.suggestedFilename());
    await download.saveAs(saved);
    expect(saved).toMatch(/\.xlsx$/);
    const book = new ExcelJS.Workbook();
    await book.xlsx.readFile(saved);
    const overview = book.worksheets[0];
    let header: string[] = [];
    let optimum: number | null = null;
    overview.eachRow((row) => {
      const values = (row.values as unknown[]).slice(1).map((v) => String(v ?? ''));
      if (values[0] === 'Site') header = values;
      if (values[0] === 'Quillmere North') {
        optimum = Number(
          row.getCell(header.findIndex((h) => h.startsWith('Optimum rate')) + 1).value,
        );
      }
    });
    // Metric units on screen, so the workbook's rates are per hectare too.
    expect(header.some((h) => /^Optimum rate \(kg( N)?\/ha\)/.test(h))).toBe(true);
    expect(optimum).not.toBeNull();
    // The screen shows whole kg/ha; the workbook keeps the full number.
    expect(Math.abs(optimum! - onScreen)).toBeLessThanOrEqual(0.5);
    // The command line on the same files at the same prices (illustrative grain, urea at 1.2 per
    // kg, metric units) prints the workbook's number: one analysis, whichever runs it.
    const json = path.join(dir, 'results.json');
    const cmd = parseArgs([
      'analyze',
      ...openedFiles,
      '--units',
      'metric',
      '--product',
      'urea',
      '--product-price',
      '1.2',
      '--boot',
      '0',
      '--json',
      json,
    ]);
    await analyzeCommand(cmd as unknown as AnalyzeArgs, { out: () => {}, err: () => {} }, 'e2e');
    const results = JSON.parse(await readFile(json, 'utf8')) as {
      sites: {
        site: string;
        bestModel: string;
        models: { model: string; optimumRate: number }[];
      }[];
    };
    const site = results.sites.find((s) => s.site === 'Quillmere North')!;
    const fromCli = site.models.find((m) => m.model === site.bestModel)!.optimumRate;
    expect(Math.abs(fromCli - optimum!)).toBeLessThanOrEqual(1e-9 * optimum!);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('a model picked on screen leads the grower page too, with the optimum the screen shows', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /One site/ }).click();
    await page.getByTestId('site-picker').selectOption('Quillmere North');
    await page.getByRole('radio', { name: 'Lead with Linear-plateau' }).check();
    await expect
      .poll(() => page.getByTestId('model-table').locator('tr.lead').textContent())
      .toContain('Linear-plateau');
    const onScreen = leadingNumber(await page.getByTestId('site-optimum').textContent());
    await page.getByRole('button', { name: /Report/ }).click();
    await page.getByTestId('page-for').selectOption('Quillmere North');
    const sheet = page.getByTestId('grower-page');
    await sheet
      .getByText(/linear-plateau, picked by the analyst instead of the quadratic/)
      .waitFor({
        timeout: 60_000,
      });
    // The page rounds the rate to 5 kg/ha for a spreader; the screen shows whole kg/ha.
    const printed = leadingNumber(await page.getByTestId('grower-recommendation').textContent());
    expect(Math.abs(printed - onScreen)).toBeLessThanOrEqual(2.5);
    // Back to the rule's model, so the steps after this one see the demo as it opens.
    await page.getByRole('button', { name: /One site/ }).click();
    await page.getByRole('radio', { name: 'Lead with Quadratic', exact: true }).check();
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('a file that is not a workbook gets a message naming it, and the other files stay open', async () => {
    const { page } = session;
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-bad-'));
    // Starts like a zip (as an .xlsx does) but is cut off: a damaged download.
    const file = path.join(dir, 'North field 2025.xlsx');
    await writeFile(file, Buffer.concat([Buffer.from('PK\x03\x04'), Buffer.alloc(200, 7)]));
    const notes = path.join(dir, 'Field notes.csv');
    await writeFile(notes, 'Walked the plots on Tuesday\nAll looked even\n');
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles([file, notes]);
    const alert = page.getByRole('alert').filter({ hasText: 'North field 2025.xlsx' }).first();
    await alert.waitFor({ timeout: 20_000 });
    await expect(alert.textContent()).resolves.toMatch(/could not|damaged|not .*workbook/i);
    await page.getByText('No plot data found in Field notes.csv').waitFor();
    await page.getByRole('button', { name: /Trial files/ }).click();
    await expect(page.getByText('Synthetic three sites.xlsx').count()).resolves.toBeGreaterThan(0);
    await shot(page, '07-bad-file');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('asks whether a column holds plot weights or yields, and the answer gives the right yields', async () => {
    const { page } = session;
    // Case 28 of the header corpus: "Grain yield" with no unit beside a plot-area column.
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-ask-'));
    const file = path.join(dir, 'Quillon weights.csv');
    await writeFile(
      file,
      await readFile(
        path.join(
          import.meta.dirname,
          '..',
          'fixtures',
          'import',
          'headers',
          '28-grain-yield-area-asks.csv',
        ),
      ),
    );
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles(file);
    await page.getByRole('button', { name: /Columns/ }).click();
    const question = page.locator('[data-testid^="question-"]');
    await question.waitFor({ timeout: 20_000 });
    await expect(question.textContent()).resolves.toMatch(/Plot weights or yields\?/);
    // Nothing is built from a guess: the table waits for the answer.
    await page.getByTestId('build-problem').waitFor();
    await shot(page, '07b-plot-weight-question');
    await question.getByRole('button', { name: /Plot weights in kg/ }).click();
    await question.waitFor({ state: 'detached' });
    await page.getByTestId('build-problem').waitFor({ state: 'detached' });
    // 7.1 kg from a 12 m² plot is 5,917 kg/ha: the first plot's yield in t/ha.
    const first = page.getByTestId('preview-row').filter({ hasText: 'Quillon Ridge' }).first();
    await expect(first.textContent()).resolves.toMatch(/5\.92/);
    // Undo brings the question back; redo answers it again.
    await page.getByRole('button', { name: /^Undo/ }).click();
    await question.waitFor();
    await page.getByRole('button', { name: /^Redo/ }).click();
    await question.waitFor({ state: 'detached' });
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('reads plot weights with the plot area typed in the import settings', async () => {
    const { page } = session;
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-area-'));
    const file = path.join(dir, 'Ash Mere weights.csv');
    // Invented: plot weights in kg with no area column; 6.2 kg from a 10 m² plot is 6,200 kg/ha.
    const rows = ['Site,Block,N rate (kg N/ha),Plot wt (kg)'];
    for (let b = 1; b <= 3; b++)
      for (const x of [0, 60, 120, 180])
        rows.push(`Ash Mere,${b},${x},${(6.2 + 0.02 * x).toFixed(2)}`);
    await writeFile(file, `${rows.join('\n')}\n`);
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles(file);
    await page.getByRole('button', { name: /Columns/ }).click();
    const problem = page.getByTestId('build-problem');
    await problem.waitFor({ timeout: 20_000 });
    await expect(problem.textContent()).resolves.toMatch(/gives plot weights .* plot area setting/);
    // The field takes the unit system's unit: 10 m² is 107.639104 ft² (1 ft = 0.3048 m, NIST SP 811).
    const field = page.getByTestId('plot-area');
    const inFeet = /ft²/.test((await field.locator('xpath=../..').textContent()) ?? '');
    await field.fill(inFeet ? '107.639104' : '10');
    await field.blur();
    await problem.waitFor({ state: 'detached' });
    await shot(page, '07d-plot-area-setting');
    const first = page.getByTestId('preview-row').filter({ hasText: 'Ash Mere' }).first();
    await expect(first.textContent()).resolves.toMatch(inFeet ? /98\.\d/ : /6\.2/);
    // The yield points back to the plot weight's cell it was worked out from.
    await expect(first.textContent()).resolves.toMatch(/D2 “6\.20”/);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('reads a sheet headed in words it does not know once the header row and roles are given', async () => {
    const { page } = session;
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-header-'));
    const file = path.join(dir, 'Holmbach Versuch.xlsx');
    // Invented: a title row, then German headers; yields in dt/ha.
    const rows: unknown[][] = [
      ['Feldversuch Holmbach 2025'],
      ['Standort', 'Wdh', 'N-Menge (kg N/ha)', 'Ertrag (dt/ha)'],
    ];
    for (let b = 1; b <= 3; b++)
      for (const x of [0, 60, 120, 180])
        rows.push(['Holmbach', b, x, 62.5 + 0.12 * Math.min(x, 120)]);
    await writeFile(file, await makeWorkbook([{ name: 'Versuch', rows }]));
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles(file);
    await page.getByRole('button', { name: /Columns/ }).click();
    const card = page.getByTestId('sheet-Versuch');
    await card.waitFor({ timeout: 20_000 });
    await expect(card.textContent()).resolves.toMatch(/no header row found/);
    await page.getByTestId('header-row-Versuch').fill('2');
    await page.getByTestId('header-row-Versuch').blur();
    await page.getByTestId('role-Versuch-A').selectOption('site');
    await page.getByTestId('role-Versuch-B').selectOption('block');
    await page.getByTestId('role-Versuch-D').selectOption('yield');
    // Giving a header row reads the sheet as plots.
    await expect(card.getByLabel('Use').inputValue()).resolves.toBe('plots');
    const first = page.getByTestId('preview-row').filter({ hasText: 'Holmbach' }).first();
    await first.waitFor({ timeout: 10_000 });
    // 1 dt = 100 kg: 62.5 dt/ha is 6,250 kg/ha, 99.6 bu/ac of corn (56 lb bushels, NIST SP 811 pound and acre).
    await expect(first.textContent()).resolves.toMatch(/6\.25 t\/ha|99\.6 bu\/ac/);
    await shot(page, '07e-header-row-given');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('fits 1024 px: the model table inside its panel, the ratio and risk tables apart', async () => {
    const { page } = session;
    await page.setViewportSize({ width: 1024, height: 768 });
    try {
      await page.getByRole('button', { name: /One site/ }).click();
      const table = page.getByTestId('model-table');
      await table.waitFor();
      const [tableBox, panelBox] = await Promise.all([
        table.boundingBox(),
        page.locator('section.panel', { has: table }).last().boundingBox(),
      ]);
      expect(tableBox!.x + tableBox!.width).toBeLessThanOrEqual(panelBox!.x + panelBox!.width);
      const ratio = (await page.getByTestId('site-ratio-table').boundingBox())!;
      const risk = (await page.getByTestId('site-risk-table').boundingBox())!;
      // Side by side without overlap, or one above the other.
      expect(ratio.x + ratio.width <= risk.x || ratio.y + ratio.height <= risk.y).toBe(true);
      await shot(page, '07c-one-site-1024');
    } finally {
      await page.setViewportSize({ width: 1360, height: 900 });
    }
  });

  it('keeps the work across a reload', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Prices/ }).click();
    await expect(page.getByTestId('product-price').inputValue()).resolves.toBe('1.2');
    // Let the session be written (it is kept a moment after the last change).
    await page.waitForTimeout(800);
    await page.reload();
    await page.getByTestId('product-price').waitFor({ timeout: 30_000 });
    await expect(page.getByTestId('product-price').inputValue()).resolves.toBe('1.2');
    await page.getByRole('button', { name: /Trial files/ }).click();
    await expect(page.getByText('Synthetic three sites.xlsx').count()).resolves.toBeGreaterThan(0);
    await shot(page, '08-after-reload');
    // After every step above (imports, exports, reload): no request left the local server.
    expect(session.offsiteRequests).toEqual([]);
  });

  it('in the browser build: saves the results JSON and a project file, and the project opens again', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Prices/ }).click();
    const onScreen = leadingNumber(await page.getByTestId('optimum-Quillmere North').textContent());
    await page.getByRole('button', { name: /Report/ }).click();
    await page.getByTestId('grower-page').waitFor({ timeout: 60_000 });
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-project-'));
    const [jsonDownload] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('export-json').click(),
    ]);
    const jsonPath = path.join(dir, jsonDownload.suggestedFilename());
    await jsonDownload.saveAs(jsonPath);
    expect(jsonPath).toMatch(/\.json$/);
    const results = JSON.parse(await readFile(jsonPath, 'utf8')) as {
      settings: { currency: string; units: { rate: string } };
      sites: { site: string; recommendation: { rate: number | null } }[];
    };
    // The workspace's prices start in USD (the illustrative prices); the JSON names it.
    expect(results.settings.currency).toBe('USD');
    expect(results.settings.units.rate).toBe('kg/ha');
    const site = results.sites.find((x) => x.site === 'Quillmere North')!;
    expect(Math.abs(site.recommendation.rate! - onScreen)).toBeLessThanOrEqual(0.5);

    // The regional profitable range reads the same on screen, on the grower page and in the JSON
    // (rates rounded by one rule: shared/units/rateRounding).
    const numbers = (text: string | null) =>
      [...(text ?? '').matchAll(/\d+/g)].map((m) => Number(m[0]));
    await page.getByTestId('page-for').selectOption('region');
    const pageRange = numbers(
      await page
        .getByTestId('grower-page')
        .locator('dt:text-is("Profitable range") + dd')
        .textContent(),
    );
    await page.getByRole('button', { name: /All sites/ }).click();
    const screenRange = numbers(await page.getByTestId('profitable-range').textContent()).slice(
      0,
      2,
    );
    const json = (
      results as unknown as { acrossSites: { profitableRange: [number, number] } }
    ).acrossSites.profitableRange.map(Math.round);
    expect(pageRange).toEqual(screenRange);
    expect(json).toEqual(screenRange);
    await page.getByRole('button', { name: /Report/ }).click();

    // The page's four fields, typed here, are printed under its title with its chart.
    await page.getByTestId('page-field-grower').fill('Ada Brinkwater');
    await page.getByTestId('page-field-field').fill('Long Acre');
    const addressed = page.getByTestId('page-addressed');
    await expect(addressed.textContent()).resolves.toMatch(
      /Grower: Ada Brinkwater.*Field: Long Acre/s,
    );
    await expect(page.getByTestId('grower-page-chart').locator('svg').count()).resolves.toBe(1);
    // Printed (Chromium's own PDF of the page): one sheet of Letter, with the fields and the chart.
    await page.emulateMedia({ media: 'print' });
    const printed = path.join(dir, 'printed.pdf');
    await page.pdf({ path: printed, format: 'Letter', printBackground: true });
    await page.emulateMedia({ media: 'screen' });
    const info = execFileSync('/usr/bin/pdfinfo', [printed]).toString();
    expect(info).toMatch(/Pages:\s+1\n/);
    const words = execFileSync('/usr/bin/pdftotext', [printed, '-']).toString();
    expect(words).toMatch(/Grower: Ada Brinkwater/);
    await shot(page, '06c-grower-page-fields');

    const [projectDownload] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('save-project').click(),
    ]);
    const projectPath = path.join(dir, projectDownload.suggestedFilename());
    await projectDownload.saveAs(projectPath);
    expect(projectPath).toMatch(/\.plotrate$/);
    await page.getByTestId('project-file-input').setInputFiles(projectPath);
    await page.getByText(`Opened ${path.basename(projectPath)}`).waitFor({ timeout: 30_000 });
    await page.getByRole('button', { name: /Prices/ }).click();
    await page.getByTestId('optimum-Quillmere North').waitFor({ timeout: 60_000 });
    const reopened = leadingNumber(await page.getByTestId('optimum-Quillmere North').textContent());
    expect(reopened).toBe(onScreen);
    await page.getByRole('button', { name: /Report/ }).click();
    await expect(page.getByTestId('page-field-grower').inputValue()).resolves.toBe(
      'Ada Brinkwater',
    );
    // A file that is not a project gets a message naming it; the work stays.
    const notProject = path.join(dir, 'notes.plotrate');
    await writeFile(notProject, 'these are my notes, not a project');
    await page.getByTestId('project-file-input').setInputFiles(notProject);
    await page.getByText('notes.plotrate could not be opened').waitFor({ timeout: 10_000 });
    await page.getByRole('button', { name: /Prices/ }).click();
    await expect(page.getByTestId('optimum-Quillmere North').count()).resolves.toBe(1);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
    expect(session.offsiteRequests).toEqual([]);
  });

  it('corrects a mistyped yield: listed with its cell, ringed on the chart, in the workbook, undone', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Quality/ }).click();
    const button = page.locator('[data-testid^="correct-button-"]').first();
    const plotId = (await button.getAttribute('data-testid'))!.replace('correct-button-', '');
    await button.click();
    const input = page.getByTestId(`correction-input-${plotId}`);
    await input.fill('7,77'); // either decimal mark is read
    await page
      .getByTestId('correct-value')
      .getByPlaceholder('e.g. decimal mark slipped')
      .fill('scale slip');
    await page.getByTestId('correct-value').getByRole('button', { name: 'Save' }).click();
    const list = page.getByTestId('corrections');
    await expect(list.textContent()).resolves.toMatch(
      /yield\s.* → 7\.77 t\/ha \(scale slip\); cell .* reads “/s,
    );
    await shot(page, '05e-value-corrected');
    // The one-site chart rings the corrected plot.
    const site = (await list.textContent())!
      .trim()
      .split(',')[0]
      .replace(/^Values you corrected \(\d+\)\s*/, '');
    await page.getByRole('button', { name: /One site/ }).click();
    await page.getByTestId('site-picker').selectOption(site);
    await page.locator('.legendtext', { hasText: 'Corrected value' }).waitFor({ timeout: 60_000 });
    // The workbook's provenance lists it with the cell's own text.
    await page.getByRole('button', { name: /Report/ }).click();
    await page.getByTestId('grower-page').waitFor({ timeout: 60_000 });
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('export-workbook').click(),
    ]);
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-correct-'));
    const saved = path.join(dir, download.suggestedFilename());
    await download.saveAs(saved);
    const book = new ExcelJS.Workbook();
    await book.xlsx.readFile(saved);
    const rows: string[] = [];
    book.getWorksheet('Provenance')!.eachRow((row) => {
      rows.push(
        (row.values as unknown[])
          .slice(1)
          .map((v) => String(v ?? ''))
          .join('|'),
      );
    });
    expect(rows.some((r) => r.includes('|yield|') && r.includes('|7770|scale slip|'))).toBe(true);
    // Undo takes the correction back.
    await page.getByRole('button', { name: /Quality/ }).click();
    await page.getByRole('button', { name: /^Undo Correct yield/ }).click();
    await expect(page.getByTestId('corrections').count()).resolves.toBe(0);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });
});
