// `npm run screenshots`: the README's pictures, taken from the built renderer on
// the untouched demo trial in Debian's chromium (the same harness as the e2e tests).
import { copyFile } from 'node:fs/promises';
import path from 'node:path';
import { openSession, shot, SHOT_DIR } from '../tests/e2e/harness';

const out = path.join(import.meta.dirname, '..', 'docs', 'screenshots');
const session = await openSession();
try {
  const { page } = session;
  // The README's pictures at a desktop window's size (the e2e tests take every step at 1024 and 1440).
  await page.setViewportSize({ width: 1440, height: 900 });
  await page.goto(session.url);
  await page.getByTestId('site-optimum').waitFor({ timeout: 60_000 });
  await page.getByText(/90 % interval \d+ kg\/ha to \d+ kg\/ha/).waitFor({ timeout: 60_000 });
  await page.waitForTimeout(500);
  await shot(page, 'readme-one-site');
  await page.getByRole('button', { name: /All sites/ }).click();
  await page.getByText('Do the sites share a response?').waitFor();
  await page.waitForTimeout(500);
  await shot(page, 'readme-all-sites');
  await page.getByText('US', { exact: true }).click();
  await page.getByRole('button', { name: /Report/ }).click();
  await page.getByTestId('grower-page').waitFor({ timeout: 60_000 });
  await page.waitForTimeout(500);
  await shot(page, 'readme-grower-page');
  for (const name of ['one-site', 'all-sites', 'grower-page']) {
    await copyFile(path.join(SHOT_DIR, `readme-${name}.png`), path.join(out, `${name}.png`));
  }
  if (session.pageErrors.length > 0) console.error(session.pageErrors.join('\n'));
} finally {
  await session.close();
}
