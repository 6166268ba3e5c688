// Two years of the same invented sites end to end in chromium against the built renderer: the
// two-year fixture the year comparison is checked against R with
// (tests/fixtures/siteyears/siteYears.plots.csv), written as one CSV per harvest year and opened
// through the file input. The all-sites step shows, for each site, the sentence of the year test
// and each year's leading curve overlaid (shared/report/yearCurvesChart).
import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readRCsv } from '../analysis.fixtures';
import { openSession, shot, type Session } from './harness';

let session: Session;

beforeAll(async () => {
  session = await openSession();
  await session.page.goto(session.url);
});
afterAll(async () => {
  await session?.close();
});

describe('two years of the same sites in chromium', () => {
  it('opens both years, then compares each site’s years with their curves overlaid', async () => {
    const { page } = session;
    await page.getByRole('navigation', { name: 'Steps' }).waitFor();
    await page.locator('[data-testid="chart"] .main-svg').first().waitFor({ timeout: 30_000 });
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-years-'));
    const rows = readRCsv('../siteyears/siteYears.plots.csv');
    const files: string[] = [];
    for (const year of ['2024', '2025']) {
      const lines = ['Site,Year,Block,Plot,N rate (kg N/ha),Yield (kg/ha)'];
      for (const r of rows.filter((x) => x.year === year))
        lines.push([r.site, r.year, r.block, r.plot, r.rate, r.yield].join(','));
      const file = path.join(dir, `harvest ${year}.csv`);
      await writeFile(file, lines.join('\n') + '\n');
      files.push(file);
    }
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles(files);
    await page.getByText('harvest 2025.csv').first().waitFor({ timeout: 20_000 });
    await page.getByRole('button', { name: /Trial files/ }).click();
    const closeDemo = page.getByRole('button', { name: /^Close wrenhollow-n-trials/ });
    await closeDemo.click();
    await closeDemo.waitFor({ state: 'detached' });

    await page.getByRole('button', { name: /All sites/ }).click();
    const panel = page.getByTestId('years-compared');
    await panel.waitFor({ timeout: 90_000 });
    const sentences = panel.getByTestId('years-sentence');
    await expect.poll(() => sentences.count()).toBe(2);
    const texts = await sentences.allTextContents();
    expect(texts.some((t) => t.startsWith('Wrenfield, 2024 and 2025'))).toBe(true);
    expect(texts.some((t) => t.startsWith("Hobb's Reach, 2024 and 2025"))).toBe(true);
    const charts = panel.getByTestId('chart');
    await expect.poll(() => charts.count()).toBe(2);
    await charts.nth(1).locator('.main-svg').first().waitFor();
    const traces = await charts
      .nth(1)
      .evaluate((el) =>
        ((el as unknown as { data?: { name?: string; mode?: string }[] }).data ?? []).map(
          (t) => `${t.mode}: ${t.name}`,
        ),
      );
    // Each year: its leading curve and its 24 plots (4 blocks × 6 rates).
    expect(traces.filter((t) => t.startsWith('lines: '))).toEqual([
      expect.stringMatching(/^lines: 2024 \(/),
      expect.stringMatching(/^lines: 2025 \(/),
    ]);
    expect(traces.filter((t) => t.startsWith('markers: '))).toEqual([
      'markers: 2024 plots',
      'markers: 2025 plots',
    ]);
    await panel.scrollIntoViewIfNeeded();
    await shot(page, 'years-compared');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });
});
