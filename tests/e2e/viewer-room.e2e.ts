/**
 * The 3D view in the workspace takes the room it needs, against the production build with the demo seed:
 * with the model panel and the view controls folded away the view spans most of a 1440 × 900 window, full
 * window fills it and Esc leaves; the axis buttons carry their indices and looking down one really looks
 * down it; a shift-click measurement is drawn as a line with its length, to the nearest periodic image.
 *
 * Outside references:
 * - The five-fold axis [0 1 τ] of the standard cubic setting (icosahedron vertices at the cyclic
 *   permutations of (0, ±1, ±τ); from memory, e.g. Coxeter, Regular Polytopes).
 * - The minimum image in a cubic cell of edge a: each component of d reduced by a·round(d/a) (Allen &
 *   Tildesley, Computer Simulation of Liquids, §1.5 — from memory); the plain distance is |d|.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { launch, screenshot, signInAndOpenWorkspace, viewerFrames } from './browser';

type Pt = { x: number; y: number };
const HOOK = 'window.__tauforgeViewer';

let browser: Browser;
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  await browser?.close();
});

const canvasBox = async (page: Page) => (await page.getByTestId('viewer-canvas').boundingBox())!;
const frames = viewerFrames;

/** Wait until the view has drawn again and stopped drawing (render on demand settles). */
async function settle(page: Page): Promise<void> {
  let last = -1;
  for (let i = 0; i < 40; i++) {
    const now = await frames(page);
    if (now === last && now > 0) return;
    last = now;
    await page.waitForTimeout(250);
  }
}

/** The readout row of a picked atom: its index and Cartesian position (Å). */
async function pickedRows(page: Page): Promise<{ id: number; xyz: number[] }[]> {
  const rows = await page.getByTestId('picked-atom').allInnerTexts();
  return rows.map((t) => {
    const cells = t.split('\t');
    return { id: Number(cells[0].replace('#', '')), xyz: cells[3].trim().split(/\s+/).map(Number) };
  });
}

describe('the 3D view takes the room it needs', () => {
  it('folds the side panels, fills the window, names the axes and draws a measurement', async () => {
    const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const page = await ctx.newPage();
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await signInAndOpenWorkspace(page);
    const order = page.getByLabel(/^Order/);
    if ((await order.inputValue()) !== '2/1') await order.fill('2/1');
    await page.getByRole('button', { name: /^(Generate|Cut again)$/ }).click();
    await page.waitForSelector('[data-testid=atom-count]', { timeout: 90_000 });
    await page.waitForFunction(() => ((window as unknown as { __tauforgeViewer?: { frames(): number } }).__tauforgeViewer?.frames() ?? 0) > 0, null, { timeout: 60_000 });
    await settle(page);
    const open = await canvasBox(page);
    // The Check strip is one line in the top bar (details open over the view): the canvas keeps its height, about
    // 554 px at 1440×900 with both panels open, as before the strip existed.
    await screenshot(page, 'viewer-room-1440-panels-open');
    expect(open.height).toBeGreaterThan(540);
    // The strip names the space group the page's finder gives; its details open over the view, not above it.
    const check = page.getByTestId('check-panel');
    await expect.poll(() => check.getByTestId('check-space-group').innerText(), { timeout: 30_000 }).toMatch(/^space group .+ \(No\. \d+\)$/);
    await check.getByRole('button', { name: 'Details', exact: true }).click();
    await page.locator('#check-details').waitFor();
    expect((await canvasBox(page)).height).toBeCloseTo(open.height, 0);
    await screenshot(page, 'viewer-room-1440-check-details');
    await check.getByRole('button', { name: 'Hide details' }).click();

    // Both side panels folded: the view spans at least 70 % of the window's width.
    await page.getByRole('button', { name: 'Hide the model panel' }).click();
    await page.getByRole('button', { name: 'Hide view controls' }).click();
    await expect.poll(async () => (await canvasBox(page)).width).toBeGreaterThan(0.7 * 1440);
    const folded = await canvasBox(page);
    expect(folded.width).toBeGreaterThan(open.width + 500);
    await settle(page);
    await screenshot(page, 'viewer-room-1440-panels-folded');

    // The other tabs still work with the panel folded, and the view comes back.
    await page.getByRole('tab', { name: 'Perpendicular space' }).click();
    await page.getByRole('tab', { name: '3D model' }).click();
    await page.waitForFunction(() => ((window as unknown as { __tauforgeViewer?: { frames(): number } }).__tauforgeViewer?.frames() ?? 0) > 0, null, { timeout: 60_000 });

    // Full window: the view covers the browser window; Esc brings the page back.
    await page.getByRole('button', { name: 'Full window' }).click();
    await expect.poll(async () => (await canvasBox(page)).width).toBeGreaterThan(0.96 * 1440);
    const full = await canvasBox(page);
    expect(full.height).toBeGreaterThan(0.75 * 900);
    expect(full.x).toBeLessThan(20);
    expect(full.y).toBeLessThan(20);
    await settle(page);
    await screenshot(page, 'viewer-room-1440-full-window');
    await page.getByRole('application').focus();
    await page.keyboard.press('Escape');
    await expect.poll(() => page.locator('[data-full-window]').count()).toBe(0);
    expect((await canvasBox(page)).width).toBeCloseTo(folded.width, -1);

    // Axis buttons carry their indices. Flat projection, then down [0 1 τ]: two points one apart along the
    // axis land on the same pixel.
    await page.getByRole('button', { name: 'View controls' }).click();
    await page.getByLabel('Flat (orthographic)').check();
    const five = page.getByRole('group', { name: '5-fold' });
    expect(await five.getByRole('button', { name: 'Look down 5-fold axis [0 1 τ]' }).innerText()).toBe('[0 1 τ]');
    await five.getByRole('button', { name: 'Look down 5-fold axis [0 1 τ]' }).click();
    await expect.poll(() => page.getByTestId('view-axis').innerText()).toBe('5-fold [0 1 τ]');
    const TAU = (1 + Math.sqrt(5)) / 2;
    const n = Math.hypot(1, TAU);
    // The camera glides to the new direction; wait for it to arrive (slow under software WebGL) before measuring.
    await settle(page);
    await expect
      .poll(
        async () => {
          const [p, q] = (await page.evaluate(`[${HOOK}.pointScreen([3, 2, 1]), ${HOOK}.pointScreen([3, 2 + 10 / ${n}, 1 + 10 * ${TAU} / ${n}])]`)) as Pt[];
          return Math.hypot(p.x - q.x, p.y - q.y);
        },
        { timeout: 30_000 },
      )
      .toBeLessThan(0.5);
    await settle(page);
    await screenshot(page, 'viewer-room-1440-five-fold');

    // Down the cell edge [1 0 0] the cell's two faces y = 0 and y = a are the left and right (or top and
    // bottom) edges of the picture: pick an atom on one, shift-click one on the other.
    await page.getByRole('group', { name: 'edges' }).getByRole('button', { name: 'Look down cell row [1 0 0]' }).click();
    await settle(page);
    const count = Number((await page.textContent('[data-testid=atom-count]'))!.replace(/,/g, ''));
    const screen = (await page.evaluate(`Array.from({ length: ${count} }, (_, i) => ${HOOK}.atomScreen(i))`)) as Pt[];
    const box = await canvasBox(page);
    const onCanvas = screen.map((s, i) => ({ ...s, i })).filter((s) => s.x > box.x + 10 && s.x < box.x + box.width - 10 && s.y > box.y + 10 && s.y < box.y + box.height - 10);
    // Only atoms a click can reach: not under the view's own buttons or the axis gizmo drawn over the canvas.
    const reachable = (await page.evaluate(
      (pts: Pt[]) => pts.map((p) => document.elementFromPoint(p.x, p.y)?.tagName === 'CANVAS' && document.elementFromPoint(p.x, p.y)?.closest('[data-testid=viewer-canvas]') !== null),
      onCanvas.map(({ x, y }) => ({ x, y })),
    )) as boolean[];
    const inside = onCanvas.filter((_, k) => reachable[k]);
    const spreadX = Math.max(...inside.map((s) => s.x)) - Math.min(...inside.map((s) => s.x));
    const spreadY = Math.max(...inside.map((s) => s.y)) - Math.min(...inside.map((s) => s.y));
    const key = spreadX >= spreadY ? 'x' : 'y';
    const first = inside.reduce((a, b) => (b[key] < a[key] ? b : a));
    const second = inside.reduce((a, b) => (b[key] > a[key] ? b : a));
    await screenshot(page, 'viewer-room-1440-cell-edge');
    await page.mouse.click(first.x, first.y);
    await expect.poll(() => page.getByTestId('picked-atom').count()).toBe(1);
    await page.keyboard.down('Shift');
    await page.mouse.click(second.x, second.y);
    await page.keyboard.up('Shift');
    await expect.poll(() => page.getByTestId('picked-atom').count()).toBe(2);
    const [r0, r1] = await pickedRows(page);
    const cellText = (await page.locator('text=/a = [0-9.]+ Å/').first().innerText()).match(/a = ([0-9.]+) Å/)!;
    const a = Number(cellText[1]);
    const d = r1.xyz.map((x, k) => x - r0.xyz[k]);
    const plain = Math.hypot(...d);
    const nearest = Math.hypot(...d.map((x) => x - a * Math.round(x / a)));
    expect(nearest).toBeLessThan(plain - 1); // the two atoms really are closer across the face

    // The line is drawn with its length beside it, at the nearest image (readout coordinates are rounded
    // to 0.001 Å, hence the tolerance).
    const label = page.getByTestId('measure-label');
    await expect.poll(() => label.count()).toBe(1);
    expect(Math.abs(Number((await label.innerText()).replace(' Å', '')) - nearest)).toBeLessThan(0.004);
    expect(await page.getByTestId('measure').innerText()).toMatch(/image \[/);
    await settle(page);
    await screenshot(page, 'viewer-room-1440-measure-nearest');
    // The line's pixels: brass along the segment from the first atom towards its partner's image.
    const image = r1.xyz.map((x, k) => r0.xyz[k] + d[k] - a * Math.round(d[k] / a));
    const [s0, s1] = (await page.evaluate(`[${HOOK}.pointScreen(${JSON.stringify(r0.xyz)}), ${HOOK}.pointScreen(${JSON.stringify(image)})]`)) as Pt[];
    const brass = await brassAlong(page, s0, s1);
    expect(brass).toBeGreaterThan(0.6);

    // Nearest image off: the line goes to the atom inside the cell, |d| long.
    await page.getByLabel('nearest image').uncheck();
    await expect.poll(async () => Math.abs(Number((await label.innerText()).replace(' Å', '')) - plain)).toBeLessThan(0.004);
    await settle(page);
    await screenshot(page, 'viewer-room-1440-measure-plain');

    // 1024 × 700: panels folded, the view still takes most of the width.
    await page.setViewportSize({ width: 1024, height: 700 });
    await page.getByRole('button', { name: 'Hide view controls' }).click();
    await expect.poll(async () => (await canvasBox(page)).width).toBeGreaterThan(0.7 * 1024);
    await settle(page);
    await screenshot(page, 'viewer-room-1024-panels-folded');
    await page.getByRole('button', { name: 'Show the model panel' }).click();
    await page.getByRole('button', { name: 'View controls' }).click();
    await settle(page);
    await screenshot(page, 'viewer-room-1024-panels-open');

    expect(errors).toEqual([]);
    await ctx.close();
  });
});

/**
 * Share of sample points between 25 % and 75 % of the way from a to b (screen pixels) where the picture has
 * a brass pixel (#b8862b, the measurement colour) within 2 px.
 */
async function brassAlong(page: Page, a: Pt, b: Pt): Promise<number> {
  const rect = (await page.getByTestId('viewer-canvas').locator('canvas').first().boundingBox())!;
  return (await page.evaluate(
    async ({ url, a, b, rect }) => {
      const img = new Image();
      img.src = url;
      await img.decode();
      const c = document.createElement('canvas');
      c.width = img.width;
      c.height = img.height;
      const g = c.getContext('2d')!;
      g.drawImage(img, 0, 0);
      const sx = img.width / rect.width;
      const sy = img.height / rect.height;
      let hits = 0;
      const samples = 21;
      for (let k = 0; k < samples; k++) {
        const t = 0.25 + (0.5 * k) / (samples - 1);
        const x = Math.round((a.x + t * (b.x - a.x) - rect.x) * sx);
        const y = Math.round((a.y + t * (b.y - a.y) - rect.y) * sy);
        const px = g.getImageData(x - 2, y - 2, 5, 5).data;
        let found = false;
        for (let i = 0; i < px.length; i += 4) {
          if (Math.abs(px[i] - 0xb8) < 30 && Math.abs(px[i + 1] - 0x86) < 30 && Math.abs(px[i + 2] - 0x2b) < 40) found = true;
        }
        if (found) hits++;
      }
      return hits / samples;
    },
    { url: (await page.evaluate(`${HOOK}.snapshot()`)) as string, a, b, rect },
  )) as number;
}
