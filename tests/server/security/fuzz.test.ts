import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { errorBodySchema } from '../../../shared/contracts/common';
import { plainRichText } from '../../../shared/contracts/editions';
import { parseTiling } from '../../../shared/tiling/index';
import { addToStock } from '../../../server/areas/stock/stock';
import { order9bCode } from '../../fixtures/order9';
import { createMoneyTestApp, type MoneyTestApp } from '../payouts/money-test-app';
import { quadrantPublication } from '../editions/fixtures';

// Zero 5xx on hostile input (issue 15). Every route the app registers (the route registry of
// server/platform/http/route.ts, with the zod schemas each route parses with), called as every
// identity (anonymous, admin, two editors, two setters, a printer), with inputs drawn by a
// seeded fast-check from the route's own schemas (z.toJSONSchema) mixed with hostile values,
// must answer below 500, and every 4xx in our error shape. The corpus of known-bad inputs
// (tests/fixtures/hostile/corpus.json) is replayed first. A 5xx found here goes into the corpus.

const SEED = 150_015;
const corpus = JSON.parse(readFileSync(join(import.meta.dirname, '..', '..', 'fixtures', 'hostile', 'corpus.json'), 'utf8')) as {
  cases: { name: string; as: string; method: string; path: string; body?: unknown; raw?: string; contentType?: string; contentEncoding?: string }[];
};

let t: MoneyTestApp;
const agents = new Map<string, TestAgent | null>();
const ids: Record<string, string> = {};

type Identity = 'anonymous' | 'admin' | 'editor' | 'editor2' | 'setter' | 'setter2' | 'printer';
const identities: Identity[] = ['anonymous', 'admin', 'editor', 'editor2', 'setter', 'setter2', 'printer'];

beforeAll(async () => {
  t = await createMoneyTestApp();
  agents.set('anonymous', null);
  for (const who of identities.filter((i) => i !== 'anonymous')) {
    const role = who.replace(/2$/, '') as 'admin' | 'editor' | 'setter' | 'printer';
    agents.set(who, await t.signInAs(role, who.endsWith('2') ? { email: `${who}@test.squarewright.test` } : {}));
  }
  const admin = agents.get('admin')!;
  const editor = agents.get('editor')!;
  const setter = agents.get('setter')!;
  ids.publication = (await admin.post('/api/publications').send(quadrantPublication).expect(201)).body.id;
  ids.edition = (await editor.post('/api/editions').send({ publicationId: ids.publication, number: 1, date: '2026-03-07', introduction: plainRichText('Two for the weekend.') }).expect(201)).body.id;
  ids.stock = String(addToStock(t.db, { tiling: parseTiling('9 33 32 (18,15)(7,8)(14,4)(10,1)(9)'), provenance: 'demo' }).id);
  ids.submission = String((await setter.post('/api/submissions').send({ code: order9bCode, source: 'paste' }).expect(201)).body.id);
  ids.puzzle = '1';
});
afterAll(() => t.closeAll());

// ---- inputs --------------------------------------------------------------------------------

const deep = (n: number): unknown => {
  let v: unknown = 'x';
  for (let i = 0; i < n; i += 1) v = [v];
  return v;
};
const deepList = (n: number) => {
  let node: Record<string, unknown> = { type: 'text', text: 'x' };
  for (let i = 0; i < n; i += 1) node = { type: i % 2 ? 'bulletList' : 'listItem', content: [node] };
  return { type: 'doc', content: [node] };
};

/** Values that broke parsers and validators somewhere: wrong types, edges, long and strange text. */
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.constantFrom<unknown>(null, true, false, 0, -1, 1.5, -0, 1e308, -1e308, 2 ** 53 + 1, '', ' ', 'x', '%ZZ', '\u0000', '\ud800', '../../etc/passwd', '__proto__', '2026-02-30', '9999-99-99', 'NaN', 'Infinity', '-1', '1e999', '<script>alert(1)</script>', '${7*7}', "' OR 1=1 --", [], {}, [null], { __proto__: { admin: true } }),
  fc.constantFrom<unknown>('9'.repeat(70_000), 'a'.repeat(5_000), deep(60), deepList(40), { type: 'doc', content: [{ type: 'paragraph', content: [{ type: 'doc' }] }] }),
  fc.string({ maxLength: 40 }),
  fc.integer(),
  fc.double(),
);

type Json = Record<string, unknown>;

/** An arbitrary for a JSON schema made by z.toJSONSchema (the subset it emits), with hostile values mixed in. */
function fromSchema(schema: Json, root: Json, depth = 0): fc.Arbitrary<unknown> {
  if (depth > 6) return hostileValue;
  if (typeof schema.$ref === 'string') {
    const name = schema.$ref.split('/').pop()!;
    const target = ((root.$defs ?? root.definitions ?? {}) as Record<string, Json>)[name];
    return target ? fromSchema(target, root, depth + 1) : hostileValue;
  }
  const variants = (schema.anyOf ?? schema.oneOf) as Json[] | undefined;
  if (variants) return fc.oneof(...variants.map((v) => fromSchema(v, root, depth + 1)));
  if (schema.allOf) return fromSchema((schema.allOf as Json[])[0] ?? {}, root, depth + 1);
  if (Array.isArray(schema.enum)) return fc.constantFrom(...(schema.enum as unknown[]));
  if ('const' in schema) return fc.constant(schema.const);
  const type = Array.isArray(schema.type) ? (schema.type as string[])[0] : (schema.type as string | undefined);
  let valid: fc.Arbitrary<unknown>;
  switch (type) {
    case 'string':
      valid = schema.format === 'email' ? fc.emailAddress() : schema.format === 'date' ? fc.constantFrom('2026-03-07', '2026-12-31') : fc.string({ minLength: Number(schema.minLength ?? 0), maxLength: Math.min(Number(schema.maxLength ?? 30), 60) });
      break;
    case 'integer':
      valid = fc.integer({ min: Math.max(Number(schema.minimum ?? -1000), -1e9), max: Math.min(Number(schema.maximum ?? 1000), 1e9) });
      break;
    case 'number':
      valid = fc.double({ min: Math.max(Number(schema.minimum ?? -1000), -1e9), max: Math.min(Number(schema.maximum ?? 1000), 1e9), noNaN: true });
      break;
    case 'boolean':
      valid = fc.boolean();
      break;
    case 'null':
      valid = fc.constant(null);
      break;
    case 'array': {
      const items = (schema.items as Json | undefined) ?? {};
      valid = fc.array(fromSchema(items, root, depth + 1), { maxLength: 4 });
      break;
    }
    case 'object': {
      const props = (schema.properties ?? {}) as Record<string, Json>;
      const required = new Set((schema.required as string[] | undefined) ?? []);
      const entries = Object.entries(props);
      valid = entries.length === 0 ? fc.dictionary(fc.string({ maxLength: 8 }), hostileValue, { maxKeys: 3 }) : fc.record(Object.fromEntries(entries.map(([k, s]) => [k, fromSchema(s, root, depth + 1)])), { requiredKeys: entries.map(([k]) => k).filter((k) => required.has(k)) });
      break;
    }
    default:
      valid = hostileValue;
  }
  return fc.oneof({ arbitrary: valid, weight: 4 }, { arbitrary: hostileValue, weight: 1 });
}

function schemaArb(schema: z.ZodType | undefined): fc.Arbitrary<unknown> {
  if (!schema) return fc.oneof(fc.constant(undefined), hostileValue);
  try {
    const js = z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as Json;
    return fromSchema(js, js);
  } catch {
    return hostileValue;
  }
}

/** A path parameter: a fixture id, a made-up one, or something hostile (sometimes not encoded at all). */
function paramArb(name: string): fc.Arbitrary<string> {
  const known = Object.values(ids);
  const plausible = name === 'month' ? ['2026-03', '2026-13', '1999-00'] : name === 'version' ? ['1', '2', '0'] : name === 'token' ? ['abc', 'x'.repeat(300)] : known;
  return fc.oneof(
    { arbitrary: fc.constantFrom(...plausible), weight: 4 },
    { arbitrary: fc.constantFrom('0', '-1', '1e9', '99999999999999999999', 'null', '%ZZ', '%', '%00', '..%2F..', 'a'.repeat(500)), weight: 2 },
    { arbitrary: fc.string({ maxLength: 20 }).map((s) => encodeURIComponent(s) || 'x'), weight: 1 },
  );
}

function queryArb(schema: z.ZodType | undefined): fc.Arbitrary<string> {
  const values = schemaArb(schema);
  return fc.oneof(
    values.map((v) => (v && typeof v === 'object' && !Array.isArray(v) ? new URLSearchParams(Object.entries(v as Json).map(([k, x]) => [k, typeof x === 'string' ? x : JSON.stringify(x)])).toString() : '')),
    fc.constantFrom('page=-1', 'page=1e999&pageSize=0', 'sort=__proto__', 'q=%ZZ', 'a[b][c]=1', 'page=1&page=2', `q=${'x'.repeat(3000)}`),
  );
}

// ---- the sweep -------------------------------------------------------------------------------

type Attempt = { who: Identity; method: string; path: string; body?: unknown; raw?: string; contentType?: string; contentEncoding?: string };

async function send(a: Attempt) {
  const agent = agents.get(a.who) ?? null;
  const m = a.method.toLowerCase() as 'get' | 'post' | 'patch' | 'put' | 'delete';
  let req = (agent ?? request(t.app))[m](a.path);
  if (a.contentEncoding) req = req.set('content-encoding', a.contentEncoding);
  if (a.raw !== undefined) return req.set('content-type', a.contentType ?? 'application/json').send(a.raw);
  if (a.contentType) req = req.set('content-type', a.contentType);
  if (a.body === undefined || m === 'get') return req;
  // a top-level string, number, boolean or null goes as its JSON text
  return a.body !== null && typeof a.body === 'object' ? req.send(a.body as object) : req.set('content-type', 'application/json').send(JSON.stringify(a.body) ?? 'null');
}

/** What went wrong with an answer: a 5xx, or a 4xx not in our error shape. */
function problemOf(a: Attempt, res: { status: number; body: unknown; headers: Record<string, string> }): string | null {
  const shown = `${a.who} ${a.method} ${a.path.slice(0, 120)} ${a.raw !== undefined ? `raw ${a.raw.slice(0, 80)}` : JSON.stringify(a.body ?? null).slice(0, 160)}`;
  if (res.status >= 500) return `${res.status}: ${shown} -> ${JSON.stringify(res.body).slice(0, 200)}`;
  if (res.status >= 400 && String(res.headers['content-type'] ?? '').includes('json') && !errorBodySchema.safeParse(res.body).success) return `${res.status} not in our error shape: ${shown} -> ${JSON.stringify(res.body).slice(0, 200)}`;
  return null;
}

/** Queued or running jobs (a fuzzed body may start a foundry run or a proof): cancel them, the sweep is about answers. */
function cancelJobs() {
  for (const id of t.deps.jobs.active()) t.deps.jobs.cancel(id);
}

const expand = (s: string) => s.replace(/\{(\w+)\}/g, (_m, k: string) => ids[k] ?? k);

function corpusBody(body: unknown): unknown {
  const text = JSON.stringify(body).replace(/\$nines65536/g, '9'.repeat(65_536));
  return JSON.parse(text, (_k, v: unknown) => (v && typeof v === 'object' && '$deepList' in v ? deepList(Number((v as { $deepList: number }).$deepList)) : v));
}

describe('hostile input never gets a 5xx', () => {
  // the app logs every 500 with console.error (tests/setup/node.ts fails a test on one): count them instead
  const quiet = () => vi.spyOn(console, 'error').mockImplementation(() => undefined);

  it('the corpus of known-bad inputs: every one a 4xx in our error shape', async () => {
    const spy = quiet();
    const problems: string[] = [];
    for (const c of corpus.cases) {
      const raw = c.raw?.replace('$deepArrays10000', `${'['.repeat(10_000)}${']'.repeat(10_000)}`);
      const a: Attempt = { who: c.as as Identity, method: c.method, path: expand(c.path), ...(c.body !== undefined ? { body: corpusBody(JSON.parse(expand(JSON.stringify(c.body)))) } : {}), ...(raw !== undefined ? { raw } : {}), ...(c.contentType ? { contentType: c.contentType } : {}), ...(c.contentEncoding ? { contentEncoding: c.contentEncoding } : {}) };
      const res = await send(a);
      const p = problemOf(a, res);
      if (p) problems.push(`${c.name}: ${p}`);
      else if (res.status < 400) problems.push(`${c.name}: answered ${res.status}, expected a 4xx`);
    }
    spy.mockRestore();
    expect(problems).toEqual([]);
  });

  it('every route x every identity, seeded inputs from the routes\u2019 own schemas', async () => {
    const spy = quiet();
    const routes = t.app.api.openapi.routes
      // endpoints that make the server call out to an address given in the body (webhook
      // subscriptions) are left out: a fuzzer must not aim the server at arbitrary hosts
      .filter((r) => !r.path.startsWith('/api/webhooks/endpoints') && !r.path.startsWith('/api/webhooks/deliveries'));
    expect(routes.length).toBeGreaterThan(60);
    const problems: string[] = [];
    let calls = 0;
    const t0 = Date.now();
    for (const [i, r] of routes.entries()) {
      const names = [...r.path.matchAll(/:([A-Za-z_]+)/g)].map((m) => m[1]!);
      const attempt = fc.record({
        params: fc.tuple(...names.map(paramArb)),
        query: queryArb(r.query),
        body: r.method === 'GET' ? fc.constant(undefined) : schemaArb(r.body),
      });
      const heavy = r.produces === 'application/pdf' || /\/(runs|proofs|recheck)$/.test(r.path) || (r.method === 'POST' && r.path === '/api/puzzles');
      for (const [k, who] of identities.entries()) {
        // who may call it gets the most tries; the rest must be refused cleanly, a few tries show it
        const runs = heavy ? 2 : who === 'admin' || who === 'editor' || who === 'setter' ? 6 : 2;
        for (const sample of fc.sample(attempt, { seed: SEED + i * 31 + k, numRuns: runs })) {
          let path = r.path;
          names.forEach((n, j) => {
            path = path.replace(`:${n}`, sample.params[j] ?? 'x');
          });
          if (sample.query) path += `?${sample.query}`;
          const a: Attempt = { who, method: r.method, path, ...(sample.body !== undefined ? { body: sample.body } : {}) };
          const res = await send(a);
          calls += 1;
          const p = problemOf(a, res);
          if (p) problems.push(p);
          if (heavy) cancelJobs();
        }
      }
    }
    cancelJobs();
    spy.mockRestore();
    console.log(`fuzz: ${calls} calls over ${routes.length} routes x ${identities.length} identities in ${((Date.now() - t0) / 1000).toFixed(1)} s, ${problems.length} problems`);
    expect(problems).toEqual([]);
  }, 180_000);
});
