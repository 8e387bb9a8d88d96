import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import SwaggerParser from '@apidevtools/swagger-parser';
import { Validator } from '@seriousme/openapi-schema-validator';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { z } from 'zod';
import { contractModules, operationIdOf } from '../../../server/platform/http/openapi';
import { routeExamples } from '../../../server/platform/http/openapi-examples';
import { permissions } from '../../../server/platform/auth/permissions';
import { apiKeyScopeOfRoute } from '../../../server/platform/auth/api-key-scopes';
import { createTestApp, type TestApp } from '../helpers/test-app';

// The API document at /api/openapi.json, checked by two independent validators from the npm
// registry (issue 18): @seriousme/openapi-schema-validator (the OpenAPI 3.1 JSON schema) and
// @apidevtools/swagger-parser (validates and resolves every $ref). Before the fix both failed
// on "#/$defs/__schema0" (the rich text's recursive references pointed at the document root).

type Doc = {
  openapi: string;
  paths: Record<string, Record<string, { operationId: string; security: unknown[]; responses: Record<string, { $ref?: string }>; requestBody?: unknown; description: string }>>;
  components: { schemas: Record<string, unknown>; responses: Record<string, { content: { 'application/json': { schema: { $ref: string }; example: unknown } } }> };
};

let t: TestApp;
let doc: Doc;
beforeAll(async () => {
  t = await createTestApp();
  doc = (await request(t.app).get('/api/openapi.json').expect(200)).body as Doc;
});
afterAll(() => t.close());

describe('the OpenAPI 3.1 document', () => {
  it('is valid for @seriousme/openapi-schema-validator', async () => {
    const result = await new Validator().validate(structuredClone(doc));
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it('is valid for @apidevtools/swagger-parser, which also resolves every reference', async () => {
    await expect(SwaggerParser.validate(structuredClone(doc) as never)).resolves.toBeTruthy();
  });

  it('has no reference to the document root or to unnamed definitions; each points at a component that exists', () => {
    const text = JSON.stringify(doc);
    expect(text).not.toContain('$defs');
    expect(text).not.toContain('__schema');
    const refs = [...text.matchAll(/"\$ref":"([^"]+)"/g)].map((m) => m[1]!);
    expect(refs.length).toBeGreaterThan(100);
    for (const ref of new Set(refs)) {
      const [, kind, name] = /^#\/components\/(schemas|responses)\/(\w+)$/.exec(ref) ?? [];
      expect(kind, ref).toBeDefined();
      expect(doc.components[kind as 'schemas' | 'responses'][name!], ref).toBeDefined();
    }
  });

  it('names the recursive rich text as a component that refers to itself', () => {
    const node = JSON.stringify(doc.components.schemas.RichTextNode);
    expect(node).toContain('"#/components/schemas/RichTextNode"');
  });

  it('documents every operation with a unique operationId, its security and its errors', () => {
    const ids = new Set<string>();
    for (const [path, ops] of Object.entries(doc.paths)) {
      for (const [method, op] of Object.entries(ops)) {
        const key = `${method.toUpperCase()} ${path.replace(/\{(\w+)\}/g, ':$1')}`;
        expect(ids.has(op.operationId), op.operationId).toBe(false);
        ids.add(op.operationId);
        expect(op.operationId).toBe(operationIdOf(method, path.replace(/\{(\w+)\}/g, ':$1')));
        const access = permissions[key];
        if (access === undefined) continue; // better-auth's own endpoints, documented by the accounts area
        if (access === 'public') {
          expect(op.security, key).toEqual([]);
          continue;
        }
        expect(op.security, key).toContainEqual({ session: [] });
        const scope = apiKeyScopeOfRoute[key];
        if (scope) expect(op.security, key).toContainEqual({ apiKey: [scope] });
        else expect(op.security, key).toHaveLength(1);
        for (const status of ['401', '403', '429']) expect(op.responses[status]?.$ref, `${key} ${status}`).toMatch(/^#\/components\/responses\//);
        if (path.includes('{')) expect(op.responses['404']?.$ref, `${key} 404`).toBe('#/components/responses/NotFound');
        if (method !== 'get') for (const status of ['409', '422']) expect(op.responses[status], `${key} ${status}`).toBeDefined();
        if (op.requestBody) for (const status of ['400', '413']) expect(op.responses[status], `${key} ${status}`).toBeDefined();
      }
    }
  });

  it('documents each upload route\u2019s form (a file in the field "file") and its 400 and 413', () => {
    const uploads = t.app.api.openapi.routes.filter((r) => r.bodyType === 'multipart');
    expect(uploads.map((r) => `${r.method} ${r.path}`)).toContain('POST /api/submissions/upload');
    for (const r of uploads) {
      const op = doc.paths[r.path.replace(/:(\w+)/g, '{$1}')]![r.method.toLowerCase()]!;
      const form = (op.requestBody as { content: Record<string, { schema: { properties: Record<string, unknown>; required: string[] } }> } | undefined)?.content['multipart/form-data'];
      expect(form?.schema.properties.file, `${r.method} ${r.path}`).toBeDefined();
      expect(form?.schema.required).toContain('file');
      for (const status of ['400', '413']) expect(op.responses[status]?.$ref, `${r.method} ${r.path} ${status}`).toMatch(/^#\/components\/responses\//);
    }
  });

  it('answers errors in our one error shape, with an example of each', () => {
    const statuses = { BadRequest: 'bad_request', Unauthorized: 'unauthorized', Forbidden: 'forbidden', NotFound: 'not_found', Conflict: 'conflict', PayloadTooLarge: 'payload_too_large', Unprocessable: 'unprocessable', TooManyRequests: 'rate_limited' };
    for (const [name, code] of Object.entries(statuses)) {
      const r = doc.components.responses[name]!;
      expect(r.content['application/json'].schema.$ref).toBe('#/components/schemas/Error');
      expect(r.content['application/json'].example).toMatchObject({ error: { code } });
    }
  });

  it('every example a route gives parses with the route\u2019s own schemas', () => {
    let checked = 0;
    for (const r of t.app.api.openapi.routes) {
      if (r.examples?.request !== undefined) {
        expect(r.body, `${r.method} ${r.path}`).toBeDefined();
        r.body!.parse(r.examples.request);
        checked += 1;
      }
      if (r.examples?.response !== undefined) {
        expect(r.response, `${r.method} ${r.path}`).toBeDefined();
        r.response!.parse(r.examples.response);
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThan(5);
  });

  it('every JSON request body and answer carries an example', () => {
    const missing: string[] = [];
    for (const [path, ops] of Object.entries(doc.paths)) {
      for (const [method, op] of Object.entries(ops)) {
        const body = (op.requestBody as { content?: Record<string, { example?: unknown }> } | undefined)?.content?.['application/json'];
        if (body && body.example === undefined) missing.push(`${method.toUpperCase()} ${path} request`);
        const ok = Object.entries(op.responses).find(([k]) => k.startsWith('2'))?.[1] as { content?: Record<string, { example?: unknown }> } | undefined;
        const answer = ok?.content?.['application/json'];
        if (answer && answer.example === undefined) missing.push(`${method.toUpperCase()} ${path} answer`);
      }
    }
    expect(missing).toEqual([]);
  });

  it('the examples table names registered routes, and each of its examples parses', () => {
    for (const [key, ex] of Object.entries(routeExamples)) {
      expect(t.app.api.registered.has(key), key).toBe(true);
      const r = t.app.api.openapi.routes.find((x) => `${x.method} ${x.path}` === key)!;
      if (ex.request !== undefined) r.body!.parse(ex.request);
      if (ex.response !== undefined) r.response!.parse(ex.response);
    }
  });

  it('every file in shared/contracts/ with a zod schema is named to the document (so its schemas keep their names)', async () => {
    const dir = join(import.meta.dirname, '../../../shared/contracts');
    const files = readdirSync(dir).filter((f) => f.endsWith('.ts')).map((f) => f.replace(/\.ts$/, ''));
    expect(Object.keys(contractModules).filter((m) => !files.includes(m))).toEqual([]);
    const unnamed: string[] = [];
    for (const f of files.filter((m) => !(m in contractModules))) {
      // a contract file of plain functions (no schema) needs no name in the document
      const exports = (await import(join(dir, `${f}.ts`))) as Record<string, unknown>;
      if (Object.values(exports).some((v) => v instanceof z.ZodType)) unnamed.push(f);
    }
    expect(unnamed).toEqual([]);
  });

  it('the API-key scope table names only routes the app registers', () => {
    expect(Object.keys(apiKeyScopeOfRoute).filter((k) => !t.app.api.registered.has(k))).toEqual([]);
  });
});
