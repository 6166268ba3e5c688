// Twelve rate × timing site-years end to end in chromium against the built renderer: the invented
// 'differ' set of tests/fixtures/levelmixed (the project's seeded level generator; the split
// timing's true plateau 700 kg/ha higher and its join 15 kg N/ha earlier at every site-year, the
// fixture R's nlme is checked on), opened through the file input. Known truth: the timings'
// regional curves differ, so the regional model by level must say so, with each timing's rate.
import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { levelMixedCsv } from '../levelMixed.fixture';
import { openSession, shot, type Session } from './harness';

let session: Session;

beforeAll(async () => {
  session = await openSession();
  await session.page.goto(session.url);
});
afterAll(async () => {
  await session?.close();
});

describe('a series of rate × timing site-years in chromium', () => {
  it('says on the one-site step that the regional curves of the timings differ, with each timing’s regional rate', async () => {
    const { page } = session;
    await page.getByRole('navigation', { name: 'Steps' }).waitFor();
    await page.locator('[data-testid="chart"] .main-svg').first().waitFor({ timeout: 30_000 });
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-levelmixed-'));
    const file = path.join(dir, 'timing series.csv');
    await writeFile(file, levelMixedCsv('differ'));
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByTestId('trial-file-input').setInputFiles(file);
    await page.getByText('timing series.csv').first().waitFor({ timeout: 20_000 });
    // Opening a file shows its columns; the file list is on the first step.
    await page.getByRole('button', { name: /Trial files/ }).click();
    const closeDemo = page.getByRole('button', { name: /^Close wrenhollow-n-trials/ });
    await closeDemo.click();
    await closeDemo.waitFor({ state: 'detached' });

    await page.getByRole('button', { name: /One site/ }).click();
    const panel = page.getByTestId('levels-panel');
    await panel.waitFor({ timeout: 120_000 });
    const regional = panel.getByTestId('level-regional');
    await regional.waitFor({ timeout: 120_000 });
    const text = (await regional.textContent()) ?? '';
    expect(text).toMatch(
      /^Across 12 site-years, the regional curves of the Timing levels differ \(likelihood ratio χ² = [\d.]+ on 2 df, p < 0\.001\)\. Regional rate at each level's own price: /,
    );
    for (const timing of ['At planting', 'Split'])
      expect(text).toMatch(
        new RegExp(`${timing} \\d+ kg/ha \\(90 % interval \\d+ kg/ha to \\d+ kg/ha\\)`),
      );
    // One factor at the site: no line on how factors meet.
    await expect(panel.getByTestId('level-crossing').count()).resolves.toBe(0);
    await regional.scrollIntoViewIfNeeded();
    await shot(page, 'levelmixed-01-regional');
    expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
  });
});
