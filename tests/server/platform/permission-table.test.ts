import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { isAllowed, permissions } from '../../../server/platform/auth/permissions';
import { roles, type Role } from '../../../shared/contracts/common';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The permission table against the app that is actually built: every route of every area is
// guarded as the table says (product.md: "Every rule above is enforced by the server on every
// route"). Path parameters are filled with '1'; the guard answers before any parsing.
let t: TestApp;
const agents = new Map<Role, Awaited<ReturnType<TestApp['signInAs']>>>();
beforeAll(async () => {
  t = await createTestApp();
  for (const role of roles) agents.set(role, await t.signInAs(role));
});
afterAll(() => t.close());

function routes() {
  return [...t.app.api.registered].map((key) => {
    const [method, path] = key.split(' ') as [string, string];
    return { key, method: method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete', url: path.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '1') };
  });
}

describe('the permission table', () => {
  it('names only routes the app registers (a mistyped key would guard nothing)', () => {
    expect(Object.keys(permissions).filter((k) => !t.app.api.registered.has(k))).toEqual([]);
  });

  it('every route that needs a session answers 401 without one', async () => {
    const open: string[] = [];
    for (const r of routes()) {
      if (permissions[r.key] === 'public') continue;
      const res = await request(t.app)[r.method](r.url).send({});
      if (res.status !== 401) open.push(`${r.key} -> ${res.status}`);
    }
    expect(open).toEqual([]);
  });

  it('every role-restricted route answers 403 to each role the table leaves out', async () => {
    const leaks: string[] = [];
    for (const r of routes()) {
      const access = permissions[r.key];
      if (access === undefined || access === 'public' || access === 'signed-in') continue;
      for (const role of roles) {
        if (isAllowed(access, role)) continue;
        const res = await agents.get(role)![r.method](r.url).send({});
        if (res.status !== 403) leaks.push(`${r.key} as ${role} -> ${res.status}`);
      }
    }
    expect(leaks).toEqual([]);
  });

  it('the OpenAPI document covers every registered route', () => {
    const doc = t.app.api.openapi.document('test') as { paths: Record<string, Record<string, unknown>> };
    const documented = Object.entries(doc.paths).flatMap(([p, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${p}`));
    for (const key of t.app.api.registered) expect(documented, key).toContain(key.replace(/:([A-Za-z_][A-Za-z0-9_]*)/g, '{$1}'));
  });
});
