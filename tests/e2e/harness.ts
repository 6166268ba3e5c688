// End-to-end harness: build the renderer with Vite's JS API into a temporary
// folder, serve it from 127.0.0.1 with a small static server, and drive
// Debian's chromium headless through playwright-core (no browser download).
import { createServer, type Server } from 'node:http';
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { build } from 'vite';
import { CONTENT_SECURITY_POLICY } from '../../electron/contentSecurityPolicy';

const root = path.resolve(import.meta.dirname, '../..');
/** Screenshots of each step land here (git-ignored). */
export const SHOT_DIR = path.join(root, 'test-output', 'e2e');

const contentTypes: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.xlsx': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
};

/**
 * Builds the renderer into a fresh temporary folder (never dist/, which other
 * work may be using at the same time).
 * @param minify - minify as the production build does (default false: readable stack traces)
 * @returns the folder holding index.html
 */
export async function buildRenderer(minify = false): Promise<string> {
  const outDir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-build-'));
  await build({
    configFile: path.join(root, 'vite.config.ts'),
    logLevel: 'warn',
    build: { outDir, emptyOutDir: true, minify, reportCompressedSize: false },
  });
  return outDir;
}

/**
 * Starts Debian's chromium headless on its own profile folder, with the flags every browser run
 * here uses (no sandbox, GPU, network services or first-run pages).
 * @param userDataDir - a fresh folder for the profile
 * @returns the browser context (a persistent context is playwright's way to set --user-data-dir)
 */
export function launchChromium(userDataDir: string): Promise<BrowserContext> {
  return chromium.launchPersistentContext(userDataDir, {
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
    viewport: { width: 1360, height: 900 },
    locale: 'en-US',
    timezoneId: 'UTC',
    acceptDownloads: true,
  });
}

/**
 * Serves a folder on 127.0.0.1 at a free port.
 * @param dir - the folder
 * @returns the server and its base URL
 */
export async function serveStatic(dir: string): Promise<{ server: Server; url: string }> {
  const server = createServer((request, response) => {
    const urlPath = decodeURIComponent(new URL(request.url ?? '/', 'http://x').pathname);
    const file = path.join(dir, urlPath === '/' ? 'index.html' : urlPath);
    if (!file.startsWith(dir)) {
      response.writeHead(403).end();
      return;
    }
    readFile(file).then(
      (body) => {
        response.writeHead(200, {
          'content-type': contentTypes[path.extname(file)] ?? 'application/octet-stream',
          // The policy the desktop shell sends, so a page that breaks it fails here too
          // (Chromium logs each refusal as a console error, which pageErrors collects).
          'content-security-policy': CONTENT_SECURITY_POLICY,
        });
        response.end(body);
      },
      () => response.writeHead(404).end('not found'),
    );
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const address = server.address();
  if (!address || typeof address === 'string') throw new Error('server has no port');
  return { server, url: `http://127.0.0.1:${address.port}/` };
}

/** A running browser session against the built renderer. */
export interface Session {
  context: BrowserContext;
  page: Page;
  url: string;
  /** Errors the page logged or threw; a test asserts this stays empty. */
  pageErrors: string[];
  /** Every request that left the local server (not data: or blob:); trial data stays on the computer. */
  offsiteRequests: string[];
  close(): Promise<void>;
}

/**
 * Builds, serves and opens the renderer in headless chromium.
 * @returns the session; call close() in afterAll
 */
export async function openSession(): Promise<Session> {
  const dist = await buildRenderer();
  const { server, url } = await serveStatic(dist);
  const userDataDir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-profile-'));
  const context = await launchChromium(userDataDir);
  const page = context.pages()[0] ?? (await context.newPage());
  const pageErrors: string[] = [];
  page.on('pageerror', (error) => pageErrors.push(error.message));
  const offsiteRequests: string[] = [];
  context.on('request', (request) => {
    const target = request.url();
    if (!target.startsWith(url) && !/^(data|blob):/.test(target)) offsiteRequests.push(target);
  });
  page.on('response', (response) => {
    if (response.status() >= 400) pageErrors.push(`${response.status()} ${response.url()}`);
  });
  page.on('console', (message) => {
    // "Failed to load resource" repeats the response line above with less detail.
    if (message.type() === 'error' && !message.text().startsWith('Failed to load resource')) {
      pageErrors.push(message.text());
    }
  });
  await mkdir(SHOT_DIR, { recursive: true });
  return {
    context,
    page,
    url,
    pageErrors,
    offsiteRequests,
    async close() {
      await context.close();
      await new Promise((resolve) => server.close(resolve));
      await rm(dist, { recursive: true, force: true });
      await rm(userDataDir, { recursive: true, force: true });
    },
  };
}

/**
 * Saves a full-page screenshot under test-output/e2e/.
 * @param page - the page
 * @param name - file name without extension, e.g. "01-demo"
 */
export async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: path.join(SHOT_DIR, `${name}.png`), fullPage: true });
}

/**
 * Opens trial files through the file input in place of the demo trial the first visit opens:
 * waits for the demo, writes the files to a temporary folder, opens them, then closes the demo.
 * @param page - the page, on the workspace
 * @param files - each file's name and text
 */
export async function openInsteadOfDemo(
  page: Page,
  files: readonly { name: string; text: string }[],
): Promise<void> {
  await page.getByRole('navigation', { name: 'Steps' }).waitFor();
  await page.locator('[data-testid="chart"] .main-svg').first().waitFor({ timeout: 30_000 });
  const dir = await mkdtemp(path.join(tmpdir(), 'plotrate-e2e-files-'));
  const paths: string[] = [];
  for (const f of files) {
    const file = path.join(dir, f.name);
    await writeFile(file, f.text);
    paths.push(file);
  }
  await page.getByRole('button', { name: /Trial files/ }).click();
  await page.getByTestId('trial-file-input').setInputFiles(paths);
  await page
    .getByText(files[files.length - 1].name)
    .first()
    .waitFor({ timeout: 20_000 });
  // Opening a file shows its columns; the file list is on the first step.
  await page.getByRole('button', { name: /Trial files/ }).click();
  const closeDemo = page.getByRole('button', { name: /^Close wrenhollow-n-trials/ });
  await closeDemo.click();
  await closeDemo.waitFor({ state: 'detached' });
}
