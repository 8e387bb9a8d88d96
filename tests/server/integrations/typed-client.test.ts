import { spawnSync } from 'node:child_process';
import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { join, resolve } from 'node:path';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';

// A typed client generated from /api/openapi.json, as another system would make one (issue 18):
// openapi-typescript 7.13 (from the registry; in tests/tools/typegen with the TypeScript 5
// compiler API it needs) turns the document into types, TypeScript 5's tsc checks a small
// client written against them with openapi-fetch 0.17 (strict; a call to a route that does not
// exist must NOT compile), and the client then talks to the running server with an API key.
// A document the generator cannot read, or types that do not fit the API, fail here.

const root = resolve(import.meta.dirname, '../../..');
const typegen = join(root, 'tests/tools/typegen/node_modules');
const work = join(root, '.tmp', `typed-client-${process.pid}`);

const clientSource = `import createClient from 'openapi-fetch';
import type { components, paths } from './api';

type ErrorBody = components['schemas']['Error'];

export async function run(baseUrl: string, key: string) {
  const client = createClient<paths>({ baseUrl, headers: { Authorization: \`Bearer \${key}\` } });
  const list = await client.GET('/api/stock', { params: { query: { pageSize: 3, orderMin: 9 } } });
  const page = list.data;
  const orders: number[] = page?.items.map((i) => i.order) ?? [];
  const first = page?.items[0];
  const summary = await client.GET('/api/stock/summary');
  const one = first ? await client.GET('/api/stock/{id}', { params: { path: { id: first.id } } }) : undefined;
  // a write the key's scope does not allow: typed error body
  const denied = await client.POST('/api/puzzles', { body: { stockId: String(first?.id ?? 1), kind: 'assembly' } as never });
  const deniedError: ErrorBody | undefined = denied.error;
  const deniedCode: string | undefined = deniedError?.error.code;
  // @ts-expect-error a route the document does not have must not compile
  await client.GET('/api/no-such-route');
  return {
    status: list.response.status,
    total: page?.total,
    ids: page?.items.map((i) => i.id) ?? [],
    firstOrder: orders[0],
    detailOrder: one?.data?.order,
    summaryStatus: summary.response.status,
    deniedStatus: denied.response.status,
    deniedCode,
  };
}
`;

let t: TestApp;
let server: Server;
let baseUrl: string;

beforeAll(async () => {
  t = await createTestApp({ demo: { seeders: [] } });
  server = createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  mkdirSync(work, { recursive: true });
});
afterAll(async () => {
  server.closeAllConnections();
  await new Promise<void>((r) => server.close(() => r()));
  await t.close();
  rmSync(work, { recursive: true, force: true });
});

describe('a client generated from the API document', () => {
  it('generates, type-checks against the live document, and works with a stock:read key', async () => {
    // the demo stock (our engine's wheel tilings) to read
    const { seedDemoStock } = await import('../../../server/areas/intake/index');
    seedDemoStock(t.deps);
    const doc = (await request(t.app).get('/api/openapi.json').expect(200)).body;
    writeFileSync(join(work, 'openapi.json'), JSON.stringify(doc));

    const gen = spawnSync(process.execPath, [join(typegen, 'openapi-typescript/bin/cli.js'), join(work, 'openapi.json'), '-o', join(work, 'api.d.ts')], { encoding: 'utf8' });
    expect(gen.status, gen.stderr).toBe(0);
    const types = readFileSync(join(work, 'api.d.ts'), 'utf8');
    expect(types).toContain('"/api/stock/{id}"');
    expect(types).toContain('RichTextNode: {');

    writeFileSync(join(work, 'client.ts'), clientSource);
    const compilerOptions = { noEmit: true, strict: true, noUncheckedIndexedAccess: true, target: 'es2022', module: 'esnext', moduleResolution: 'bundler', skipLibCheck: true, lib: ['es2022', 'dom'], types: [] };
    writeFileSync(join(work, 'tsconfig.json'), JSON.stringify({ compilerOptions, files: ['client.ts'] }));
    const tsc = spawnSync(process.execPath, [join(typegen, 'typescript/bin/tsc'), '-p', join(work, 'tsconfig.json')], { encoding: 'utf8', cwd: work });
    expect(tsc.status, tsc.stdout + tsc.stderr).toBe(0);

    const editor = await t.signInAs('editor');
    const key = (await editor.post('/api/api-keys').send({ name: 'generated client', scopes: ['stock:read'], expiresInDays: 1 }).expect(201)).body.secret as string;
    const { run } = (await import(join(work, 'client.ts'))) as { run: (b: string, k: string) => Promise<Record<string, unknown>> };
    const got = await run(baseUrl, key);
    const direct = (await editor.get('/api/stock?pageSize=3&orderMin=9').expect(200)).body as { total: number; items: { id: number; order: number }[] };
    expect(direct.items.length).toBeGreaterThan(0);
    expect(got).toEqual({
      status: 200,
      total: direct.total,
      ids: direct.items.map((i) => i.id),
      firstOrder: direct.items[0]!.order,
      detailOrder: direct.items[0]!.order,
      summaryStatus: 200,
      deniedStatus: 403,
      deniedCode: 'forbidden',
    });
  }, 120_000);
});
