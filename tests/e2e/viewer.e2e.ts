import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { existsSync } from 'node:fs';
import { baseUrl, launch, screenshot, viewerFrames } from './browser';

interface Hook {
  frames(): number;
  atomScreen(i: number): { x: number; y: number } | null;
  renderFrames(k: number): { msPerFrame: number; triangles: number; calls: number };
}
const hook = `window.__tauforgeViewer`;
const frames = viewerFrames;

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

describe('structure viewer (lab page)', () => {
  it('draws, turns, looks down a five-fold axis, slices, picks an atom and saves a picture', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await page.goto(baseUrl + '/lab/viewer?n=300');
    await page.waitForFunction(() => ((window as unknown as { __tauforgeViewer?: Hook }).__tauforgeViewer?.frames() ?? 0) > 0, null, { timeout: 60_000 });

    // One draw call per species (3 in this set) plus nothing else; two triangles per atom.
    const stats = (await page.evaluate(`${hook}.renderFrames(1)`)) as { triangles: number; calls: number };
    expect(stats.calls).toBe(3);
    expect(stats.triangles).toBe(600);

    // Render on demand: nothing is drawn while nothing moves…
    const idle = await frames(page);
    await page.waitForTimeout(400);
    expect(await frames(page)).toBe(idle);

    // …and a drag draws.
    const box = (await page.getByTestId('viewer-canvas').boundingBox())!;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width / 2 + 60, box.y + box.height / 2 + 20, { steps: 3 });
    await page.mouse.up();
    await expect.poll(() => frames(page)).toBeGreaterThan(idle);

    // The first five-fold axis of the setting, u1 ∝ (1, τ, 0) (lib/models/icosahedral/hyperlattice.ts).
    await page.getByRole('button', { name: 'Look down 5-fold axis [1 τ 0]' }).click();
    await expect.poll(() => page.getByTestId('view-axis').innerText()).toBe('5-fold [1 τ 0]');

    await page.getByLabel('Show one slab only').check();
    await expect.poll(() => page.getByText(/keeps .* ≤ n·r ≤/).count()).toBe(1);

    // Atom 0 sits at the origin, inside the central slab: click where the viewer draws it.
    const at = (await page.evaluate(`${hook}.atomScreen(0)`)) as { x: number; y: number };
    await page.mouse.click(at.x, at.y);
    const row = page.getByTestId('picked-atom').first();
    await expect.poll(() => row.count()).toBe(1);
    const text = await row.innerText();
    expect(text).toMatch(/#0/);
    expect(text).toMatch(/Pd|Mn|Al/);
    expect(text).toMatch(/window/); // its site class

    // The keyboard turns the view too.
    const before = await frames(page);
    await page.getByRole('application').focus();
    await page.keyboard.press('ArrowLeft');
    await expect.poll(() => frames(page)).toBeGreaterThan(before);

    const png = (await page.evaluate(`${hook}.snapshot()`)) as string;
    expect(png.startsWith('data:image/png;base64,')).toBe(true);
    expect(png.length).toBeGreaterThan(2000);

    const file = await screenshot(page, 'viewer');
    expect(existsSync(file)).toBe(true);
    expect(errors).toEqual([]);
    await page.close();
  });
});
