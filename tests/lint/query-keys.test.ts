import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { describe, expect, it } from 'vitest';

// Query keys in the client (docs: src/app/README.md, "Data"; style model: TanStack Query's
// `queryOptions` factories and its ESLint rule prefer-query-options). Every key comes from a
// `<name>Keys` hierarchy, queries are read through a `<name>QueryOptions` factory, each key
// root is defined once, and each GET endpoint is fetched from one file, so two features
// cannot cache one endpoint under two keys (the publications list once was, and saving a
// publication did not refresh the editions form). Endpoints read by more than one feature
// live in src/api/, which imports only shared/, src/lib/ and itself.

const root = resolve(import.meta.dirname, '..', '..');

function walk(dir: string): string[] {
  let out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out = out.concat(walk(p));
    else if (/\.(ts|tsx)$/.test(name)) out.push(p);
  }
  return out;
}

/** Source without block comments and whole-line // comments (a comment may show a key as an example). */
function code(text: string): string {
  return text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '');
}

function lineOf(text: string, index: number): number {
  return text.slice(0, index).split('\n').length;
}

const fromFactory = String.raw`\w+Keys\.\w+|\w+QueryOptions\([^()]*(?:\([^()]*\)[^()]*)*\)\.queryKey`;

/** `queryKey:` not followed by a key factory (a literal array, a string, a variable, shorthand). */
function literalQueryKeys(text: string): number[] {
  const src = code(text);
  const bad: number[] = [];
  for (const m of src.matchAll(/(?<![.\w])queryKey\b\s*(:\s*)?/g)) {
    const rest = src.slice(m.index + m[0].length);
    const ok = m[1] !== undefined && new RegExp(`^(?:${fromFactory})`).test(rest);
    if (!ok) bad.push(lineOf(src, m.index));
  }
  return bad;
}

const byKeyCalls = ['setQueryData', 'getQueryData', 'getQueryState'];
const byOptionsCalls = ['useQuery', 'useSuspenseQuery', 'ensureQueryData', 'fetchQuery', 'prefetchQuery'];

/**
 * Cache calls that take a key first (setQueryData, ...) must pass a factory's key; calls that
 * take query options (useQuery, ensureQueryData, ...) must pass a factory's options, optionally
 * spread into an object that adds options (`{ ...fooQueryOptions(id), enabled }`).
 */
function unfactoredCacheCalls(text: string): number[] {
  const src = code(text);
  const bad: number[] = [];
  for (const m of src.matchAll(new RegExp(`\\b(${byKeyCalls.join('|')})(?:<[^>]*>)?\\(\\s*`, 'g'))) {
    if (!new RegExp(`^(?:${fromFactory})`).test(src.slice(m.index + m[0].length))) bad.push(lineOf(src, m.index));
  }
  for (const m of src.matchAll(new RegExp(`\\b(${byOptionsCalls.join('|')})\\(\\s*`, 'g'))) {
    if (!/^(?:\w+QueryOptions\(|\{\s*\.\.\.\w+QueryOptions\()/.test(src.slice(m.index + m[0].length))) bad.push(lineOf(src, m.index));
  }
  return bad.sort((a, b) => a - b);
}

/** The one module that passes keys on as values: useInvalidatingMutation(fn, [fooKeys.all]) invalidates what its callers name. */
const keyCarrier = 'src/lib/use-invalidating-mutation.ts';

/** useInvalidatingMutation calls whose arguments hold a hand-typed key (an array starting with a literal). */
function handTypedInvalidations(text: string): number[] {
  const src = code(text);
  const bad: number[] = [];
  for (const m of src.matchAll(/\buseInvalidatingMutation(?:<[^>]*>)?\(/g)) {
    let depth = 1;
    let i = m.index + m[0].length;
    for (; i < src.length && depth > 0; i++) {
      if (src[i] === '(') depth++;
      else if (src[i] === ')') depth--;
    }
    if (/\[\s*['"`]/.test(src.slice(m.index, i))) bad.push(lineOf(src, m.index));
  }
  return bad;
}

/** Roots of the key hierarchies a file defines: `export const fooKeys = { all: ['foo'] as const, ... }`. */
function keyRoots(text: string): { name: string; root: string | null }[] {
  const src = code(text);
  const out: { name: string; root: string | null }[] = [];
  for (const m of src.matchAll(/\bconst\s+(\w+Keys)\s*=\s*\{\s*all:\s*(\[\s*'([^']+)'\s*\])?/g)) {
    out.push({ name: m[1]!, root: m[3] ?? null });
  }
  return out;
}

/** GET endpoints a file fetches with apiRequest, `${...}` written as `:param`. */
function getEndpoints(text: string): string[] {
  const src = code(text);
  const out: string[] = [];
  for (const m of src.matchAll(/\bapiRequest\(\s*(['`])((?:(?!\1)[^\n])*)\1\s*,\s*\{/g)) {
    let depth = 1;
    let i = m.index + m[0].length;
    for (; i < src.length && depth > 0; i++) {
      if (src[i] === '{') depth++;
      else if (src[i] === '}') depth--;
    }
    const options = src.slice(m.index + m[0].length, i);
    const method = /\bmethod:\s*'(\w+)'/.exec(options)?.[1] ?? 'GET';
    if (method === 'GET') out.push(m[2]!.replace(/\$\{[^}]*\}/g, ':param'));
  }
  return out;
}

const srcFiles = walk(join(root, 'src'));
const rel = (f: string) => relative(root, f).split(sep).join('/');

describe('query keys come only from factories', () => {
  it('every queryKey in src/ is taken from a <name>Keys hierarchy (or a factory’s .queryKey)', () => {
    const bad = srcFiles.filter((f) => rel(f) !== keyCarrier).flatMap((f) => literalQueryKeys(readFileSync(f, 'utf8')).map((line) => `${rel(f)}:${line}`));
    expect(bad).toEqual([]);
  });

  it('mutations invalidate keys from the factories (useInvalidatingMutation gets no hand-typed key)', () => {
    const bad = srcFiles.flatMap((f) => handTypedInvalidations(readFileSync(f, 'utf8')).map((line) => `${rel(f)}:${line}`));
    expect(bad).toEqual([]);
    expect(srcFiles.filter((f) => /\buseInvalidatingMutation\(/.test(readFileSync(f, 'utf8'))).length).toBeGreaterThan(10);
  });

  it('cache reads and writes go through the factories (no hand-written key or inline query options)', () => {
    const bad = srcFiles.flatMap((f) => unfactoredCacheCalls(readFileSync(f, 'utf8')).map((line) => `${rel(f)}:${line}`));
    expect(bad).toEqual([]);
  });

  it('each key root is defined by one hierarchy, with an `all` entry', () => {
    const owners = new Map<string, string[]>();
    const noRoot: string[] = [];
    for (const f of srcFiles) {
      const text = readFileSync(f, 'utf8');
      for (const { name, root: r } of keyRoots(text)) {
        if (!r) noRoot.push(`${rel(f)}: ${name}`);
        else owners.set(r, [...(owners.get(r) ?? []), `${rel(f)}: ${name}`]);
      }
      const declared = [...code(text).matchAll(/\bconst\s+(\w+Keys)\s*=\s*\{/g)].map((m) => m[1]!);
      const withAll = new Set(keyRoots(text).map((k) => k.name));
      for (const name of declared) if (!withAll.has(name)) noRoot.push(`${rel(f)}: ${name} has no all: ['root']`);
    }
    expect(noRoot).toEqual([]);
    expect([...owners].filter(([, where]) => where.length > 1)).toEqual([]);
    // the hierarchies the app is known to have are found (guards a checker that sees nothing)
    expect([...owners.keys()]).toEqual(expect.arrayContaining(['session', 'editions', 'publications', 'submissions', 'stock', 'puzzles']));
  });

  it('each GET endpoint is fetched from one file', () => {
    const files = new Map<string, Set<string>>();
    for (const f of srcFiles) {
      for (const path of getEndpoints(readFileSync(f, 'utf8'))) files.set(path, (files.get(path) ?? new Set()).add(rel(f)));
    }
    expect([...files].filter(([, where]) => where.size > 1).map(([path, where]) => `${path}: ${[...where].join(', ')}`)).toEqual([]);
    expect(files.get('/api/publications')).toEqual(new Set(['src/api/publications.ts']));
  });

  it('src/api/ imports only shared/, src/lib/ and src/api/ (features and the app build on it, not the other way)', () => {
    const bad: string[] = [];
    for (const f of walk(join(root, 'src', 'api'))) {
      for (const m of readFileSync(f, 'utf8').matchAll(/from\s*'(\.[^']+)'/g)) {
        const target = rel(resolve(dirname(f), m[1]!));
        if (!/^(shared|src\/lib|src\/api)\//.test(target)) bad.push(`${rel(f)}: '${m[1]}'`);
      }
    }
    expect(bad).toEqual([]);
  });
});

describe('the query-key checks see what they look for', () => {
  it('a literal key, a hand-typed invalidation and a shorthand key are found', () => {
    const text = [
      "useQuery({ queryKey: ['stock', id], queryFn });", // line 1: literal key and inline options
      "qc.invalidateQueries({ queryKey: ['submissions'] });", // line 2
      'qc.invalidateQueries({ queryKey });', // line 3: shorthand, a variable
      'qc.invalidateQueries({ queryKey: stockKeys.all });', // line 4: fine
      'qc.setQueryData(editionQueryOptions(id).queryKey, ed);', // line 5: fine
      "qc.setQueryData(['editions', 'detail', id], ed);", // line 6
      'useQuery({ ...stockDetailQueryOptions(id ?? 0), enabled: id !== null });', // line 7: fine
    ].join('\n');
    expect(literalQueryKeys(text)).toEqual([1, 2, 3]);
    expect(unfactoredCacheCalls(text)).toEqual([1, 6]);
  });

  it('a hand-typed key given to useInvalidatingMutation is found, a factory key is not', () => {
    const text = [
      "useInvalidatingMutation(createSubmission, [['submissions']], { after: 'success' });",
      "useInvalidatingMutation((v: Input) => save(v, 'draft'), [publicationKeys.all]);",
      "useInvalidatingMutation(review, [submissionKeys.all, [\"stock\"]]);",
    ].join('\n');
    expect(handTypedInvalidations(text)).toEqual([1, 3]);
  });

  it('a hierarchy without a root, and the roots of two hierarchies, are read', () => {
    expect(keyRoots("export const aKeys = { all: ['a'] as const };\nexport const bKeys = { all: aKeys.all };")).toEqual([
      { name: 'aKeys', root: 'a' },
      { name: 'bKeys', root: null },
    ]);
  });

  it('GET endpoints are told from other methods, with path parameters folded', () => {
    const text = [
      "apiRequest(`/api/stock/${id}`, { schema: stockDetailSchema, signal });",
      "apiRequest('/api/puzzles', { schema: puzzleListSchema, query: { printable: true }, signal });",
      "apiRequest('/api/tilings/check', { method: 'POST', body: { code }, schema: verdictSchema });",
      "apiRequest(`/api/editions/${encodeURIComponent(id)}`, { method: 'GET', schema: editionSchema });",
    ].join('\n');
    expect(getEndpoints(text)).toEqual(['/api/stock/:param', '/api/puzzles', '/api/editions/:param']);
  });
});
