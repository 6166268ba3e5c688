// `npm start`: open the desktop app, or explain plainly why it cannot start.
// The Electron runtime is a separate download made by electron's own install
// script; npm 11 skips that script unless approved, so fetch it here if missing.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

const require = createRequire(import.meta.url);

function runtimePath() {
  try {
    return require('electron'); // the path of the runtime binary, or throws when it is missing
  } catch {
    return null;
  }
}

let electronBinary = runtimePath();
if (!electronBinary || !existsSync(electronBinary)) {
  const installer = path.join(path.dirname(require.resolve('electron/package.json')), 'install.js');
  console.log('Plotrate: the Electron runtime is not installed yet; fetching it once…');
  spawnSync(process.execPath, [installer], {
    stdio: 'inherit',
    env: { ...process.env, ELECTRON_SKIP_BINARY_DOWNLOAD: '' },
  });
  electronBinary = runtimePath();
}
if (!electronBinary || !existsSync(electronBinary)) {
  console.error(
    [
      '',
      'Plotrate cannot open its desktop window: the Electron runtime (the small browser the app runs in)',
      'is not on this computer, and downloading it failed — usually because this machine cannot reach the',
      'download server. On a connected machine run `node node_modules/electron/install.js` (or reinstall',
      'with `npm install`) and then `npm start` again. Meanwhile the same app runs in your browser:',
      '',
      '    npm run web',
      '',
    ].join('\n'),
  );
  process.exit(1);
}

const build = spawnSync('npm', ['run', 'build:desktop'], { stdio: 'inherit', shell: true });
if (build.status !== 0) process.exit(build.status ?? 1);
const result = spawnSync(electronBinary, ['.'], { stdio: 'inherit' });
process.exit(result.status ?? 0);
