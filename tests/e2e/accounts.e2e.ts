/**
 * Team work end to end, in Chromium against the production build with the demo seed:
 * sign up → confirm the address from the mail the site sent (read on the admin's mailbox page) →
 * create a project → save two revisions → a second user forks it (with its history) → downloads an XYZ of the fork.
 * The XYZ is checked against the Fibonacci numbers (OEIS A000045: F(11) = 89), not against our code.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { readFileSync } from 'node:fs';
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

async function newPage(): Promise<Page> {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 900 }, acceptDownloads: true });
  contexts.push(ctx);
  return ctx.newPage();
}

async function signIn(page: Page, email: string, password: string) {
  await page.goto(`${baseUrl}/signin`);
  await page.fill('input[name=email]', email);
  await page.fill('input[name=password]', password);
  await page.click('button[type=submit]');
  await page.waitForURL(/\/projects$/);
}

describe('accounts and sharing', () => {
  it('sign up, confirm by mail, create, save twice, fork as another user, download XYZ', async () => {
    const email = `e2e-${Date.now()}@lab.test`;
    const password = 'a perfectly long password';

    // 1. Sign up.
    const me = await newPage();
    await me.goto(`${baseUrl}/signup`);
    await me.fill('input[name=name]', 'Ilse Brandt');
    await me.fill('input[name=email]', email);
    await me.fill('input[name=password]', password);
    await me.click('button[type=submit]');
    await me.getByText('confirmation link is on its way').waitFor();
    // Not confirmed yet: signing in is refused with a clear message.
    await me.goto(`${baseUrl}/signin`);
    await me.fill('input[name=email]', email);
    await me.fill('input[name=password]', password);
    await me.click('button[type=submit]');
    await me.getByText('Confirm your address first').waitFor();

    // 2. The demo admin finds the confirmation mail on the mailbox page.
    const admin = await newPage();
    await signIn(admin, 'lead@harrowgate.test', DEMO_PASSWORD);
    await admin.goto(`${baseUrl}/admin/mailbox`);
    await admin.fill('input[type=search]', email);
    const mail = admin.locator('[data-testid=mail]').filter({ hasText: 'Confirm your Tauforge address' }).first();
    await mail.waitFor();
    await screenshot(admin, 'accounts-mailbox');
    const link = await mail.locator('a[href*="/verify?token="]').getAttribute('href');
    expect(link).toMatch(/\/verify\?token=[A-Za-z0-9_-]{20,}$/);

    // 3. Confirm, sign in, create a project from the Fibonacci starter.
    await me.goto(link!.replace(/^https?:\/\/[^/]+/, baseUrl));
    await me.click('text=Confirm my address');
    await me.waitForURL(/\/signin\?notice=verified/);
    await me.fill('input[name=email]', email);
    await me.fill('input[name=password]', password);
    await me.click('button[type=submit]');
    await me.waitForURL(/\/projects$/);
    await me.click('text=New project');
    await me.check('input[value=fibonacci]');
    await me.fill('input[name=name]', 'Chain for the phason study');
    await me.fill('input[name=tags]', '1D, phason');
    await me.selectOption('select[name=visibility]', 'unlisted');
    await screenshot(me, 'accounts-new-project');
    await me.click('button[type=submit]');
    await me.waitForURL(/\/projects\/\d+$/);
    const projectUrl = me.url();

    // 4. Two revisions.
    for (const [order, n] of [[8, 2], [9, 3]] as const) {
      await me.fill('textarea[name=params]', JSON.stringify({ family: 'fibonacci', order, approximant: true }, null, 2));
      await me.fill('input[name=message]', `order ${order}`);
      await me.click('text=Save revision');
      await me.getByText(`Saved as revision ${n}.`).waitFor();
    }
    await me.goto(`${projectUrl}/history`);
    await me.getByText('order 9').waitFor();
    await screenshot(me, 'accounts-history');

    // 5. The demo student forks the unlisted project from its link.
    const student = await newPage();
    await signIn(student, 'student@harrowgate.test', DEMO_PASSWORD);
    await student.goto(projectUrl);
    await student.click('button:has-text("Fork")');
    await student.waitForURL((u) => /\/projects\/\d+$/.test(u.pathname) && u.href !== projectUrl);
    await student.locator('[data-testid=forked-from]').getByText('Chain for the phason study').waitFor();
    expect(await student.locator('[data-testid=forked-from]').textContent()).toMatch(/revision 3/);

    // The fork carries the parent's history: its head is the parent's revision 3, by the parent's author.
    const forkUrl = student.url();
    await student.getByText(/Head: revision 3 “order 9” by /).waitFor();

    // 6. …and downloads the XYZ of the fork's head.
    await student.selectOption('select[aria-label="Export format"]', 'xyz');
    const [download] = await Promise.all([student.waitForEvent('download'), student.click('button:has-text("Export revision 3")')]);
    expect(download.suggestedFilename()).toMatch(/\.xyz$/);
    const text = readFileSync((await download.path())!, 'utf8');
    const lines = text.trimEnd().split('\n');
    // Order 9 approximant: one period holds F(11) = 89 vertices.
    expect(lines[0].trim()).toBe('89');
    expect(lines.length).toBe(2 + 89);
    expect(lines[1]).toContain('"order":9');
    for (const l of lines.slice(2)) expect(l).toMatch(/^\S+\s+-?\d+\.\d+\s+-?\d+\.\d+\s+-?\d+\.\d+$/);
    await screenshot(student, 'accounts-fork');
    await student.goto(`${forkUrl}/history`);
    for (const m of ['order 8', 'order 9']) await student.getByText(m, { exact: true }).first().waitFor();
    await screenshot(student, 'accounts-fork-history');

    // The original counts the fork in its lineage (forks start private, so it is not named).
    await me.goto(projectUrl);
    await me.locator('[data-testid=lineage-forks]').getByText('1 private fork by others.').waitFor();
    await screenshot(me, 'accounts-project');
  }, 300_000);
});
