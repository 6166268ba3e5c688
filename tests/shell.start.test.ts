// `npm start` when the Electron runtime is missing, run for real: scripts/start.mjs
// with PLOTRATE_ELECTRON_DIR pointing at an electron package folder made here,
// whose install.js records that it ran and then fails as an offline machine's does.
import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { chmod, mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import {
  RUNTIME_MISSING_MESSAGE,
  decideStart,
  electronRuntimePath,
} from '../scripts/startDecision.mjs';

const root = path.join(import.meta.dirname, '..');
let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(os.tmpdir(), 'plotrate-start-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

/** An electron package folder without its runtime; install.js writes what it saw and fails. */
async function electronWithoutRuntime(): Promise<string> {
  const electronDir = path.join(dir, 'electron');
  await mkdir(electronDir);
  await writeFile(path.join(electronDir, 'package.json'), '{"name":"electron","version":"45.3.4"}');
  await writeFile(
    path.join(electronDir, 'install.js'),
    `require('fs').writeFileSync(require('path').join(__dirname, 'installer-ran'), 'skip=' + (process.env.ELECTRON_SKIP_BINARY_DOWNLOAD ?? 'unset'));
     console.error('getaddrinfo ENOTFOUND github.com');
     process.exit(1);`,
  );
  return electronDir;
}

/** Give an electron folder a runtime the way electron's installer does: path.txt plus dist/<binary>. */
async function installRuntime(electronDir: string): Promise<string> {
  await mkdir(path.join(electronDir, 'dist'), { recursive: true });
  const binary = path.join(electronDir, 'dist', 'electron');
  await writeFile(binary, '#!/bin/sh\nexit 0\n');
  await chmod(binary, 0o755);
  await writeFile(path.join(electronDir, 'path.txt'), 'electron');
  return binary;
}

describe('npm start without the Electron runtime', () => {
  it('tries electron’s own installer once, then explains and points to npm run web', async () => {
    const electronDir = await electronWithoutRuntime();
    const run = spawnSync(process.execPath, [path.join(root, 'scripts/start.mjs')], {
      cwd: root,
      env: {
        ...process.env,
        PLOTRATE_ELECTRON_DIR: electronDir,
        ELECTRON_SKIP_BINARY_DOWNLOAD: '1',
      },
      encoding: 'utf8',
      timeout: 60_000,
    });
    expect(run.status).toBe(1);
    expect(run.stdout).toMatch(/fetching it once/);
    expect(run.stderr).toContain('npm run web');
    expect(run.stderr).toContain('Electron runtime');
    // The installer really ran, with the skip switch cleared so it would download.
    expect(await readFile(path.join(electronDir, 'installer-ran'), 'utf8')).toBe('skip=');
  });
});

describe('decideStart', () => {
  it('launches at once when the runtime is present, without running the installer', async () => {
    const electronDir = await electronWithoutRuntime();
    const binary = await installRuntime(electronDir);
    let installs = 0;
    const d = decideStart({
      electronDir,
      env: {},
      install: () => (installs++, 0),
      log: () => undefined,
    });
    expect(d).toEqual({ action: 'launch', binary, installed: false });
    expect(installs).toBe(0);
  });

  it('launches after the installer fetched the runtime', async () => {
    const electronDir = await electronWithoutRuntime();
    const binary = path.join(electronDir, 'dist', 'electron');
    const d = decideStart({
      electronDir,
      env: {},
      // Synchronous, like the real installer run through spawnSync.
      install: (folder) => {
        mkdirSync(path.join(folder, 'dist'));
        writeFileSync(binary, '');
        writeFileSync(path.join(folder, 'path.txt'), 'electron');
        return 0;
      },
      log: () => undefined,
    });
    expect(d).toEqual({ action: 'launch', binary, installed: true });
  });

  it('explains with the installer’s status when it could not fetch the runtime', async () => {
    const electronDir = await electronWithoutRuntime();
    const d = decideStart({ electronDir, env: {}, install: () => 1, log: () => undefined });
    expect(d).toEqual({ action: 'explain', message: RUNTIME_MISSING_MESSAGE, installerStatus: 1 });
  });

  it('treats a path.txt whose binary is gone as missing', async () => {
    const electronDir = await electronWithoutRuntime();
    await writeFile(path.join(electronDir, 'path.txt'), 'electron');
    expect(electronRuntimePath(electronDir, {})).toBeNull();
  });

  it('honours ELECTRON_OVERRIDE_DIST_PATH, as electron’s own index.js does', async () => {
    const electronDir = await electronWithoutRuntime();
    const custom = path.join(dir, 'custom-dist');
    await mkdir(custom);
    await writeFile(path.join(custom, 'electron'), '');
    expect(electronRuntimePath(electronDir, { ELECTRON_OVERRIDE_DIST_PATH: custom })).toBe(
      path.join(custom, 'electron'),
    );
  });
});
