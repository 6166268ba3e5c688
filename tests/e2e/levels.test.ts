// A rate × timing trial end to end in chromium against the built renderer: the demo's invented
// timing file (shared/demo/demoTiming, the seeded generator; `plotrate demo` writes the same
// bytes as demo/wrenhollow-timing-2025.csv) opened through the file input. Its known truth: at
// Larkspur Bottom the split application has the higher plateau (13,500 against 12,600 kg/ha) and
// the lower optimum, so the split returns more; each timing has 20 fertilized plots and the 4
// zero-rate checks (one per block) are shared by both.
import { mkdtemp } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoTimingCsv, demoTimingFileName } from '../../shared/demo/demoTiming';
import { recommendationCautions } from '../../shared/economics/recommendationCautions';
import { openInsteadOfDemo, openSession, shot, type Session } from './harness';

let session: Session;

beforeAll(async () => {
  session = await openSession();
  await session.page.goto(session.url);
});
afterAll(async () => {
  await session?.close();
});

/** The traces Plotly drew in the levels chart: name, mode and point count. */
async function levelTraces(): Promise<{ name: string; mode: string; n: number }[]> {
  const chart = session.page.getByTestId('levels-panel').getByTestId('chart');
  return chart.evaluate((el) =>
    (
      (el as unknown as { data?: { name?: string; mode?: string; x?: unknown[] }[] }).data ?? []
    ).map((t) => ({ name: t.name ?? '', mode: t.mode ?? '', n: t.x?.length ?? 0 })),
  );
}

describe('a rate × timing trial in chromium', () => {
  it('opens the timing file through the file input, alone', async () => {
    const { page } = session;
    await openInsteadOfDemo(page, [{ name: demoTimingFileName, text: demoTimingCsv() }]);
    await page.getByRole('button', { name: /Columns/ }).click();
    // 2 sites × (4 checks + 2 timings × 5 rates × 4 blocks) plots.
    await expect
      .poll(async () => page.getByTestId('table-summary').textContent(), { timeout: 20_000 })
      .toMatch(/\b88 plots at 2 sites/);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('draws one curve per timing over the shared checks, with each timing’s rate and the level test', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /One site/ }).click();
    await page.getByTestId('site-picker').selectOption('Larkspur Bottom');
    const panel = page.getByTestId('levels-panel');
    await panel.waitFor({ timeout: 90_000 });
    await panel.locator('[data-testid="chart"] .main-svg').first().waitFor();
    // The bootstrap intervals arrive with the analysis: each timing's row has one.
    const rows = panel.getByTestId('level-row');
    await expect.poll(() => rows.count()).toBe(2);
    await expect.poll(() => rows.nth(0).textContent()).toMatch(/\d+ kg\/ha to \d+ kg\/ha/);
    const traces = await levelTraces();
    const curves = traces.filter((t) => t.mode === 'lines').map((t) => t.name);
    expect(curves).toEqual([
      expect.stringMatching(/^At planting \(/),
      expect.stringMatching(/^Split \(V6\) \(/),
    ]);
    const points = Object.fromEntries(
      traces.filter((t) => t.mode === 'markers').map((t) => [t.name, t.n]),
    );
    expect(points).toEqual({
      'At planting plots': 20,
      'Split (V6) plots': 20,
      'Shared check plots (0 N)': 4,
    });
    await expect(panel.getByTestId('level-test').textContent()).resolves.toMatch(
      /^One quadratic per timing level .*: F = [\d.]+ on 2 and \d+ df, p [<=] [\d.]+; at the 5% level /,
    );
    await expect(panel.getByTestId('best-level').textContent()).resolves.toMatch(
      /^Split \(V6\) returns the most at its own recommended rate \(\d+ kg\/ha\)/,
    );
    await expect(rows.filter({ hasText: 'returns most' }).textContent()).resolves.toMatch(
      /^\s*Split \(V6\)/,
    );
    // The usual cautions stand beside the rates.
    await expect(panel.getByText(recommendationCautions[0]).isVisible()).resolves.toBe(true);
    await panel.scrollIntoViewIfNeeded();
    await page.waitForTimeout(300);
    await shot(page, 'levels-01-overlaid');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('the level picker draws one timing alone with its rate and interval, and back', async () => {
    const { page } = session;
    const panel = page.getByTestId('levels-panel');
    const picker = panel.getByTestId('level-picker');
    await expect(picker.locator('option').allTextContents()).resolves.toEqual([
      'all timing levels overlaid',
      'At planting alone',
      'Split (V6) alone',
    ]);
    await picker.selectOption('Split (V6)');
    await expect
      .poll(async () => (await levelTraces()).map((t) => t.name))
      .toEqual([
        expect.stringMatching(/^Split \(V6\) \(/),
        'Split (V6) plots',
        'Shared check plots (0 N)',
      ]);
    // The recommended rate's line and its interval's band.
    await expect
      .poll(() => panel.locator('[data-testid="chart"] .shapelayer path').count())
      .toBeGreaterThanOrEqual(2);
    await expect(panel.getByText(/^Split \(V6\): \d+$/).count()).resolves.toBe(1);
    await page.waitForTimeout(300);
    await shot(page, 'levels-02-one-timing');
    await picker.selectOption('');
    await expect.poll(async () => (await levelTraces()).length).toBe(5);
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it('the grower page names the better timing', async () => {
    const { page } = session;
    await page.getByRole('button', { name: /Report/ }).click();
    await page.getByTestId('page-for').selectOption('Larkspur Bottom');
    const sheet = page.getByTestId('grower-page');
    await sheet.waitFor({ timeout: 60_000 });
    await expect
      .poll(() => sheet.textContent(), { timeout: 20_000 })
      .toMatch(/Split \(V6\) returns the most at its own recommended rate/);
    await expect(sheet.textContent()).resolves.toMatch(/Timing: At planting/);
    await page.waitForTimeout(300);
    await shot(page, 'levels-03-grower-page');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });

  it("exports a workbook whose Levels by Timing sheet carries each site's levels chart", async () => {
    const { page } = session;
    const [download] = await Promise.all([
      page.waitForEvent('download', { timeout: 60_000 }),
      page.getByTestId('export-workbook').click(),
    ]);
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-levels-download-'));
    const saved = path.join(dir, download.suggestedFilename());
    await download.saveAs(saved);
    // Read back with exceljs: one picture per site, a PNG (its signature, PNG spec §5.2).
    const book = new ExcelJS.Workbook();
    await book.xlsx.readFile(saved);
    const sheet = book.getWorksheet('Levels by Timing')!;
    const images = sheet.getImages();
    expect(images).toHaveLength(2);
    for (const im of images) {
      const png = Buffer.from(book.getImage(Number(im.imageId)).buffer as ArrayBuffer);
      expect(png.subarray(0, 8)).toEqual(Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]));
    }
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });
});
