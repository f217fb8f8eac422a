/**
 * Uploads that wait in the queue. With the job queue paused (no worker takes anything), the upload route
 * waits for its parse as long as it may and then answers 202 with the job: the Datasets tab and the
 * workspace's "Keep in this project" follow that job (progress, Cancel in the tab), and once the queue runs
 * again show the stored dataset, or the reader's error for a file that is not a pattern.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { launch, screenshot, signInAndOpenProject } from './browser';
import { closeQueue, queue } from '../../lib/server/queue/connection';

let browser: Browser;
const work = mkdtempSync(path.join(tmpdir(), 'tf-upload-queued-'));
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await queue().resume().catch(() => {});
  await closeQueue();
  await browser?.close();
  rmSync(work, { recursive: true, force: true });
});

async function signedIn(): Promise<Page> {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const page = await ctx.newPage();
  // What the page asked the API, for the log when a step fails.
  page.on('response', (r) => {
    if (r.url().includes('/api/') && !r.url().includes('/api/auth')) console.log(`${r.request().method()} ${new URL(r.url()).pathname} → ${r.status()}`);
  });
  page.on('console', (m) => {
    if (m.type() === 'error') console.log(`page console: ${m.text()}`);
  });
  await signInAndOpenProject(page);
  return page;
}

/** A small two-column pattern: a Gaussian line on a flat background. */
function patternFile(name: string): string {
  const f = path.join(work, name);
  const rows = Array.from({ length: 400 }, (_, i) => {
    const tt = 10 + i * 0.2;
    return `${tt.toFixed(2)} ${(20 + 500 * Math.exp(-0.5 * ((tt - 40) / 0.3) ** 2)).toFixed(2)}`;
  });
  writeFileSync(f, ['2theta intensity', ...rows].join('\n') + '\n');
  return f;
}

describe('uploads answered 202 (parse queued)', () => {
  it('the Datasets tab follows the job to the stored dataset, and to the reader\'s error for a bad file', async () => {
    const page = await signedIn();
    await page.goto(`${page.url()}/datasets`);
    await queue().pause();
    try {
      const good = patternFile(`queued-${Date.now()}.xy`);
      await page.setInputFiles('input[type=file]', good);
      await page.getByRole('button', { name: 'Upload', exact: true }).click();
      // The route waits for the parse (its time limit + 20 s), then answers 202; the page follows the job.
      await page.getByTestId('upload-job').waitFor({ timeout: 60_000 });
      await expect.poll(() => page.getByTestId('upload-job').textContent()).toMatch(/waiting for a worker/);
      expect(await page.getByRole('button', { name: 'Cancel' }).count()).toBe(1);
      await screenshot(page, 'upload-queued-waiting');
      await queue().resume();
      await page.getByText(`${path.basename(good)} stored: 400 points`).waitFor({ timeout: 60_000 });
      expect(await page.getByTestId('upload-job').count()).toBe(0);
      await expect.poll(() => page.locator('table tbody tr').filter({ hasText: path.basename(good) }).count()).toBe(1);
      await screenshot(page, 'upload-queued-stored');

      // A file that is not a pattern, read as one: the job fails and the tab shows the reader's message.
      await queue().pause();
      const bad = path.join(work, 'not-a-pattern.xy');
      writeFileSync(bad, '2theta intensity\n10.0 5\n10.02 lots\n');
      await page.setInputFiles('input[type=file]', bad);
      await page.getByLabel('Read as').selectOption('pattern');
      await page.getByRole('button', { name: 'Upload', exact: true }).click();
      await page.getByTestId('upload-job').waitFor({ timeout: 60_000 });
      await queue().resume();
      // The notice names the file and the reader's reason (the progress label, gone now, named the file too).
      await page.getByText(/not-a-pattern\.xy: .*line 3/).waitFor({ timeout: 60_000 });
      expect(await page.getByTestId('upload-job').count()).toBe(0);
      await expect.poll(() => page.locator('table tbody tr').filter({ hasText: 'not-a-pattern.xy' }).count()).toBe(0);
      await screenshot(page, 'upload-queued-refused');
    } finally {
      await queue().resume();
    }
  }, 240_000);

  it('"Keep in this project" in the workspace follows the job and then names the stored dataset', async () => {
    const page = await signedIn();
    await page.goto(`${page.url()}/workspace`);
    await page.waitForSelector('[data-testid=estimate]');
    await page.getByRole('button', { name: /Generate|Cut again/ }).click();
    await page.waitForSelector('[data-testid=atom-count]', { timeout: 60_000 });
    await page.getByRole('tab', { name: 'Diffraction' }).click();
    await page.getByRole('tab', { name: 'Powder pattern' }).click();
    await page.getByRole('button', { name: 'Compute powder pattern' }).click();
    await page.waitForSelector('[aria-label="Powder pattern"] canvas', { timeout: 90_000 });
    const file = patternFile(`kept-${Date.now()}.xy`);
    await page.setInputFiles('input[aria-label="Measured pattern file"]', file);
    await queue().pause();
    try {
      await page.getByRole('button', { name: 'Keep in this project' }).click();
      await page.getByTestId('keep-progress').waitFor({ timeout: 60_000 });
      expect(await page.getByTestId('keep-progress').textContent()).toMatch(/waiting for a worker/);
      await screenshot(page, 'keep-queued-waiting');
      await queue().resume();
      await page.getByText(`${path.basename(file)} is now a dataset of this project.`).waitFor({ timeout: 60_000 }).catch(async (e) => {
        await screenshot(page, 'keep-queued-failed');
        throw e;
      });
      expect(await page.getByRole('alert').filter({ hasText: /Storing|nothing was stored/ }).count()).toBe(0);
      await screenshot(page, 'keep-queued-stored');
    } finally {
      await queue().resume();
    }
  }, 240_000);
});
