#!/usr/bin/env node
// The `plotrate` command: runs the bundle scripts/buildCli.mjs makes from
// cli/main.ts (npm builds it after `npm install` and `npm ci`). Nothing is
// compiled here, so start-up is Node's own.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const bundle = new URL('../dist-cli/plotrate.mjs', import.meta.url);
if (!existsSync(bundle)) {
  const root = fileURLToPath(new URL('..', import.meta.url));
  process.stderr.write(
    `plotrate: the command line is not built; run "npm run build:cli" in ${root} and try again.\n`,
  );
  process.exit(1);
}
// Stack traces are printed only with PLOTRATE_DEBUG; then let them name the
// TypeScript files and lines (reading the maps costs start-up time otherwise).
if (process.env.PLOTRATE_DEBUG) process.setSourceMapsEnabled(true);
// resvg (the workbook's chart pictures) allocates with its own mimalloc, which by default hands
// freed pages back to the system 10 ms later; every 1600 × 1120 picture then asks for its pixel
// buffers afresh and faults them in page by page, about half of its drawing time on the 2-core
// machine (README, "Benchmarks"). Kept, they are reused by the next picture. Set here, before
// resvg is loaded, since mimalloc reads its options once; a value the user set is left alone.
process.env.MIMALLOC_PURGE_DELAY ??= '-1';
await import(bundle.href);
