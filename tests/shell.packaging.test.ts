// electron-builder.yml checked by electron-builder's own loader and schema
// validator (app-builder-lib, installed with electron-builder), without
// building packages: that needs the Electron runtime, absent here.
import { spawnSync } from 'node:child_process';
import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { getConfig, validateConfiguration } from 'app-builder-lib/out/util/config/config';
import { DebugLogger } from 'builder-util/out/DebugLogger';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PROJECT_FILE_EXTENSION } from '../shared/project/projectFormat';

const root = path.join(import.meta.dirname, '..');
let scratch: string;
beforeAll(async () => {
  scratch = await mkdtemp(path.join(os.tmpdir(), 'plotrate-builder-'));
});
afterAll(async () => {
  await rm(scratch, { recursive: true, force: true });
});

/** Width and height from a PNG's IHDR chunk (PNG specification, section 11.2.2). */
function pngSize(bytes: Buffer): { width: number; height: number } {
  expect(bytes.subarray(0, 8)).toEqual(
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
  );
  expect(bytes.subarray(12, 16).toString('latin1')).toBe('IHDR');
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

describe('electron-builder.yml', () => {
  it('passes electron-builder’s own schema validation', async () => {
    const config = await getConfig(root, path.join(root, 'electron-builder.yml'), null);
    await expect(validateConfiguration(config, new DebugLogger(false))).resolves.toBeUndefined();
  });

  it('names the app, builds AppImage and deb, NSIS and dmg, and registers the project file type', async () => {
    const config = await getConfig(root, path.join(root, 'electron-builder.yml'), null);
    expect(config.appId).toBe('org.plotrate.desktop');
    expect(config.productName).toBe('Plotrate');
    expect(config.linux?.target).toEqual(['AppImage', 'deb']);
    expect(config.win?.target).toEqual(['nsis']);
    expect(config.mac?.target).toEqual(['dmg']);
    const associations = [config.fileAssociations].flat();
    expect(associations.map((a) => a?.ext)).toEqual([PROJECT_FILE_EXTENSION]);
    // The loader normalizes the list to [{ filter: [...] }].
    const files = [config.files]
      .flat()
      .flatMap((f) => (typeof f === 'string' ? [f] : ((f as { filter?: string[] })?.filter ?? [])));
    expect(files).toEqual(
      expect.arrayContaining(['dist/renderer/**', 'dist-electron/**', 'package.json']),
    );
    expect(config.electronFuses).toMatchObject({
      runAsNode: false,
      onlyLoadAppFromAsar: true,
      grantFileProtocolExtraPrivileges: false,
    });
  });

  it('is refused by the same validator when a key is wrong, so the check above can fail', async () => {
    const bad = path.join(scratch, 'bad.yml');
    const good = await readFile(path.join(root, 'electron-builder.yml'), 'utf8');
    expect(good).toContain('  executableName: plotrate\n');
    await writeFile(
      bad,
      good.replace('  executableName: plotrate\n', '  executableNam: plotrate\n'),
    );
    const config = await getConfig(root, bad, null);
    await expect(validateConfiguration(config, new DebugLogger(false))).rejects.toThrow(
      /Invalid configuration object/,
    );
  });

  it('points at the files the shell build writes', async () => {
    const pkg = JSON.parse(await readFile(path.join(root, 'package.json'), 'utf8'));
    expect(pkg.main).toBe('dist-electron/main.cjs');
    expect(pkg.scripts['build:desktop']).toMatch(/vite build.*scripts\/buildShell\.mjs/);
    expect(pkg.scripts.dist).toMatch(
      /build:desktop.*electron-builder --config electron-builder\.yml/,
    );
    const buildScript = await readFile(path.join(root, 'scripts/buildShell.mjs'), 'utf8');
    expect(buildScript).toContain("'main.cjs'");
    expect(buildScript).toContain("'preload.cjs'");
  });
});

describe('icons', () => {
  it('has a 1024 px build/icon.png and Linux sizes named for their size', async () => {
    expect(pngSize(await readFile(path.join(root, 'build/icon.png')))).toEqual({
      width: 1024,
      height: 1024,
    });
    const names = (await readdir(path.join(root, 'build/icons'))).filter((n) => n.endsWith('.png'));
    expect(names.length).toBeGreaterThanOrEqual(5);
    for (const name of names) {
      const size = Number(name.split('x')[0]);
      expect(pngSize(await readFile(path.join(root, 'build/icons', name))), name).toEqual({
        width: size,
        height: size,
      });
    }
  });
});

describe('scripts/buildShell.mjs', () => {
  it('bundles main and preload into single files that need only electron and Node’s own modules', async () => {
    const out = path.join(scratch, 'shell');
    const run = spawnSync(process.execPath, [path.join(root, 'scripts/buildShell.mjs')], {
      env: { ...process.env, PLOTRATE_SHELL_OUT: out },
      encoding: 'utf8',
    });
    expect(run.status, run.stderr).toBe(0);
    expect((await readdir(out)).sort()).toEqual([
      'icon.png',
      'main.cjs',
      'main.cjs.map',
      'preload.cjs',
      'preload.cjs.map',
    ]);
    const requires = (code: string) => [
      ...new Set([...code.matchAll(/require\("([^"]+)"\)/g)].map((m) => m[1])),
    ];
    const main = requires(await readFile(path.join(out, 'main.cjs'), 'utf8'));
    expect(main).toContain('electron');
    for (const name of main) expect(name, name).toMatch(/^(electron|node:[a-z/_]+)$/);
    expect(requires(await readFile(path.join(out, 'preload.cjs'), 'utf8'))).toEqual(['electron']);
  });
});
