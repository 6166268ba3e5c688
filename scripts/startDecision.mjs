// The decision behind `npm start`, apart from its side effects so it can be
// tested: is the Electron runtime here, can electron's own installer fetch
// it, or must the user be told plainly what to do instead.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import path from 'node:path';

/** The paragraph shown when the desktop window cannot open. */
export const RUNTIME_MISSING_MESSAGE = [
  '',
  'Plotrate cannot open its desktop window: the Electron runtime (the small browser the app runs in)',
  'is not on this computer, and fetching it failed — usually because this machine cannot reach the',
  "download server. Electron's package fetches the runtime on first use rather than at install;",
  'on a connected machine run `node node_modules/electron/install.js` once and then `npm start`.',
  'Meanwhile the same app runs in your browser:',
  '',
  '    npm run web',
  '',
].join('\n');

/**
 * Where the runtime binary of an installed electron package is, or null when
 * it has not been downloaded. Reads the package's own path.txt rather than
 * `require('electron')`, which would start a download as a side effect.
 *
 * @param {string} electronDir folder of the electron npm package
 * @param {Record<string, string | undefined>} env environment (ELECTRON_OVERRIDE_DIST_PATH is honoured)
 * @returns {string | null}
 */
export function electronRuntimePath(electronDir, env) {
  const relative = readPathFile(electronDir);
  const binary = env.ELECTRON_OVERRIDE_DIST_PATH
    ? path.join(env.ELECTRON_OVERRIDE_DIST_PATH, relative || 'electron')
    : relative
      ? path.join(electronDir, 'dist', relative)
      : null;
  return binary !== null && existsSync(binary) ? binary : null;
}

/** The binary's path inside dist/, as electron's installer recorded it; "" when not installed. */
function readPathFile(electronDir) {
  try {
    return readFileSync(path.join(electronDir, 'path.txt'), 'utf8').trim();
  } catch {
    return '';
  }
}

/**
 * Run electron's own install.js once, with the skip switch cleared.
 * @param {string} electronDir
 * @param {Record<string, string | undefined>} env
 * @returns {number | null} the installer's exit status
 */
export function runElectronInstaller(electronDir, env) {
  const installer = path.join(electronDir, 'install.js');
  if (!existsSync(installer)) return null;
  // The installer's own progress goes to the terminal; its stack trace on a
  // failed download does not: one line says why, the paragraph says what to do.
  const result = spawnSync(process.execPath, [installer], {
    stdio: ['ignore', 'inherit', 'pipe'],
    encoding: 'utf8',
    env: { ...env, ELECTRON_SKIP_BINARY_DOWNLOAD: '' },
    timeout: 10 * 60 * 1000,
  });
  if (result.status !== 0) {
    const reason = (result.stderr ?? '')
      .split('\n')
      .map((line) => line.trim())
      .find((line) => /error/i.test(line) && !line.startsWith('at '));
    if (reason) console.error(`Plotrate: electron's installer said: ${reason}`);
  }
  return result.status;
}

/**
 * Decide what `npm start` does.
 *
 * @param {{ electronDir: string, env: Record<string, string | undefined>,
 *   install?: (electronDir: string, env: Record<string, string | undefined>) => number | null,
 *   log?: (line: string) => void }} options
 * @returns {{ action: 'launch', binary: string, installed: boolean } | { action: 'explain', message: string, installerStatus: number | null }}
 */
export function decideStart({
  electronDir,
  env,
  install = runElectronInstaller,
  log = console.log,
}) {
  const present = electronRuntimePath(electronDir, env);
  if (present) return { action: 'launch', binary: present, installed: false };
  log('Plotrate: the Electron runtime is not installed yet; fetching it once…');
  const installerStatus = install(electronDir, env);
  const fetched = electronRuntimePath(electronDir, env);
  if (fetched) return { action: 'launch', binary: fetched, installed: true };
  return { action: 'explain', message: RUNTIME_MISSING_MESSAGE, installerStatus };
}
