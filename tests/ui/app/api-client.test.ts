import { afterEach, describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError, apiRequest, buildUrl } from '../../../src/lib/api-client';

// The error body shape is the product's API contract (product.md "API shape"):
// { "error": { "code", "message", "details"? } }.

function answer(status: number, body: unknown) {
  vi.stubGlobal(
    'fetch',
    vi.fn(async () => new Response(body === undefined ? null : JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } })),
  );
}

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('apiRequest', () => {
  const schema = z.object({ n: z.number() });

  it('returns the body parsed by the schema', async () => {
    answer(200, { n: 3, extra: 'dropped' });
    await expect(apiRequest('/api/x', { schema })).resolves.toEqual({ n: 3 });
  });

  it('turns the server error envelope into an ApiError with status, code, message and details', async () => {
    answer(400, { error: { code: 'bad_request', message: 'body.email: must be an e-mail address', details: [{ path: 'body.email', message: 'x' }] } });
    const error = await apiRequest('/api/x', { schema }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'bad_request', message: 'body.email: must be an e-mail address' });
    expect((error as ApiError).details).toEqual([{ path: 'body.email', message: 'x' }]);
  });

  it('names the status when an error answer has no envelope', async () => {
    answer(502, undefined);
    await expect(apiRequest('/api/x', { schema })).rejects.toMatchObject({ status: 502, code: 'http_502' });
  });

  it('refuses a body that does not match the schema, saying where', async () => {
    answer(200, { n: 'three' });
    const error = (await apiRequest('/api/x', { schema }).catch((e: unknown) => e)) as ApiError;
    expect(error.code).toBe('bad_response');
    expect(error.message).toContain('/api/x');
    expect(error.message).toContain('n');
  });

  it('reports a network failure as network_error', async () => {
    vi.stubGlobal('fetch', vi.fn(async () => Promise.reject(new TypeError('Failed to fetch'))));
    await expect(apiRequest('/api/x', { schema })).rejects.toMatchObject({ status: 0, code: 'network_error' });
  });

  it('sends JSON bodies with a content type', async () => {
    const fetchStub = vi.fn(async (..._args: unknown[]) => new Response(JSON.stringify({ n: 1 }), { status: 200 }));
    vi.stubGlobal('fetch', fetchStub);
    await apiRequest('/api/x', { schema, method: 'POST', body: { a: 1 } });
    const init = fetchStub.mock.calls[0]?.[1] as RequestInit;
    expect(init.method).toBe('POST');
    expect(init.body).toBe('{"a":1}');
    expect((init.headers as Record<string, string>)['content-type']).toBe('application/json');
  });
});

describe('buildUrl', () => {
  it('leaves out empty values and encodes the rest', () => {
    expect(buildUrl('/api/stock', { q: 'a b', order: 13, state: '', x: undefined, y: null })).toBe('/api/stock?q=a+b&order=13');
    expect(buildUrl('/api/stock', {})).toBe('/api/stock');
  });
});
