import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { existsSync } from 'node:fs';
import { baseUrl, launch, screenshot } from './browser';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('landing page', () => {
  it('shows the product name, says what it is for, and loads our own fonts', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const res = await page.goto(baseUrl + '/');
    expect(res?.status()).toBe(200);
    await expect(page.title()).resolves.toBe('Tauforge');
    const h1 = await page.locator('h1').first().textContent();
    expect(h1).toBe('Tauforge');
    expect(await page.locator('main').textContent()).toMatch(/approximants/);
    await page.evaluate(() => document.fonts.ready);
    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(family).toMatch(/plex/i);
    const file = await screenshot(page, 'landing');
    expect(existsSync(file)).toBe(true);
    await page.close();
  });

  it('has its own icon and a robots.txt, and no request of the page fails', async () => {
    const page = await browser.newPage();
    const failed: string[] = [];
    page.on('response', (r) => {
      if (r.status() >= 400) failed.push(`${r.status()} ${r.url()}`);
    });
    await page.goto(baseUrl + '/');
    await page.waitForLoadState('networkidle');
    expect(failed).toEqual([]);
    // The <link rel=icon> Next.js writes for app/icon.svg, and the /favicon.ico browsers ask for by themselves.
    const href = await page.locator('head link[rel=icon]').first().getAttribute('href');
    const svg = await page.request.get(new URL(href!, baseUrl).href);
    expect(svg.status()).toBe(200);
    expect(svg.headers()['content-type']).toMatch(/^image\/svg\+xml/);
    const ico = await page.request.get(baseUrl + '/favicon.ico');
    expect(ico.status()).toBe(200);
    // ICONDIR header (reserved 0, type 1 = icon), as the ICO format defines it.
    expect([...(await ico.body()).subarray(0, 4)]).toEqual([0, 0, 1, 0]);
    const robots = await page.request.get(baseUrl + '/robots.txt');
    expect(robots.status()).toBe(200);
    expect(await robots.text()).toMatch(/^User-agent: \*$[\s\S]*^Disallow: \/api\/$/m);
    await page.close();
  });

  it('answers an unknown page with our 404', async () => {
    const page = await browser.newPage();
    const res = await page.goto(baseUrl + '/no-such-page');
    expect(res?.status()).toBe(404);
    expect(await page.locator('h1').textContent()).toMatch(/Nothing was cut here/);
    await page.close();
  });

  it('serves /api/health with the database up', async () => {
    const page = await browser.newPage();
    const res = await page.request.get(baseUrl + '/api/health');
    expect(res.status()).toBe(200);
    expect((await res.json()).database.reachable).toBe(true);
    await page.close();
  });
});
