// vitest globalSetup: builds the command-line bundle (dist-cli/) once before
// the tests run, so every test that spawns `plotrate` runs the current
// sources and never a bundle left from an earlier build. esbuild takes well
// under a second.
import { buildCli } from '../../scripts/buildCli.mjs';

export default async function setup(): Promise<void> {
  await buildCli();
}
