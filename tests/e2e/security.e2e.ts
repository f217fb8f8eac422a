/**
 * Issue 13 in the browser, against the production server that `npm test` starts (with the peer-address
 * preload): the CSP every page must pass, framing and header rules, the open redirect after sign-in, a
 * cross-site form from another port of the same host, and client addresses that a header cannot change.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { baseUrl, launch, screenshot } from './browser';

const DEMO_PASSWORD = 'quasi-demo-2026';
let browser: Browser;
const contexts: BrowserContext[] = [];

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await browser?.close();
});

/** A page that records every CSP violation (the event and the console message Chromium prints). */
async function watchedPage(): Promise<{ page: Page; violations: string[] }> {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 } });
  contexts.push(ctx);
  const violations: string[] = [];
  await ctx.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { __csp: string[] }).__csp ??= [];
      (window as unknown as { __csp: string[] }).__csp.push(`${e.violatedDirective} ${e.blockedURI}`);
    });
  });
  const page = await ctx.newPage();
  page.on('console', (m) => {
    if (/Content Security Policy/i.test(m.text())) violations.push(m.text());
  });
  return { page, violations };
}

async function signIn(page: Page, email: string, next = '/signin') {
  await page.goto(`${baseUrl}${next}`);
  await page.fill('input[name=email]', email);
  await page.fill('input[name=password]', DEMO_PASSWORD);
  await page.click('button[type=submit]');
}

const pageViolations = (page: Page) => page.evaluate(() => (window as unknown as { __csp?: string[] }).__csp ?? []);

describe('security in the browser', () => {
  it('every page renders under the CSP without a single violation', async () => {
    const { page, violations } = await watchedPage();
    for (const path of ['/', '/signin', '/signup', '/reset', '/explore', '/docs/model-limits']) {
      const res = await page.goto(`${baseUrl}${path}`);
      expect(res?.status(), path).toBe(200);
      const csp = res!.headers()['content-security-policy'];
      expect(csp, path).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+' 'strict-dynamic'/);
      expect(csp).toContain("frame-ancestors 'none'");
      expect(res!.headers()['x-frame-options']).toBe('DENY');
      expect(res!.headers()['x-content-type-options']).toBe('nosniff');
      expect(res!.headers()['referrer-policy']).toBe('strict-origin-when-cross-origin');
      await page.waitForLoadState('networkidle');
      expect(await pageViolations(page), path).toEqual([]);
      if (path === '/signin') await screenshot(page, 'security-signin-csp');
    }
    // Signed in: projects, a project's tabs and the workspace, settings.
    await signIn(page, 'lead@harrowgate.test');
    await page.waitForURL(/\/projects$/);
    const href = await page.locator('a[href^="/projects/"]').filter({ hasNotText: 'New project' }).first().getAttribute('href');
    expect(href).toMatch(/^\/projects\/\d+$/);
    for (const path of ['/projects', href!, `${href}/history`, `${href}/exports`, `${href}/datasets`, `${href}/members`, `${href}/settings`, `${href}/workspace`, '/settings/tokens', '/admin/users', '/admin/mailbox']) {
      const res = await page.goto(`${baseUrl}${path}`);
      expect(res?.status(), path).toBe(200);
      await page.waitForLoadState('networkidle');
      expect(await pageViolations(page), path).toEqual([]);
    }
    expect(violations).toEqual([]);
    // Hydration worked under the CSP: the token form is live and makes a read-only token.
    await page.goto(`${baseUrl}/settings/tokens`);
    await page.fill('input[name=token-name]', 'csp check');
    await page.selectOption('select[name=token-scope]', 'read');
    await page.selectOption('select[name=token-days]', '30');
    await page.click('button:has-text("Create token")');
    await page.locator('[data-testid=new-token]').waitFor();
    await screenshot(page, 'security-settings-tokens');
    expect(await pageViolations(page)).toEqual([]);
  }, 240_000);

  it('blocks markup that slipped into a page: a script without the nonce and an event-handler attribute', async () => {
    const { page } = await watchedPage();
    // Simulate stored markup that got past rendering: the server's real answer (its CSP header included),
    // with a script and an onerror attribute spliced into the HTML.
    await page.route(`${baseUrl}/signin`, async (route) => {
      const res = await route.fetch();
      const html = (await res.text()).replace('<body', '<body data-x="1"').replace(/(<body[^>]*>)/, '$1<script>window.__pwned = "script"</script><img src="data:," onerror="window.__pwned = \'attribute\'">');
      await route.fulfill({ response: res, body: html });
    });
    await page.goto(`${baseUrl}/signin`);
    await page.waitForLoadState('networkidle');
    expect(await page.evaluate(() => (window as unknown as { __pwned?: string }).__pwned ?? 'nothing ran')).toBe('nothing ran');
    expect((await pageViolations(page)).length).toBeGreaterThanOrEqual(2);
    // The page itself still works (its own scripts carry the nonce): the form answers through React.
    await page.fill('input[name=email]', 'nobody@lab.test');
    await page.fill('input[name=password]', 'not the password');
    await page.click('button[type=submit]');
    await page.getByText('do not match an account').waitFor();
  });

  it('cannot be framed, not even by a page of our own host', async () => {
    const { page } = await watchedPage();
    const other = await servePage(`<iframe id="f" src="${baseUrl}/settings/tokens" width="800" height="600"></iframe>`);
    try {
      await page.goto(other.url);
      await page.waitForTimeout(1500);
      const frame = page.frames().find((f) => f.url().startsWith(baseUrl));
      const framed = frame ? await frame.evaluate(() => document.body?.innerText ?? '').catch(() => '') : '';
      expect(framed).not.toMatch(/API tokens|Sign in/);
    } finally {
      other.server.close();
    }
  });

  it('stays on the site after sign-in, whatever the callbackUrl says', async () => {
    const { page } = await watchedPage();
    await signIn(page, 'student@harrowgate.test', '/signin?callbackUrl=%2F%5Cevil.example%2F');
    await page.waitForURL(/\/projects$/);
    expect(new URL(page.url()).origin).toBe(new URL(baseUrl).origin);
    await signIn(page, 'student@harrowgate.test', '/signin?callbackUrl=%2Fexplore');
    await page.waitForURL(/\/explore$/);
  });

  it('refuses a form posted from another port of the same host with the victim’s cookie', async () => {
    const { page } = await watchedPage();
    await signIn(page, 'lead@harrowgate.test');
    await page.waitForURL(/\/projects$/);
    const href = await page.locator('a[href^="/projects/"]').filter({ hasNotText: 'New project' }).first().getAttribute('href');
    const pid = Number(href!.split('/')[2]);
    const victimMail = `csrf-${Date.now()}@lab.test`;
    // The attack of the review: an auto-submitting text/plain form that smuggles JSON.
    const attack = await servePage(`<form id="f" method="POST" enctype="text/plain" action="${baseUrl}/api/projects/${pid}/members">
      <input name='{"email":"${victimMail}","role":"owner","x":"' value='"}'></form><script>document.getElementById('f').submit()</script>`);
    try {
      const answer = page.waitForResponse((r) => r.url().includes(`/api/projects/${pid}/members`) && r.request().method() === 'POST');
      await page.goto(attack.url);
      const res = await answer;
      expect(res.status()).toBe(403);
      const members = await (await page.request.get(`${baseUrl}/api/projects/${pid}/members`)).json();
      expect(JSON.stringify(members)).not.toContain(victimMail);
    } finally {
      attack.server.close();
    }
  });

  it('counts requests by the socket address: rotating X-Forwarded-For (or forging the peer header) does not reset the limit', async () => {
    const ctx = await browser.newContext();
    contexts.push(ctx);
    let limitedAt = -1;
    for (let i = 0; i < 40 && limitedAt < 0; i++) {
      const res = await ctx.request.post(`${baseUrl}/api/account/reset`, {
        headers: { 'content-type': 'application/json', 'x-forwarded-for': `203.0.113.${i}`, 'x-tauforge-peer': `198.51.100.${i}` },
        data: { email: `rotating-${i}@lab.test` },
      });
      if (res.status() === 429) limitedAt = i;
      else expect(res.status()).toBe(202);
    }
    // The per-address limit for reset requests is 30 an hour; all 40 came from one socket address.
    expect(limitedAt).toBe(30);
  });

  it('answers JSON for unknown API paths and unsupported methods', async () => {
    const ctx = await browser.newContext();
    contexts.push(ctx);
    const missing = await ctx.request.get(`${baseUrl}/api/no/such/thing`);
    expect(missing.status()).toBe(404);
    expect((await missing.json()).error.code).toBe('not_found');
    // The bare /api path too (an optional catch-all claims it), not Next's HTML 404 page.
    const bare = await ctx.request.get(`${baseUrl}/api`);
    expect(bare.status()).toBe(404);
    expect(bare.headers()['content-type']).toContain('application/json');
    expect((await bare.json()).error.code).toBe('not_found');
    const put = await ctx.request.put(`${baseUrl}/api/projects`, { data: {} });
    expect(put.status()).toBe(405);
    expect(put.headers()['allow']).toBe('GET, HEAD, OPTIONS, POST');
    expect(await put.json()).toMatchObject({ error: { code: 'method_not_allowed', details: { allow: ['GET', 'HEAD', 'OPTIONS', 'POST'] } } });
    const health = await (await ctx.request.get(`${baseUrl}/api/health`)).json();
    expect(health.database.status).toBe('reachable');
    expect(health.database.error).toBeUndefined();
  });
});

/** A throwaway page on another port of 127.0.0.1: same host, another origin. */
async function servePage(html: string): Promise<{ server: Server; url: string }> {
  const server = createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
    res.end(`<!doctype html><html><body>${html}</body></html>`);
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  return { server, url: `http://127.0.0.1:${(server.address() as AddressInfo).port}/` };
}
