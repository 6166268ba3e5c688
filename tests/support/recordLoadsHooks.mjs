// Loader hooks (they run on Node's loader thread): one line per loaded module
// URL, entry points, packages imported from ESM and worker scripts included.
// Modules a CommonJS package require()s internally do not pass through here;
// the package's own entry does, which is what the test looks for.
import { appendFileSync } from 'node:fs';

const log = process.env.PLOTRATE_LOAD_LOG;

export async function load(url, context, nextLoad) {
  if (log) appendFileSync(log, `${url}\n`);
  return nextLoad(url, context);
}
