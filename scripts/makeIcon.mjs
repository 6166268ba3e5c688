// Render build/icon.svg to the PNG icons electron-builder and the window use:
// build/icon.png (1024 px: macOS and Windows icons are made from it) and
// build/icons/<size>x<size>.png for Linux desktop entries.
// Run after changing the SVG: `npm run icon`, then commit the PNGs.
import { Resvg } from '@resvg/resvg-js';
import { mkdir, readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const buildDir = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', 'build');
const svg = await readFile(path.join(buildDir, 'icon.svg'), 'utf8');

/** The SVG as a square PNG of `size` pixels. */
function render(size) {
  return new Resvg(svg, { fitTo: { mode: 'width', value: size } }).render().asPng();
}

await writeFile(path.join(buildDir, 'icon.png'), render(1024));
await mkdir(path.join(buildDir, 'icons'), { recursive: true });
for (const size of [16, 32, 48, 64, 128, 256, 512]) {
  await writeFile(path.join(buildDir, 'icons', `${size}x${size}.png`), render(size));
}
console.log('Icons written to build/icon.png and build/icons/.');
