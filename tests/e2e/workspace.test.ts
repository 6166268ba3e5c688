// The workspace end to end in real chromium against the built renderer.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openSession, shot, type Session } from './harness';

let session: Session;

beforeAll(async () => {
  session = await openSession();
  await session.page.goto(session.url);
});
afterAll(async () => {
  await session?.close();
});

describe('the workspace in chromium', () => {
  it('opens on the demo trial the first time and shows a site chart', async () => {
    const { page } = session;
    await page.getByRole('navigation', { name: 'Steps' }).waitFor();
    const chart = page.locator('[data-testid="chart"] .main-svg').first();
    await chart.waitFor({ timeout: 30_000 });
    await page.getByTestId('site-optimum').waitFor();
    await expect(page.getByTestId('site-optimum').textContent()).resolves.toMatch(/\d+ kg\/ha/);
    await shot(page, '01-demo-site');
    expect(session.pageErrors).toEqual([]);
  });
});
