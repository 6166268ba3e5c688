// The project's file-level import graph and its cycles, for the layout tests. Imports are read
// with the TypeScript compiler's own pre-processor (`ts.preProcessFile`), which lists every
// module specifier of a file — `import type`, `export … from` and `import()` included — so a
// cycle made only of type imports is found too (eslint's import plugins skip those). The
// runtime graph (`{ runtimeOnly: true }`) leaves out what compiles away: `import type`,
// `export type … from` and `import('…')` in a type position.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import ts from 'typescript';

/** File name endings whose imports are read. */
const SOURCE_ENDINGS = ['.ts', '.mts', '.mjs', '.js', '.svelte'];
/** What an extensionless relative specifier may name, tried in this order (bundler resolution). */
const RESOLVE_SUFFIXES = ['', '.ts', '.mts', '.mjs', '.js', '/index.ts'];

/** Import graph: each file (path relative to the root, `/`-separated) → the files it imports. */
export type ImportGraph = Map<string, string[]>;

/** A relative import that names no file: the graph would silently miss an edge. */
export interface UnresolvedImport {
  file: string;
  specifier: string;
}

/** What readImportGraph reads. */
export interface ImportGraphOptions {
  /**
   * Only the imports left after compiling, default false. Under `verbatimModuleSyntax`
   * (tsconfig.json) `import { type A } from './a'` stays as `import {} from './a'` and still
   * loads the module, so only a whole `import type`/`export type` declaration is left out.
   */
  runtimeOnly?: boolean;
}

/**
 * Every source file under the given folders with its resolved relative imports.
 * @param rootDir absolute path of the repository root
 * @param folders folders under the root to read (e.g. `['shared', 'renderer']`)
 * @param options runtimeOnly: leave out the type-only imports
 * @returns the graph and the relative imports that resolved to no file
 * @example
 * const { graph } = readImportGraph(process.cwd(), ['shared']);
 * graph.get('shared/quality/checkQuality.ts'); // ['shared/quality/checkDesign.ts', …]
 */
export function readImportGraph(
  rootDir: string,
  folders: readonly string[],
  options: ImportGraphOptions = {},
): { graph: ImportGraph; unresolved: UnresolvedImport[] } {
  const graph: ImportGraph = new Map();
  const unresolved: UnresolvedImport[] = [];
  for (const folder of folders) {
    for (const absolute of sourceFiles(join(rootDir, folder))) {
      const file = toKey(rootDir, absolute);
      const targets = new Set<string>();
      const specifiers = options.runtimeOnly
        ? runtimeSpecifiers(absolute)
        : moduleSpecifiers(absolute);
      for (const specifier of specifiers) {
        if (!specifier.startsWith('.')) continue; // packages are outside the graph
        const target = resolveRelative(dirname(absolute), specifier);
        if (target === null) unresolved.push({ file, specifier });
        else targets.add(toKey(rootDir, target));
      }
      graph.set(file, [...targets].sort());
    }
  }
  return { graph, unresolved };
}

/**
 * The import cycles of a graph: its strongly connected components with more than one file, or
 * one file importing itself (Tarjan, 1972, "Depth-first search and linear graph algorithms").
 * @param graph file → imported files; imports of files outside the graph are ignored
 * @returns each cycle's files, sorted, cycles sorted by their first file
 * @example
 * importCycles(new Map([['a', ['b']], ['b', ['a']], ['c', ['a']]])); // [['a', 'b']]
 */
export function importCycles(graph: ImportGraph): string[][] {
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const cycles: string[][] = [];
  let counter = 0;

  // Iterative depth-first search, so a long import chain cannot overflow the call stack.
  for (const start of graph.keys()) {
    if (index.has(start)) continue;
    const work: { node: string; next: number }[] = [{ node: start, next: 0 }];
    index.set(start, counter);
    low.set(start, counter++);
    stack.push(start);
    onStack.add(start);
    while (work.length > 0) {
      const frame = work[work.length - 1];
      const edges = (graph.get(frame.node) ?? []).filter((target) => graph.has(target));
      if (frame.next < edges.length) {
        const target = edges[frame.next++];
        if (!index.has(target)) {
          index.set(target, counter);
          low.set(target, counter++);
          stack.push(target);
          onStack.add(target);
          work.push({ node: target, next: 0 });
        } else if (onStack.has(target)) {
          low.set(frame.node, Math.min(low.get(frame.node)!, index.get(target)!));
        }
        continue;
      }
      work.pop();
      if (work.length > 0) {
        const parent = work[work.length - 1].node;
        low.set(parent, Math.min(low.get(parent)!, low.get(frame.node)!));
      }
      if (low.get(frame.node) === index.get(frame.node)) {
        const component: string[] = [];
        let member: string;
        do {
          member = stack.pop()!;
          onStack.delete(member);
          component.push(member);
        } while (member !== frame.node);
        const selfImport = (graph.get(frame.node) ?? []).includes(frame.node);
        if (component.length > 1 || selfImport) cycles.push(component.sort());
      }
    }
  }
  return cycles.sort((a, b) => a[0].localeCompare(b[0]));
}

/**
 * One import path through a cycle's files, for a failure message: `a → b → a`.
 * @param graph the import graph
 * @param cycle the files of one strongly connected component
 * @example
 * describeCycle(new Map([['a', ['b']], ['b', ['a']]]), ['a', 'b']); // 'a → b → a'
 */
export function describeCycle(graph: ImportGraph, cycle: readonly string[]): string {
  const members = new Set(cycle);
  const start = cycle[0];
  // Breadth-first search for the shortest way back to the start inside the component.
  const previous = new Map<string, string>();
  const queue = [start];
  while (queue.length > 0) {
    const node = queue.shift()!;
    for (const target of graph.get(node) ?? []) {
      if (!members.has(target)) continue;
      if (target === start) {
        const path = [start];
        for (let at: string | undefined = node; at !== undefined && at !== start;) {
          path.unshift(at);
          at = previous.get(at);
        }
        return [start, ...path].join(' → ');
      }
      if (!previous.has(target)) {
        previous.set(target, node);
        queue.push(target);
      }
    }
  }
  return cycle.join(', ');
}

function sourceFiles(folder: string): string[] {
  if (!existsSync(folder)) return [];
  const files: string[] = [];
  for (const entry of readdirSync(folder).sort()) {
    if (entry === 'node_modules') continue;
    const path = join(folder, entry);
    if (statSync(path).isDirectory()) files.push(...sourceFiles(path));
    else if (SOURCE_ENDINGS.some((ending) => entry.endsWith(ending)) && !entry.endsWith('.d.ts'))
      files.push(path);
  }
  return files;
}

function scriptText(path: string): string {
  const text = readFileSync(path, 'utf8');
  if (!path.endsWith('.svelte')) return text;
  // Only the component's <script> blocks hold imports.
  return [...text.matchAll(/<script\b[^>]*>([\s\S]*?)<\/script>/g)].map((m) => m[1]).join('\n');
}

function moduleSpecifiers(path: string): string[] {
  const info = ts.preProcessFile(scriptText(path), true, true);
  return info.importedFiles.map((f) => f.fileName);
}

/** The specifiers still imported after compiling: static imports and re-exports, and `import()` calls. */
function runtimeSpecifiers(path: string): string[] {
  const source = ts.createSourceFile(path, scriptText(path), ts.ScriptTarget.Latest, false);
  const specifiers: string[] = [];
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node)) {
      if (!node.importClause?.isTypeOnly) specifiers.push(stringLiteral(node.moduleSpecifier));
    } else if (ts.isExportDeclaration(node)) {
      if (node.moduleSpecifier && !node.isTypeOnly)
        specifiers.push(stringLiteral(node.moduleSpecifier));
    } else if (
      ts.isCallExpression(node) &&
      node.expression.kind === ts.SyntaxKind.ImportKeyword &&
      node.arguments.length > 0 &&
      ts.isStringLiteralLike(node.arguments[0])
    ) {
      specifiers.push(node.arguments[0].text);
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return specifiers;
}

function stringLiteral(node: ts.Expression): string {
  return ts.isStringLiteralLike(node) ? node.text : '';
}

function resolveRelative(fromDir: string, specifier: string): string | null {
  const base = resolve(fromDir, specifier);
  for (const suffix of RESOLVE_SUFFIXES) {
    const candidate = base + suffix;
    if (existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  return null;
}

function toKey(rootDir: string, absolute: string): string {
  return relative(rootDir, absolute).split('\\').join('/');
}

/**
 * The shortest import chain from one file to a file the predicate picks, for a failure message.
 * @param graph the import graph
 * @param start the file the chain starts from
 * @param isTarget which files the chain may end at (the start itself is not tried)
 * @returns the files from start to the first target reached, or null when none is reachable
 * @example
 * importChain(new Map([['a', ['b']], ['b', ['c']], ['c', []]]), 'a', (f) => f === 'c'); // ['a', 'b', 'c']
 */
export function importChain(
  graph: ImportGraph,
  start: string,
  isTarget: (file: string) => boolean,
): string[] | null {
  // Breadth-first, so the chain named is a shortest one.
  const previous = new Map<string, string>([[start, start]]);
  const queue = [start];
  while (queue.length > 0) {
    const node = queue.shift()!;
    for (const target of graph.get(node) ?? []) {
      if (previous.has(target)) continue;
      previous.set(target, node);
      if (isTarget(target)) {
        const chain = [target];
        for (let at = node; at !== start; at = previous.get(at)!) chain.unshift(at);
        return [start, ...chain];
      }
      queue.push(target);
    }
  }
  return null;
}
