// Bundle the command line: cli/main.ts becomes dist-cli/plotrate.mjs, which
// cli/plotrate.mjs (the `plotrate` bin) runs, so no TypeScript is compiled
// when a user runs the command. Runs as npm's `prepare` (after `npm install`
// and `npm ci`), as `npm run build:cli`, and once before every vitest run
// (tests/support/buildCliBundle.ts) so tests exercise the current sources.
//
// Packages stay external (loaded from node_modules at run time), all but the
// @stdlib distributions: @resvg/resvg-js is native, pdfkit reads its font
// metrics from its own folder, exceljs and fflate are only wanted with an
// .xlsx in or out. The @stdlib packages are plain CommonJS spread over a few
// hundred small files, which Node took about 0.15 s to find and compile on
// every analysis; bundled, they are one more part of the analysis' chunk. Code splitting keeps each dynamic import() of a heavy output module
// (workbook, PDF, charts) in its own chunk, so its packages load only when
// that output is asked for; without splitting esbuild would hoist their
// imports to the top of the one file. The chart and resampling workers are
// entry points beside the chunks, where chartPng.ts and drawPool.ts look for them.
import { rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = path.join(path.dirname(fileURLToPath(import.meta.url)), '..');

/**
 * An esbuild plugin that leaves every package import external except those matching `bundled`
 * (what `packages: 'external'` does, with exceptions).
 * @param {RegExp} bundled - package names to bundle
 * @returns {import('esbuild').Plugin}
 */
function externalPackagesBut(bundled) {
  return {
    name: 'external-packages-but',
    setup(build) {
      // A bare specifier (not relative, not absolute) names a package or a node: builtin.
      build.onResolve({ filter: /^[^./]/ }, (args) =>
        bundled.test(args.path) ? undefined : { path: args.path, external: true },
      );
    },
  };
}

/**
 * Builds the command-line bundle.
 * @param {{ outdir?: string, logLevel?: import('esbuild').LogLevel }} [options] - where to
 *   write (default dist-cli/ in the project) and how much esbuild prints
 * @returns {Promise<string>} the folder written
 * @example await buildCli(); // dist-cli/plotrate.mjs, dist-cli/chartWorker.mjs and chunks
 */
export async function buildCli({
  outdir = path.join(root, 'dist-cli'),
  logLevel = 'warning',
} = {}) {
  const { build } = await import('esbuild');
  // Chunk names carry a hash: clear the old ones so the folder holds one build.
  rmSync(outdir, { recursive: true, force: true });
  await build({
    entryPoints: {
      plotrate: path.join(root, 'cli/main.ts'),
      chartWorker: path.join(root, 'cli/chartWorker.mjs'),
      drawWorker: path.join(root, 'cli/drawWorker.ts'),
    },
    outdir,
    bundle: true,
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    plugins: [externalPackagesBut(/^@stdlib\//)],
    // The bundled CommonJS still require()s a few packages (debug) and Node's own modules,
    // which an ES module can only do through a require made for it.
    banner: {
      js: "import { createRequire as __plotrateRequire } from 'node:module'; const require = __plotrateRequire(import.meta.url);",
    },
    outExtension: { '.js': '.mjs' },
    // Flat, beside the workers: chartPng.ts and drawPool.ts find them at ./chartWorker.mjs and
    // ./drawWorker.mjs.
    chunkNames: '[name]-[hash]',
    sourcemap: true,
    logLevel,
  });
  return outdir;
}

if (import.meta.url === pathToFileURL(process.argv[1]).href) {
  try {
    await import('esbuild');
  } catch {
    // `npm install --omit=dev` has no esbuild; say so instead of failing the install.
    if (process.argv.includes('--prepare')) {
      console.warn(
        'plotrate: the command line was not built: esbuild, a development dependency, is not installed (`npm install` with development dependencies builds it).',
      );
      process.exit(0);
    }
    throw new Error('esbuild is not installed; run `npm install` first.');
  }
  const started = performance.now();
  const out = await buildCli();
  console.log(
    `Command line built in ${path.relative(root, out)}/ (${Math.round(performance.now() - started)} ms).`,
  );
}
