// Browser bench, headless chromium against the built renderer.
// 1. The first analysis of the demo: navigation start to the frame after its first site's optimum
//    is on the page, timed inside the page (a wait from outside polls a main thread that is busy
//    drawing, and read 0.3–0.5 s late), production build, a fresh profile each run.
// 2. With 50 fitted sites (PLOTRATE_BENCH_SITES=500 for more), the time from a price change to the
//    redrawn optimum and charts. Measured inside the page: from dispatching the price field's
//    input event to the frame after every chart on screen has finished Plotly's redraw.
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { syntheticWorkbook } from '../shared/demo/syntheticTrial';
import { buildRenderer, launchChromium, openSession, serveStatic } from '../tests/e2e/harness';

const SITES = Number(process.env.PLOTRATE_BENCH_SITES ?? 50);
const REPEATS = 21;
/** Runs of the demo's first analysis, each in a new browser with a fresh profile. */
const FIRST_RUNS = 5;
/**
 * Pause between starting the browser and opening the page. Chromium's own start-up (it builds
 * its address-bar pages in a renderer of their own: about 1.2 s of CPU in a trace, on this
 * machine's two cores) otherwise competes with the page; the desktop shell has no address bar.
 */
const BROWSER_SETTLE_MS = 3_000;
/** A price change whose charts have not redrawn after this long is reported, not waited for. */
const MISSED_MS = 10_000;

/**
 * Changes the product price REPEATS times and returns each time to redraw, ms, and the prices
 * after which a chart did not redraw within MISSED_MS (a change that draws nothing would
 * otherwise hold the bench forever).
 */
async function timePriceChanges(
  page: Page,
  charts: number,
): Promise<{ times: number[]; missed: string[] }> {
  return page.evaluate(
    async ({ repeats, charts, missedMs }) => {
      const input = document.querySelector<HTMLInputElement>('[data-testid="product-price"]');
      const plots = [...document.querySelectorAll('[data-testid="chart"]')].slice(
        0,
        charts,
      ) as (HTMLElement & {
        on(event: string, fn: () => void): void;
        removeAllListeners(event: string): void;
      })[];
      if (!input || plots.length < charts) throw new Error('price field or charts missing');
      const times: number[] = [];
      const missed: string[] = [];
      for (let i = 0; i < repeats; i++) {
        const drawn = plots.map(
          (gd) =>
            new Promise<void>((resolve) => {
              gd.removeAllListeners('plotly_afterplot');
              gd.on('plotly_afterplot', () => resolve());
            }),
        );
        const t0 = performance.now();
        input.value = (0.9 + 0.4 * (i % 2) + 0.01 * i).toFixed(2);
        input.dispatchEvent(new Event('input', { bubbles: true }));
        const late = new Promise<'late'>((resolve) => setTimeout(() => resolve('late'), missedMs));
        if ((await Promise.race([Promise.all(drawn), late])) === 'late') {
          missed.push(input.value);
          continue;
        }
        await new Promise((resolve) => requestAnimationFrame(() => resolve(null)));
        times.push(performance.now() - t0);
        await new Promise((resolve) => setTimeout(resolve, 30));
      }
      return { times, missed };
    },
    { repeats: REPEATS, charts, missedMs: MISSED_MS },
  );
}

function summary(label: string, times: number[]): void {
  const sorted = [...times].sort((a, b) => a - b);
  const q = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))];
  console.log(
    `${label}: median ${q(0.5).toFixed(1)} ms, p90 ${q(0.9).toFixed(1)} ms, max ${sorted.at(-1)!.toFixed(1)} ms (${times.length} changes)`,
  );
}

/**
 * Opens the page and times, inside it, navigation start to the frame after the first site's
 * optimum is on it (the demo is read and fitted in the page's worker).
 * @returns ms from navigation start
 */
async function timeFirstOptimum(page: Page, url: string): Promise<number> {
  await page.addInitScript(() => {
    const w = window as unknown as { firstOptimumMs: number | null };
    w.firstOptimumMs = null;
    new MutationObserver((_, observer) => {
      if (!document.querySelector('[data-testid="site-optimum"]')) return;
      observer.disconnect();
      requestAnimationFrame(() => (w.firstOptimumMs = performance.now()));
    }).observe(document, { childList: true, subtree: true });
  });
  await page.goto(url);
  const first = await page.waitForFunction(
    () => (window as unknown as { firstOptimumMs: number | null }).firstOptimumMs,
    undefined,
    { timeout: 300_000 },
  );
  return Number(await first.jsonValue());
}

/** Median and range of ms figures, for one line of the report. */
function spread(times: number[]): string {
  const sorted = [...times].sort((a, b) => a - b);
  const ms = (t: number) => Math.round(t).toString();
  return `median ${ms(sorted[Math.floor(sorted.length / 2)])} ms (${sorted.map(ms).join(', ')})`;
}

/**
 * The demo's first analysis from the production build, FIRST_RUNS new browsers each way: opened
 * once the browser has started, and opened as it starts.
 */
async function timeDemo(): Promise<void> {
  const dist = await buildRenderer(true);
  const { server, url } = await serveStatic(dist);
  try {
    for (const settleMs of [BROWSER_SETTLE_MS, 0]) {
      const times: number[] = [];
      for (let i = 0; i < FIRST_RUNS; i++) {
        const profile = await mkdtemp(path.join(tmpdir(), 'plotrate-bench-profile-'));
        const context = await launchChromium(profile);
        try {
          await new Promise((resolve) => setTimeout(resolve, settleMs));
          const page = context.pages()[0] ?? (await context.newPage());
          times.push(await timeFirstOptimum(page, url));
        } finally {
          await context.close();
          await rm(profile, { recursive: true, force: true });
        }
      }
      const when =
        settleMs > 0 ? `${settleMs / 1000} s after the browser started` : 'as the browser starts';
      console.log(
        `first analysis of the demo (production build, fresh profile), navigation start to the frame after its first optimum, page opened ${when}: ${spread(times)}`,
      );
    }
  } finally {
    await new Promise((resolve) => server.close(resolve));
    await rm(dist, { recursive: true, force: true });
  }
}

export async function run(): Promise<void> {
  await timeDemo();
  const session = await openSession();
  const { page } = session;
  try {
    await page.goto(session.url);
    await page.getByTestId('site-optimum').waitFor({ timeout: 300_000 });
    // Replace the demo with the synthetic sites.
    await page.getByRole('button', { name: /Trial files/ }).click();
    await page.getByRole('button', { name: /^Close wrenhollow/ }).click();
    const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-bench-'));
    const file = path.join(dir, `Synthetic ${SITES} sites.xlsx`);
    await writeFile(file, await syntheticWorkbook({ sites: SITES, seed: 3 }));
    const t0 = Date.now();
    await page.getByTestId('trial-file-input').setInputFiles(file);
    await page.getByTestId('sheet-Plots').waitFor({ timeout: 300_000 });
    await page.getByRole('button', { name: /Prices/ }).click();
    await page
      .getByTestId(`optimum-Site ${String(SITES).padStart(4, '0')}`)
      .waitFor({ timeout: 300_000 });
    console.log(
      `read, mapped and fitted ${SITES} sites in the worker, the last one's optimum shown: ${Date.now() - t0} ms`,
    );
    await page.getByText('Ready').waitFor({ timeout: 600_000 });
    console.log(`… and resampled, with the regional models (Ready): ${Date.now() - t0} ms`);

    // The prices step has no chart: time to the re-priced table of the optima.
    const tableTimes = await page.evaluate(async (repeats) => {
      const input = document.querySelector<HTMLInputElement>('[data-testid="product-price"]')!;
      const times: number[] = [];
      for (let i = 0; i < repeats; i++) {
        const t0 = performance.now();
        input.value = (0.9 + 0.4 * (i % 2) + 0.01 * i).toFixed(2);
        input.dispatchEvent(new Event('input', { bubbles: true }));
        await new Promise((resolve) => requestAnimationFrame(() => resolve(null)));
        times.push(performance.now() - t0);
      }
      return times;
    }, REPEATS);
    summary(`prices step, ${SITES} site optima and regional rate re-priced`, tableTimes);

    // The chart steps carry the same price fields above their charts.
    for (const [step, charts] of [
      ['One site', 1],
      // The regional return chart; the overlaid curves depend on the leading models only.
      ['All sites', 1],
    ] as const) {
      await page.getByRole('button', { name: new RegExp(step) }).click();
      await page
        .locator('[data-testid="chart"] .main-svg')
        .nth(charts - 1)
        .waitFor();
      await page.getByText('Ready').waitFor({ timeout: 600_000 });
      const { times, missed } = await timePriceChanges(page, charts);
      summary(`${step} step, price change to redrawn optimum and charts`, times);
      if (missed.length > 0)
        console.log(
          `${step} step: no redraw within ${MISSED_MS / 1000} s after the price was set to ${missed.join(', ')}`,
        );
    }
  } catch (error) {
    await page.screenshot({ path: path.join(tmpdir(), 'plotrate-bench-failure.png') });
    throw error;
  } finally {
    await session.close();
  }
}
