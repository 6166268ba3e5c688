// Twelve rate × timing site-years end to end in chromium against the built renderer: the invented
// 'differ' set of tests/fixtures/levelmixed (the project's seeded level generator; the split
// timing's true plateau 700 kg/ha higher and its join 15 kg N/ha earlier at every site-year, the
// fixture R's nlme is checked on), opened through the file input. Known truth: the timings'
// regional curves differ, so the regional model by level must say so, with each timing's rate.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { levelMixedCsv } from '../levelMixed.fixture';
import { openInsteadOfDemo, openSession, shot, type Session } from './harness';

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
    await openInsteadOfDemo(page, [{ name: 'timing series.csv', text: levelMixedCsv('differ') }]);

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
