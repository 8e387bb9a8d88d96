import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../helpers/test-app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('the intake routes in /api/openapi.json', () => {
  it('documents every intake and stock route with its access', async () => {
    const res = await request(t.app).get('/api/openapi.json').expect(200);
    const paths = Object.keys(res.body.paths);
    for (const p of ['/api/tilings/check', '/api/submissions', '/api/submissions/upload', '/api/submissions/uploads/{id}', '/api/submissions/uploads/{id}/cancel', '/api/submissions/uploads/{id}/retry', '/api/submissions/{id}', '/api/submissions/{id}/accept', '/api/submissions/{id}/reject', '/api/submissions/bulk', '/api/stock', '/api/stock/{id}', '/api/stock/{id}/image.png', '/api/stock/export.csv', '/api/stock/export.txt', '/api/stock/summary']) {
      expect(paths, p).toContain(p);
    }
  });
});
