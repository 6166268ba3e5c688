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
  it('opens with the step rail and no page errors', async () => {
    const { page } = session;
    await page.getByRole('navigation', { name: 'Steps' }).waitFor();
    await expect(page.getByRole('button', { name: /Trial files/ }).count()).resolves.toBe(1);
    await shot(page, '00-frame');
    expect(session.pageErrors).toEqual([]);
  });

  it('reads the demo workbook in the worker', async () => {
    const { page } = session;
    await page.getByRole('button', { name: 'Open the demo trial' }).click();
    await page.getByText(/\d+ sheets/).waitFor({ timeout: 20_000 });
    await shot(page, '01-demo-read');
    expect(session.pageErrors).toEqual([]);
  });
});
