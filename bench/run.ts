// `npm run bench`: runs every bench/*.bench.ts in turn and prints its figures.
// Benchmarks measure; they never fail a build (timing lives here, not in tests).
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const here = path.dirname(fileURLToPath(import.meta.url));
const only = process.argv[2];
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => !only || f.includes(only))
  .sort();
for (const file of files) {
  console.log(`\n## ${file.replace('.bench.ts', '')}`);
  const mod = (await import(pathToFileURL(path.join(here, file)).href)) as {
    run: () => Promise<void> | void;
  };
  await mod.run();
}
