import express from 'express';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createApp } from '../../../server/app';
import { serveBuiltClient } from '../../../server/platform/http/static-client';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { securityHeaders } from '../../../server/platform/http/security-headers';
import { createTestApp, type TestApp } from '../helpers/test-app';

// Response headers (issue 15): a Content-Security-Policy without inline scripts, no framing
// by other sites except where framing is meant (our own PDFs in our iframes; /embed/ for the
// origins a publication allows), nosniff, a referrer policy. Directive names and values as in
// CSP Level 3 (W3C) and the Fetch/Referrer Policy specifications.

let t: TestApp;
let withClient: express.Express;
let clientDir: string;
beforeAll(async () => {
  t = await createTestApp();
  // the app as production serves it: the built client (a stand-in index.html) after the API
  clientDir = mkdtempSync(join(tmpdir(), 'sw-client-'));
  writeFileSync(join(clientDir, 'index.html'), '<!doctype html><title>Squarewright</title><div id="root"></div><script type="module" src="/assets/main.js"></script>');
  withClient = createApp(t.deps, { mountClient: (app) => serveBuiltClient(app, clientDir) });
});
afterAll(async () => {
  rmSync(clientDir, { recursive: true, force: true });
  await t.close();
});

function directives(csp: string | undefined): Map<string, string> {
  const m = new Map<string, string>();
  for (const part of (csp ?? '').split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) m.set(name, values.join(' '));
  }
  return m;
}

describe('every answer', () => {
  it.each([['/api/health'], ['/api/no-such-route'], ['/'], ['/editions/1']])('%s carries CSP, frame protection, nosniff and a referrer policy', async (path) => {
    const res = await request(withClient).get(path);
    expect(res.status).toBeLessThan(500);
    const csp = directives(res.headers['content-security-policy']);
    expect(csp.get('default-src')).toBe("'self'");
    expect(csp.get('script-src')).toBe("'self'");
    expect(csp.get('script-src')).not.toMatch(/unsafe-inline|unsafe-eval/);
    expect(csp.get('object-src')).toBe("'none'");
    expect(csp.get('base-uri')).toBe("'self'");
    expect(csp.get('frame-ancestors')).toBe("'none'");
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('same-origin');
    expect(res.headers['x-powered-by']).toBeUndefined();
    // plain http here: no HSTS and no upgrade of our own requests
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(csp.has('upgrade-insecure-requests')).toBe(false);
  });

  it('an https PUBLIC_URL adds HSTS and upgrade-insecure-requests', async () => {
    const secure = await createTestApp({ env: { PUBLIC_URL: 'https://desk.example.com' } });
    try {
      const res = await request(secure.app).get('/api/health');
      expect(res.headers['strict-transport-security']).toMatch(/^max-age=\d+/);
      expect(directives(res.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(true);
    } finally {
      await secure.close();
    }
  });
});

describe('framing', () => {
  it("our PDF files may be framed by our own pages only ('self', SAMEORIGIN)", async () => {
    const editor = await t.signInAs('editor');
    // (an unknown template: the 404 is enough to see the route's headers, without a render)
    const res = await editor.get('/api/templates/no-such-template/sample.pdf').expect(404);
    expect(directives(res.headers['content-security-policy']).get('frame-ancestors')).toBe("'self'");
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
  });

  it('/embed/ pages get the origins their route allows (res.locals.frameAncestors), nothing else', async () => {
    const app = express();
    app.use(securityHeaders({ mode: 'built', https: false }));
    app.get('/embed/a', (_req, res) => {
      res.locals.frameAncestors = ['https://news.example', 'https://*.evil.example', 'javascript:alert(1)', "'self'"];
      res.type('html').send('<p>puzzle</p>');
    });
    app.get('/embed/b', (_req, res) => {
      res.type('html').send('<p>not allowed anywhere</p>');
    });
    app.get('/page', (_req, res) => {
      res.locals.frameAncestors = ['https://news.example'];
      res.type('html').send('<p>not an embed</p>');
    });
    const a = await request(app).get('/embed/a').expect(200);
    expect(directives(a.headers['content-security-policy']).get('frame-ancestors')).toBe("https://news.example 'self'");
    expect(a.headers['x-frame-options']).toBeUndefined();
    const b = await request(app).get('/embed/b').expect(200);
    expect(directives(b.headers['content-security-policy']).get('frame-ancestors')).toBe("'none'");
    expect(b.headers['x-frame-options']).toBe('DENY');
    const page = await request(app).get('/page').expect(200);
    expect(directives(page.headers['content-security-policy']).get('frame-ancestors')).toBe("'none'");
  });
});
