import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page, type Response } from 'playwright-core';
import { afterAll, afterEach, beforeAll, beforeEach, inject } from 'vitest';

// Debian's Chromium driven by playwright-core (never a downloaded browser).
// When it is missing, every browser test is skipped with the reason and the install
// command; REQUIRE_BROWSER=1 (CI) turns that into a failure.

export const chromiumPath = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const chromiumArgs = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export type DemoRole = 'admin' | 'editor' | 'setter' | 'printer';

/** Why the browser tests cannot run here, or undefined when they can. */
export function browserMissingReason(): string | undefined {
  if (existsSync(chromiumPath)) return undefined;
  return `Chromium not found at ${chromiumPath}; install it with: apt-get install -y chromium (or set CHROMIUM_PATH)`;
}

/** The base URL of the app started by tests/e2e/global-setup.ts. */
export function baseUrl(): string {
  return inject('baseUrl');
}

/** Launches Debian's Chromium headless with our fixed flags (fresh profile every launch). */
export function launchBrowser(): Promise<Browser> {
  return chromium.launch({ executablePath: chromiumPath, args: chromiumArgs, headless: true });
}

export interface BrowserHarness {
  /** The shared browser of this test file. */
  browser: () => Browser;
  /** A fresh context (own cookies) for this test; closed after it. */
  context: () => BrowserContext;
  /** A page in that context. */
  page: () => Page;
  /** Another isolated context, e.g. a second person; closed after the test. */
  newContext: () => Promise<BrowserContext>;
  /** Errors the pages of this test logged to the browser console, or threw uncaught. */
  consoleErrors: () => string[];
}

/**
 * Call once at the top of an e2e test file (or describe block): launches Chromium for
 * the file, gives each test a fresh context and page, and skips (or, with
 * REQUIRE_BROWSER=1, fails) every test when Chromium is missing.
 */
export function useBrowser(): BrowserHarness {
  let browser: Browser | undefined;
  let context: BrowserContext | undefined;
  let page: Page | undefined;
  const extra: BrowserContext[] = [];
  const errors: string[] = [];
  const missing = browserMissingReason();
  const watch = (c: BrowserContext) => {
    c.on('page', (p) => {
      p.on('console', (m) => {
        if (m.type() === 'error') errors.push(`${p.url()}: ${m.text()}`);
      });
      p.on('pageerror', (e) => errors.push(`${p.url()}: uncaught ${e.message}`));
    });
    return c;
  };

  beforeAll(async () => {
    if (missing) {
      console.warn(`e2e ${process.env.REQUIRE_BROWSER === '1' ? 'FAILED' : 'skipped'}: ${missing}`);
      return;
    }
    browser = await launchBrowser();
  });
  beforeEach(async (ctx) => {
    if (!browser) {
      // CI sets REQUIRE_BROWSER=1: a missing browser must fail every test, not hide them.
      if (process.env.REQUIRE_BROWSER === '1') throw new Error(`REQUIRE_BROWSER=1 but ${missing ?? 'no browser was launched'}`);
      ctx.skip(missing ?? 'no browser');
      return;
    }
    errors.length = 0;
    context = watch(await browser.newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 860 } }));
    page = await context.newPage();
  });
  afterEach(async (ctx) => {
    if (page && ctx.task.result?.state === 'fail') {
      await screenshot(page, `failed-${ctx.task.name}`).catch(() => undefined);
    }
    for (const c of extra.splice(0)) await c.close().catch(() => undefined);
    await context?.close().catch(() => undefined);
    context = undefined;
    page = undefined;
  });
  afterAll(async () => {
    await browser?.close();
  });

  const need = <T,>(value: T | undefined, what: string): T => {
    if (value === undefined) throw new Error(`${what} is not ready (used outside a test?)`);
    return value;
  };
  return {
    browser: () => need(browser, 'the browser'),
    context: () => need(context, 'the browser context'),
    page: () => need(page, 'the page'),
    newContext: async () => {
      const c = watch(await need(browser, 'the browser').newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 860 } }));
      extra.push(c);
      return c;
    },
    consoleErrors: () => [...errors],
  };
}

const demoSchemaCheck = (body: unknown): { email: string; role: string }[] => {
  const accounts = (body as { demoAccounts?: unknown }).demoAccounts;
  if (!Array.isArray(accounts)) throw new Error('GET /api/public/config lists no demoAccounts: is the server in demo mode?');
  return accounts.filter((a): a is { email: string; role: string } => typeof a?.email === 'string' && typeof a?.role === 'string');
};

/** The demo account of a role and the demo password, as the running server publishes them (GET /api/public/config). */
export async function demoAccount(role: DemoRole): Promise<{ email: string; password: string }> {
  const res = await fetch(`${baseUrl()}/api/public/config`);
  if (!res.ok) throw new Error(`GET /api/public/config answered ${res.status}`);
  const body: unknown = await res.json();
  const account = demoSchemaCheck(body).find((a) => a.role === role);
  const password = (body as { demoPassword?: unknown }).demoPassword;
  if (!account || typeof password !== 'string') throw new Error(`no demo account for role ${role}`);
  return { email: account.email, password };
}

/** Fills in the sign-in form with the given credentials and submits it (does not wait for success). */
export async function submitSignIn(page: Page, email: string, password: string): Promise<void> {
  if (!/\/sign-in(\?|$)/.test(page.url())) await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
}

/**
 * Submits the sign-in form and returns the server's answer. Sign-in is rate-limited per
 * client address (5 a minute by default) and every e2e file shares one server, so when
 * the server answers 429 this waits out its Retry-After once and submits again. Give
 * tests that sign in through the form a timeout of at least 90 s.
 */
export async function submitSignInForAnswer(page: Page, email: string, password: string): Promise<Response> {
  let res: Response | undefined;
  for (let attempt = 0; attempt < 2; attempt += 1) {
    const answer = page.waitForResponse((r) => r.url().includes('/api/auth/sign-in/'), { timeout: 15_000 });
    await submitSignIn(page, email, password);
    res = await answer;
    if (res.status() !== 429 || attempt > 0) break;
    const retry = Number(res.headers()['x-retry-after'] ?? res.headers()['retry-after'] ?? '60');
    const wait = (Number.isFinite(retry) && retry > 0 ? retry : 60) + 1;
    console.warn(`e2e: sign-in rate limit reached; waiting ${wait} s`);
    await new Promise((r) => setTimeout(r, wait * 1000));
  }
  if (!res) throw new Error('no sign-in answer');
  return res;
}

/** Signs in through the form (see submitSignInForAnswer) and waits for the main navigation. */
export async function signInWithForm(page: Page, email: string, password: string): Promise<void> {
  const res = await submitSignInForAnswer(page, email, password);
  if (!res.ok()) throw new Error(`sign-in as ${email} answered ${res.status()}: ${await res.text()}`);
  await page.getByRole('navigation', { name: 'Main' }).waitFor({ timeout: 15_000 });
}

function sessionFile(role: DemoRole): string {
  return join(inject('e2eDataDir'), 'e2e-sessions', `${role}.json`);
}

/**
 * Signs in as the demo account of `role` and opens its home. The first sign-in of a role
 * in a run goes through the form; later ones reuse its session cookies (saved in the
 * run's data folder), sparing the sign-in rate limit. `fresh: true` always uses the form.
 * Never sign out a reused session: sign out in a fresh one.
 */
export async function signIn(page: Page, role: DemoRole, options: { fresh?: boolean } = {}): Promise<void> {
  const file = sessionFile(role);
  if (!options.fresh && existsSync(file)) {
    const cookies = JSON.parse(readFileSync(file, 'utf8')) as Parameters<BrowserContext['addCookies']>[0];
    await page.context().addCookies(cookies);
    await page.goto('/');
    const ok = await page
      .getByRole('navigation', { name: 'Main' })
      .waitFor({ timeout: 10_000 })
      .then(() => true)
      .catch(() => false);
    if (ok) return;
    await page.context().clearCookies();
  }
  const { email, password } = await demoAccount(role);
  await signInWithForm(page, email, password);
  mkdirSync(dirname(file), { recursive: true });
  writeFileSync(file, JSON.stringify(await page.context().cookies()));
}

/** The labels of the main navigation, in order. */
export async function navLabels(page: Page): Promise<string[]> {
  const links = page.getByRole('navigation', { name: 'Main' }).getByRole('link');
  return (await links.allInnerTexts()).map((t) => t.trim());
}

export const screensDir = resolve(import.meta.dirname, '..', '..', '..', '.tmp', 'screens');

/** Saves a full-page PNG to .tmp/screens/<name>.png and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(screensDir, { recursive: true });
  const file = join(screensDir, `${name.replace(/[^a-z0-9._-]+/gi, '-').toLowerCase()}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}
