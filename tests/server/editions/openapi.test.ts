import request from 'supertest';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

it('documents the print routes in the OpenAPI document', async () => {
  const res = await request(t.app).get('/api/openapi.json').expect(200);
  const paths = Object.keys(res.body.paths ?? {});
  for (const p of ['/api/publications', '/api/editions', '/api/editions/{id}', '/api/editions/{id}/proofs', '/api/templates']) expect(paths).toContain(p);
});
