// No file-level import cycles in the app's code, type-only imports included
// (/work/shared/DESIGN.md: "no folder imports one that depends on it (no cycles, type imports
// included)"). The cycles are strongly connected components of the import graph (Tarjan, 1972).
import { describe, expect, it } from 'vitest';
import { describeCycle, importCycles, readImportGraph } from './support/importGraph';

const ROOT = new URL('..', import.meta.url).pathname;
const FOLDERS = ['shared', 'renderer', 'cli', 'electron'];

/**
 * Cycles known and waiting for a fix, each listed with exactly its files (none today). A listed
 * cycle that grows, shrinks or disappears fails the test too, so this list cannot go stale.
 */
const KNOWN_CYCLES: string[][] = [];

/** Non-code imports the bundler resolves (Vite's `?url` assets). */
const ASSET_IMPORT = /\?(url|raw|worker)$/;

describe('import graph of shared/, renderer/, cli/, electron/', () => {
  const { graph, unresolved } = readImportGraph(ROOT, FOLDERS);

  it('resolves every relative import to a file, so no edge is missed', () => {
    expect(graph.size).toBeGreaterThan(100);
    expect(unresolved.filter((u) => !ASSET_IMPORT.test(u.specifier))).toEqual([]);
  });

  it('has no import cycle besides the known ones', () => {
    const found = importCycles(graph);
    const key = (cycle: readonly string[]) => cycle.join(' | ');
    const known = new Set(KNOWN_CYCLES.map(key));
    const unexpected = found.filter((cycle) => !known.has(key(cycle)));
    const message = unexpected.map((cycle) => describeCycle(graph, cycle)).join('\n');
    expect(unexpected, `import cycles:\n${message}`).toEqual([]);
    const gone = KNOWN_CYCLES.filter((cycle) => !found.some((f) => key(f) === key(cycle)));
    expect(gone, 'a known cycle changed or is fixed: update KNOWN_CYCLES').toEqual([]);
  });
});

describe('importCycles', () => {
  it('finds a two-file cycle, a longer one and a self-import, and nothing in a tree', () => {
    const graph = new Map([
      ['a.ts', ['b.ts']],
      ['b.ts', ['a.ts', 'c.ts']],
      ['c.ts', ['d.ts']],
      ['d.ts', ['e.ts']],
      ['e.ts', ['c.ts']],
      ['f.ts', ['f.ts']],
      ['g.ts', ['a.ts', 'h.ts']],
      ['h.ts', []],
    ]);
    expect(importCycles(graph)).toEqual([['a.ts', 'b.ts'], ['c.ts', 'd.ts', 'e.ts'], ['f.ts']]);
    expect(describeCycle(graph, ['c.ts', 'd.ts', 'e.ts'])).toBe('c.ts → d.ts → e.ts → c.ts');
    expect(
      importCycles(
        new Map([
          ['x', ['y']],
          ['y', []],
        ]),
      ),
    ).toEqual([]);
  });

  it('sees a cycle made only of type imports', async () => {
    const { mkdtempSync, writeFileSync } = await import('node:fs');
    const { join } = await import('node:path');
    const { tmpdir } = await import('node:os');
    const dir = mkdtempSync(join(tmpdir(), 'plotrate-cycle-'));
    writeFileSync(join(dir, 'a.ts'), "import type { B } from './b';\nexport type A = B[];\n");
    writeFileSync(join(dir, 'b.ts'), "export type { A } from './a';\nexport type B = number;\n");
    const { graph } = readImportGraph(dir, ['.']);
    expect(importCycles(graph)).toEqual([['a.ts', 'b.ts']]);
  });
});
