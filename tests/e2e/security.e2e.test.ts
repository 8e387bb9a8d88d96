import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page, Response } from 'playwright-core';
import { baseUrl, screenshot, signIn, useBrowser, type DemoRole } from './helpers/browser';

// The built client passes its own Content-Security-Policy (issue 15): on every page of every
// role (the main navigation's pages and one detail page of each kind linked from them), on
// the signed-out pages and on the readers' public pages and embeds, Chromium reports no CSP violation (securitypolicyviolation events and
// "Refused to ..." console messages, as the CSP Level 3 spec has browsers report them).
//
// And forged requests in the browser: a page on another port of the same host is the same
// *site* for cookies (RFC 6265bis: ports do not count), so SameSite=Lax sends the session cookie
// with its form posts; only our same-origin check (server/platform/http/same-origin.ts) stops them.

const detailPatterns = [/^\/stock\/\d+$/, /^\/puzzles\/\d+$/, /^\/editions\/[^/]+$/, /^\/foundry\/runs\/[^/]+$/, /^\/proofs\/[^/]+$/, /^\/admin\/mailbox\/[^/]+$/, /^\/submissions\/[^/]+$/];

async function watchCsp(page: Page): Promise<void> {
  await page.addInitScript(() => {
    const w = window as unknown as { __csp: string[] };
    w.__csp = [];
    document.addEventListener('securitypolicyviolation', (e) => w.__csp.push(`${e.violatedDirective} blocked ${e.blockedURI || '(inline)'} at ${e.sourceFile}:${e.lineNumber}`));
  });
}

async function violations(page: Page): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []);
}

async function visit(page: Page, path: string, seen: string[], found: string[]) {
  await page.goto(path);
  await page.waitForLoadState('networkidle').catch(() => undefined);
  await page.waitForTimeout(300);
  seen.push(path);
  for (const v of await violations(page)) found.push(`${path}: ${v}`);
}

describe('Content-Security-Policy in the browser', () => {
  const harness = useBrowser();

  it('the signed-out pages raise no CSP violation', async () => {
    const page = harness.page();
    await watchCsp(page);
    const seen: string[] = [];
    const found: string[] = [];
    for (const path of ['/sign-in', '/forgot-password', '/reset-password?token=abc', '/invite/not-a-token']) await visit(page, path, seen, found);
    const res = await page.request.get(`${baseUrl()}/sign-in`);
    expect(res.headers()['content-security-policy']).toContain("script-src 'self'");
    expect(found).toEqual([]);
    expect(harness.consoleErrors().filter((e) => /Content Security Policy|Refused to/i.test(e))).toEqual([]);
    // the watch itself works: an inline script added to the page is refused and reported
    await page.evaluate(() => {
      const s = document.createElement('script');
      s.textContent = 'window.__inlineRan = true';
      document.head.append(s);
    });
    await expect.poll(() => violations(page)).toEqual([expect.stringMatching(/^script-src.* blocked inline/)]);
    expect(await page.evaluate(() => (window as unknown as { __inlineRan?: boolean }).__inlineRan)).toBeUndefined();
  });

  it("the readers' public pages (publications, editions, puzzles with their play script, embeds) raise no CSP violation", { timeout: 120_000 }, async () => {
    const page = harness.page();
    await watchCsp(page);
    const seen: string[] = [];
    const found: string[] = [];
    // walk the public pages from /read by their own links: a publication, an edition, its puzzles
    const queue = ['/read'];
    const visited = new Set<string>();
    while (queue.length > 0 && visited.size < 12) {
      const path = queue.shift()!;
      if (visited.has(path)) continue;
      visited.add(path);
      await visit(page, path, seen, found);
      const links = await page.locator('a[href^="/read/"]').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).pathname));
      for (const href of links) if (!visited.has(href) && !href.endsWith('/solution')) queue.push(href);
    }
    const puzzlePages = seen.filter((p) => /^\/read\/[^/]+\/\d+\/\d+$/.test(p));
    expect(puzzlePages.length, `puzzle pages among ${seen.join(', ')}`).toBeGreaterThan(0);
    // the play script ran (it replaces the server's board with its own)
    await visit(page, puzzlePages[0]!, seen, found);
    await page.locator('#play').waitFor();
    for (const path of [puzzlePages[0]!.replace(/^\/read\//, '/embed/')]) await visit(page, path, seen, found);
    await screenshot(page, 'csp-reader-embed');
    expect(found).toEqual([]);
    expect(harness.consoleErrors().filter((e) => /Content Security Policy|Refused to/i.test(e))).toEqual([]);
  });

  for (const role of ['admin', 'editor', 'setter', 'printer'] as DemoRole[]) {
    it(`every page of the ${role} raises no CSP violation`, { timeout: 180_000 }, async () => {
      const page = harness.page();
      await watchCsp(page);
      await signIn(page, role);
      const hrefs = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').evaluateAll((links) => links.map((a) => (a as HTMLAnchorElement).pathname));
      const seen: string[] = [];
      const found: string[] = [];
      const details = new Map<RegExp, string>();
      for (const path of ['/', ...new Set(hrefs)]) {
        await visit(page, path, seen, found);
        const links = await page.locator('main a[href^="/"]').evaluateAll((as) => as.map((a) => (a as HTMLAnchorElement).pathname));
        for (const href of links) {
          const pattern = detailPatterns.find((p) => p.test(href));
          if (pattern && !details.has(pattern)) details.set(pattern, href);
        }
      }
      for (const path of details.values()) await visit(page, path, seen, found);
      await screenshot(page, `csp-${role}-last-page`);
      expect(seen.length).toBeGreaterThan(2);
      expect(found).toEqual([]);
      expect(harness.consoleErrors().filter((e) => /Content Security Policy|Refused to/i.test(e))).toEqual([]);
    });
  }
});

describe('forged requests from another origin in the browser', () => {
  const harness = useBrowser();
  let attacker: Server;
  let attackerUrl = '';
  // the attacker's pages: each auto-submits one form to the app (paths in the query string)
  beforeAll(async () => {
    attacker = createServer((req, res) => {
      const url = new URL(req.url ?? '/', 'http://x');
      const target = `${baseUrl()}${url.searchParams.get('to') ?? '/'}`;
      const enctype = url.searchParams.get('enctype') ?? 'application/x-www-form-urlencoded';
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
      res.end(`<!doctype html><title>prize</title><form id="f" method="post" enctype="${enctype}" action="${target}"><input name="note" value="forged"></form><script>document.getElementById('f').submit()</script>`);
    });
    await new Promise<void>((resolve) => attacker.listen(0, '127.0.0.1', resolve));
    attackerUrl = `http://127.0.0.1:${(attacker.address() as AddressInfo).port}`;
  });
  afterAll(() => new Promise<void>((resolve) => attacker.close(() => resolve())));

  async function forge(page: Page, to: string, enctype?: string): Promise<Response> {
    const answer = page.waitForResponse((r) => r.url() === `${baseUrl()}${to}` && r.request().method() === 'POST', { timeout: 15_000 });
    await page.goto(`${attackerUrl}/?to=${encodeURIComponent(to)}${enctype ? `&enctype=${encodeURIComponent(enctype)}` : ''}`);
    return answer;
  }

  it('a signed-in editor is not signed out, and no re-check starts, from a same-site page on another port', { timeout: 120_000 }, async () => {
    const page = harness.page();
    await signIn(page, 'editor', { fresh: true });
    const list = (await (await page.request.get('/api/puzzles')).json()) as { items: { id: number }[] };
    const id = list.items[0]?.id;
    expect(id, 'the demo has a puzzle').toBeTypeOf('number');
    const before = await (await page.request.get(`/api/puzzles/${id}`)).json();

    const signOut = await forge(page, '/api/auth/sign-out');
    // the browser did send the session cookie (same site) and its own Origin: the check refused it
    expect((await signOut.request().allHeaders()).cookie ?? '').toMatch(/session_token/);
    expect(await signOut.request().headerValue('origin')).toBe(attackerUrl);
    expect(signOut.status()).toBe(403);
    expect(((await signOut.json()) as { error: { code: string; message: string } }).error).toMatchObject({ code: 'forbidden', message: expect.stringMatching(/cross-site request refused/i) });

    const recheck = await forge(page, `/api/puzzles/${id}/recheck`, 'multipart/form-data');
    expect(recheck.status()).toBe(403);
    await screenshot(page, 'csrf-forged-recheck-refused');

    // still signed in, and the puzzle is as it was (no re-check job started)
    expect((await page.request.get('/api/me')).status()).toBe(200);
    expect(await (await page.request.get(`/api/puzzles/${id}`)).json()).toEqual(before);
    // our own pages still work: the app's own sign-out from the same session succeeds
    const own = await page.request.post('/api/auth/sign-out', { headers: { origin: baseUrl() } });
    expect(own.status()).toBe(200);
    expect((await page.request.get('/api/me')).status()).toBe(401);
  });
});
