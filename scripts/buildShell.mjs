// Bundle the desktop shell: electron/main.ts and electron/preload.ts become
// dist-electron/main.cjs and dist-electron/preload.cjs. A sandboxed preload
// cannot require its own modules, so both are single files; `electron` stays
// external (the runtime provides it). The window icon is copied beside them.
// esbuild is a pinned devDependency (scripts/buildCli.mjs uses it too); vite 8 itself bundles with rolldown.
import { build } from 'esbuild';
import { copyFile, mkdir } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');
// PLOTRATE_SHELL_OUT builds elsewhere (the packaging test uses a temporary folder).
const out = process.env.PLOTRATE_SHELL_OUT ?? path.join(root, 'dist-electron');
await mkdir(out, { recursive: true });

const common = {
  bundle: true,
  platform: 'node',
  format: 'cjs',
  // The main process runs on Electron's Node 22; the preload on its Chromium.
  target: ['node22', 'es2022'],
  external: ['electron'],
  sourcemap: true,
  logLevel: 'warning',
};
await build({
  ...common,
  entryPoints: [path.join(root, 'electron/main.ts')],
  outfile: path.join(out, 'main.cjs'),
});
await build({
  ...common,
  entryPoints: [path.join(root, 'electron/preload.ts')],
  outfile: path.join(out, 'preload.cjs'),
});
await copyFile(path.join(root, 'build/icon.png'), path.join(out, 'icon.png'));
console.log(
  `Shell built in ${path.relative(root, out) || out}/ (main.cjs, preload.cjs, icon.png).`,
);
