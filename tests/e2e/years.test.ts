// Two years of the same invented sites end to end in chromium against the built renderer: the
// two-year fixture the year comparison is checked against R with
// (tests/fixtures/siteyears/siteYears.plots.csv), written as one CSV per harvest year and opened
// through the file input. The all-sites step shows, for each site, the sentence of the year test
// and each year's leading curve overlaid (shared/report/yearCurvesChart).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HARVEST_YEARS, harvestCsv } from '../siteYears.fixture';
import { openInsteadOfDemo, openSession, shot, type Session } from './harness';

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
    await openInsteadOfDemo(
      page,
      HARVEST_YEARS.map((year) => ({ name: `harvest ${year}.csv`, text: harvestCsv(year) })),
    );

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
