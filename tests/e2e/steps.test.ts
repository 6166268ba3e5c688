// Every step of the workspace at the two window sizes a laptop and a desktop give (1024 × 768 and
// 1440 × 900), on the invented demo trial: each step drawn without an error, nothing wider than
// the window (no sideways scrolling), no request leaving the local server; a screenshot of each
// step at each size goes to test-output/e2e.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openSession, shot, type Session } from './harness';

let session: Session;
beforeAll(async () => {
  session = await openSession();
  await session.page.goto(session.url);
  await session.page.getByTestId('site-optimum').waitFor({ timeout: 60_000 });
});
afterAll(async () => {
  await session?.close();
});

const STEPS = [
  ['Trial files', 'files'],
  ['Columns', 'columns'],
  ['Quality', 'quality'],
  ['One site', 'site'],
  ['All sites', 'sites'],
  ['Prices', 'prices'],
  ['Report', 'report'],
] as const;

describe('groups of sites', () => {
  it('the all-sites step gives the regional rate per previous crop, the test between them and the cautions', async () => {
    const { page } = session;
    await page
      .getByRole('navigation', { name: 'Steps' })
      .getByRole('button', { name: /All sites/ })
      .click();
    const panel = page.getByTestId('groups-panel');
    await panel.waitFor({ timeout: 60_000 });
    // The invented demo's sites follow corn (4) or soybean (2).
    await expect(page.getByTestId('group-picker').inputValue()).resolves.toBe('Previous crop');
    const rows = panel.getByTestId('group-row');
    const cells = [];
    for (let i = 0; i < (await rows.count()); i++)
      cells.push(await rows.nth(i).locator('td').allTextContents());
    expect(cells.map((c) => c.slice(0, 2).join(' '))).toEqual(['corn 4', 'soybean 2']);
    for (const c of cells) {
      expect(c[2]).toMatch(/^\d+ kg\/ha$/);
      expect(c[3]).toMatch(/^\d+ kg\/ha to \d+ kg\/ha$/);
    }
    await expect(page.getByTestId('groups-differ').textContent()).resolves.toMatch(/p [=<]/);
    await expect(
      panel.getByText('Before you use this regional rate of a group').count(),
    ).resolves.toBe(1);
    await shot(page, 'groups-panel');
    // The report step offers a grower page per group.
    await page
      .getByRole('navigation', { name: 'Steps' })
      .getByRole('button', { name: /Report/ })
      .click();
    await page.getByTestId('page-for').selectOption({ label: 'Previous crop: soybean' });
    await expect(page.getByTestId('grower-page').locator('h1').textContent()).resolves.toBe(
      'Previous crop: soybean (2 sites)',
    );
    await expect(page.getByTestId('grower-recommendation').textContent()).resolves.toMatch(
      /Apply about \d+ kg N\/ha/,
    );
  });
});

describe('each step at 1024 × 768 and 1440 × 900', () => {
  for (const [width, height] of [
    [1024, 768],
    [1440, 900],
  ] as const) {
    it(`draws every step within ${width} px`, async () => {
      const { page } = session;
      await page.setViewportSize({ width, height });
      for (const [label, name] of STEPS) {
        await page
          .getByRole('navigation', { name: 'Steps' })
          .getByRole('button', { name: new RegExp(label) })
          .click();
        await page.waitForTimeout(400);
        await shot(page, `steps-${width}-${STEPS.findIndex((s) => s[1] === name) + 1}-${name}`);
        const overflow = await page.evaluate(
          () => document.documentElement.scrollWidth - document.documentElement.clientWidth,
        );
        if (overflow > 1) {
          // Name the widest culprits, so a failure says what to fix.
          const wide = await page.evaluate(() =>
            [...document.querySelectorAll('body *')]
              .filter(
                (el) => el.getBoundingClientRect().right > document.documentElement.clientWidth + 1,
              )
              .slice(-5)
              .map(
                (el) =>
                  `${el.tagName.toLowerCase()}.${el.className} ${Math.round(el.getBoundingClientRect().right)}`,
              ),
          );
          console.error(`${name} at ${width}: ${wide.join(' | ')}`);
        }
        expect(
          overflow,
          `${name} at ${width} px scrolls sideways by ${overflow} px`,
        ).toBeLessThanOrEqual(1);
      }
      expect(session.pageErrors.map((e) => e.slice(0, 300))).toEqual([]);
      expect(session.offsiteRequests).toEqual([]);
    });
  }
});
