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
