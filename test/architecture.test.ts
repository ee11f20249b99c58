/**
 * The folder rule of whereabouts, checked from the import statements of every file under src/.
 * This is a structural check of the project's own rule (DEVELOPERS.md, "Folders"), not of an outside
 * source: data flows one way, geodesy ← parse ← match ← georef ← record ← locate ← output (the core,
 * pure); the store may read match, georef, geodesy and parse; the edges (batch, server, cli) may import
 * the core and the store. No loop between folders, and the core imports no file, database, HTTP or CLI
 * library.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

const SRC = new URL('../src/', import.meta.url).pathname;

const CORE = ['geodesy', 'parse', 'match', 'georef', 'record', 'locate', 'output'] as const;
/**
 * What each folder may import besides itself. `version` (src/version.ts, the package version read
 * once) is metadata any folder may cite.
 */
const ALLOWED: Readonly<Record<string, readonly string[]>> = {
  geodesy: [],
  parse: ['geodesy'],
  match: ['parse', 'geodesy'],
  georef: ['match', 'parse', 'geodesy'],
  record: ['georef', 'match', 'parse', 'geodesy', 'version'],
  locate: ['record', 'georef', 'match', 'parse', 'geodesy', 'version'],
  output: ['locate', 'record', 'georef', 'match', 'parse', 'geodesy'],
  version: [],
  store: ['match', 'georef', 'parse', 'geodesy'],
  // An edge may also call an edge below it (the service starts batch jobs, the CLI starts the service).
  batch: [...CORE, 'store', 'version'],
  server: [...CORE, 'store', 'version', 'batch'],
  cli: [...CORE, 'store', 'version', 'batch', 'server'],
};
/**
 * Type-only imports allowed against the flow: none (the Darwin Core record describes the shape of
 * what it is written from, src/record/darwin-core.ts `LocatedRecord`, rather than importing locate's).
 */
const ALLOWED_TYPES: Readonly<Record<string, readonly string[]>> = {};
/** Packages that do I/O or serve a user interface: never in the core. */
const NOT_IN_CORE = /^(node:)?fs(\/|$)|^better-sqlite3$|^fastify$|^@fastify\/|^commander$/;

/** Every .ts and .js file under a folder. */
function sourceFiles(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const path = join(folder, entry.name);
    if (entry.isDirectory()) return sourceFiles(path);
    return /\.(ts|js)$/.test(entry.name) ? [path] : [];
  });
}

/** The module specifiers a file imports or re-exports, static, dynamic or as a type (`typeOnly`). */
function specifiers(text: string): { specifier: string; typeOnly: boolean }[] {
  const found: { specifier: string; typeOnly: boolean }[] = [];
  for (const match of text.matchAll(/\b(import|export)\s+(type\s)?[^'";]*?\bfrom\s*['"]([^'"]+)['"]/g)) {
    found.push({ specifier: match[3], typeOnly: match[2] !== undefined });
  }
  const patterns = [/\bimport\s*['"]([^'"]+)['"]/g, /\bimport\(\s*['"]([^'"]+)['"]\s*\)/g, /\brequire\(\s*['"]([^'"]+)['"]\s*\)/g];
  for (const pattern of patterns) for (const match of text.matchAll(pattern)) found.push({ specifier: match[1], typeOnly: false });
  return found;
}

/** The folder of src/ a path lies in ('locate' and 'version' for the two files at the top). */
function folderOf(path: string): string {
  const [first] = relative(SRC, path).split(sep);
  return first.replace(/\.(ts|js)$/, '');
}

const edges = sourceFiles(SRC).flatMap((file) => specifiers(readFileSync(file, 'utf8')).map(({ specifier, typeOnly }) => ({
  file: relative(SRC, file),
  from: folderOf(file),
  specifier,
  typeOnly,
  to: specifier.startsWith('.') ? folderOf(resolve(dirname(file), specifier)) : null,
})));

describe('folder rule (the project\'s own architecture, checked from import statements)', () => {
  it('reads imports from every folder', () => {
    const folders = new Set(edges.map((edge) => edge.from));
    for (const folder of ['geodesy', 'parse', 'match', 'georef', 'record', 'locate', 'store', 'batch', 'server', 'cli']) {
      expect(folders).toContain(folder);
    }
  });

  it('imports only in the allowed directions', () => {
    const wrong = edges
      .filter((edge) => edge.to !== null && edge.to !== edge.from && !(ALLOWED[edge.from] ?? []).includes(edge.to)
        && !(edge.typeOnly && (ALLOWED_TYPES[edge.from] ?? []).includes(edge.to)))
      .map((edge) => `${edge.file} imports ${edge.specifier} (${edge.from} → ${edge.to})`);
    expect(wrong).toEqual([]);
  });

  it('has no folder outside the rule', () => {
    const unknown = [...new Set(edges.map((edge) => edge.from))].filter((folder) => ALLOWED[folder] === undefined);
    expect(unknown).toEqual([]);
  });

  it('keeps file, database, HTTP and CLI libraries out of the core', () => {
    const wrong = edges
      .filter((edge) => (CORE as readonly string[]).includes(edge.from) && edge.to === null && NOT_IN_CORE.test(edge.specifier))
      .map((edge) => `${edge.file} imports ${edge.specifier}`);
    expect(wrong).toEqual([]);
  });

  it('imports turf one package at a time (the whole of @turf/turf is about 110 modules every CLI start would load)', () => {
    const wrong = edges.filter((edge) => !edge.typeOnly && edge.specifier === '@turf/turf').map((edge) => edge.file);
    expect(wrong).toEqual([]);
  });

  it('has no loop between folders', () => {
    const graph = new Map<string, Set<string>>();
    for (const { from, to } of edges) if (to !== null && to !== from) graph.set(from, (graph.get(from) ?? new Set()).add(to));
    const loops: string[] = [];
    const visit = (folder: string, path: string[]): void => {
      if (path.includes(folder)) {
        loops.push([...path.slice(path.indexOf(folder)), folder].join(' → '));
        return;
      }
      for (const next of graph.get(folder) ?? []) visit(next, [...path, folder]);
    };
    for (const folder of graph.keys()) visit(folder, []);
    expect(loops).toEqual([]);
  });
});
