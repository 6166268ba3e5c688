// `npm start`: build and open the desktop app, or explain plainly why it
// cannot start. The Electron runtime is a separate download made by
// electron's own install script, which npm 11 skips unless the project
// approves it; startDecision.mjs fetches it here when it is missing.
// PLOTRATE_ELECTRON_DIR points at another electron package folder (tests).
import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { decideStart } from './startDecision.mjs';

const require = createRequire(import.meta.url);
const electronDir =
  process.env.PLOTRATE_ELECTRON_DIR ?? path.dirname(require.resolve('electron/package.json'));

const decision = decideStart({ electronDir, env: process.env });
if (decision.action === 'explain') {
  console.error(decision.message);
  process.exit(1);
}

const build = spawnSync('npm', ['run', 'build:desktop'], { stdio: 'inherit', shell: true });
if (build.status !== 0) process.exit(build.status ?? 1);
const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
const result = spawnSync(decision.binary, [root, ...process.argv.slice(2)], { stdio: 'inherit' });
process.exit(result.status ?? 0);
