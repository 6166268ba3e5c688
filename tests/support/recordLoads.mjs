// Preload for tests/cli.lazyModules.test.ts (node --import): registers
// recordLoadsHooks.mjs, which appends the URL of every module Node's ESM
// loader loads to the file named by PLOTRATE_LOAD_LOG.
import { register } from 'node:module';

register('./recordLoadsHooks.mjs', import.meta.url);
