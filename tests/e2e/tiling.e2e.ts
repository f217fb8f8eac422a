/**
 * The tiling view on periodic cuts, against the production build with the demo seed: the demo chain project
 * (public) and a project switched to the chain approximant generate without an error and draw the chain;
 * the Penrose 5/3 and octagonal 12/5 approximants are drawn across the cell with only their two tile
 * shapes, and the vertex table counts the cell over periodic boundaries.
 *
 * Outside references:
 * - Fibonacci chain approximant of order n: F(n+1) long and F(n) short segments and as many vertices,
 *   F(n+2) (Fibonacci numbers, OEIS A000045).
 * - Penrose rhombi have corners 72°/108° (thick) and 36°/144° (thin); Ammann–Beenker tiles are squares
 *   and 45°/135° rhombi; every tile edge is the rhombus edge (de Bruijn 1981; Beenker 1982).
 * - A rhombus tiling of a torus has as many tiles as vertices (V − E + F = 0 and E = 2F).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { baseUrl, launch, screenshot } from './browser';

const PASSWORD = 'quasi-demo-2026';
/** F(0) … F(30), OEIS A000045. */
const F = [0, 1, 1, 2, 3, 5, 8, 13, 21, 34, 55, 89, 144, 233, 377, 610, 987, 1597, 2584, 4181, 6765, 10946, 17711, 28657, 46368, 75025, 121393, 196418, 317811, 514229, 832040];

let browser: Browser;
const contexts: BrowserContext[] = [];
beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await browser?.close();
});

/** A page at 1440 × 900 that records uncaught errors; signed in as `email` unless it is null. */
async function open(email: string | null): Promise<{ page: Page; errors: string[] }> {
  const ctx = await browser.newContext({ viewport: { width: 1440, height: 900 } });
  contexts.push(ctx);
  const page = await ctx.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  if (email) {
    await page.goto(`${baseUrl}/signin`);
    await page.fill('input[name=email]', email);
    await page.fill('input[name=password]', PASSWORD);
    await page.click('button[type=submit]');
    await page.waitForURL(/\/projects$/);
  }
  return { page, errors };
}

async function generate(page: Page): Promise<number> {
  await page.waitForSelector('[data-testid=estimate]');
  await page.getByRole('button', { name: /^(Generate|Cut again)$/ }).click();
  await page.waitForSelector('[data-testid=atom-count]', { timeout: 90_000 });
  return Number((await page.textContent('[data-testid=atom-count]'))!.replace(/,/g, ''));
}

/** Nothing crashed: no page error, no view error, the page's error screen not shown. */
async function expectNoCrash(page: Page, errors: string[]): Promise<void> {
  expect(errors).toEqual([]);
  expect(await page.locator('[data-testid=view-error]').count()).toBe(0);
  expect(await page.getByText('Something went wrong').count()).toBe(0);
}

/** Rows of the tile table as [tile, shape, count]. */
async function tileRows(page: Page): Promise<[string, string, number][]> {
  const rows = await page.locator('[data-testid=tile-shapes] tbody tr').allTextContents();
  const cells = await Promise.all(
    rows.map((_, i) => page.locator('[data-testid=tile-shapes] tbody tr').nth(i).locator('td').allTextContents()),
  );
  return cells.map(([tile, shape, count]) => [tile.trim(), shape.trim(), Number(count.replace(/,/g, ''))]);
}

/** The longest side of any tile drawn in full, in Å (the SVG is in model units). */
async function longestDrawnSide(page: Page): Promise<number> {
  return page.$$eval('svg[aria-label^="Tiling"] g[data-layer=main] polygon', (polys) => {
    let worst = 0;
    for (const p of polys) {
      const pts = (p.getAttribute('points') ?? '').trim().split(/\s+/).map((s) => s.split(',').map(Number));
      for (let i = 0; i < pts.length; i++) {
        const [a, b] = [pts[i], pts[(i + 1) % pts.length]];
        worst = Math.max(worst, Math.hypot(a[0] - b[0], a[1] - b[1]));
      }
    }
    return worst;
  });
}

/** A project with these params, made through the REST API as the signed-in user; returns its workspace URL. */
async function projectWith(page: Page, name: string, params: Record<string, unknown>): Promise<string> {
  // Cookie-authenticated changes must say they come from our own origin, as the pages' fetch() does.
  const r = await page.request.post(`${baseUrl}/api/projects`, { headers: { origin: baseUrl }, data: { name: `${name} ${Date.now()}`, params } });
  expect(r.status(), await r.text()).toBe(201);
  const { id } = (await r.json()) as { id: number };
  return `${baseUrl}/projects/${id}/workspace`;
}

/** The demo chain project's id and saved order, read through the API. */
async function demoChain(page: Page): Promise<{ id: number; order: number }> {
  const list = (await (await page.request.get(`${baseUrl}/api/projects?q=Fibonacci`)).json()) as { items: { id: number; name: string }[] };
  const demo = list.items.find((p) => p.name === 'Fibonacci warm-up chain');
  expect(demo, 'the demo seed has the chain project').toBeDefined();
  const { head } = (await (await page.request.get(`${baseUrl}/api/projects/${demo!.id}`)).json()) as { head: { params: { family: string; order: number; approximant: boolean } } };
  expect(head.params).toMatchObject({ family: 'fibonacci', approximant: true });
  return { id: demo!.id, order: head.params.order };
}

describe('tiling view on periodic cuts', () => {
  it('the demo chain project generates and draws its chain, signed in and as a visitor', async () => {
    const { page, errors } = await open('lead@harrowgate.test');
    const { id, order } = await demoChain(page);
    await page.goto(`${baseUrl}/projects/${id}/workspace`);
    const count = await generate(page);
    expect(count).toBe(F[order + 2]);
    await page.locator('svg[aria-label^="Chain of"]').waitFor();
    await expectNoCrash(page, errors);
    expect(await page.getByRole('img', { name: `Chain of ${F[order + 2]} tiles in the cell` }).count()).toBe(1);
    const rows = await tileRows(page);
    expect(rows.map(([t]) => t)).toEqual(['L', 'S']);
    expect(rows.map(([, , n]) => n)).toEqual([F[order + 1], F[order]]);
    expect(await page.textContent('[data-testid=vertex-summary]')).toContain(`${F[order + 2].toLocaleString('en-US')} vertices in the cell`);
    await screenshot(page, 'tiling-demo-chain');

    // The public demo without signing in.
    const visitor = await open(null);
    await visitor.page.goto(`${baseUrl}/projects/${id}/workspace`);
    expect(await generate(visitor.page)).toBe(F[order + 2]);
    await visitor.page.locator('svg[aria-label^="Chain of"]').waitFor();
    await expectNoCrash(visitor.page, visitor.errors);
  });

  it('a project switched to the chain with "Periodic approximant" ticked generates and keeps the edit', async () => {
    const { page, errors } = await open('lead@harrowgate.test');
    await page.goto(await projectWith(page, 'Switch to chain', { family: 'penrose', radius: 6, edge: 1 }));
    await page.waitForSelector('[data-testid=estimate]');
    await page.getByLabel('Model family').selectOption('fibonacci');
    await page.getByLabel('Periodic approximant', { exact: true }).check();
    const count = await generate(page);
    await page.locator('svg[aria-label^="Chain of"]').waitFor();
    await expectNoCrash(page, errors);
    expect(await page.getByRole('img', { name: `Chain of ${count} tiles in the cell` }).count()).toBe(1);
    // The switch is an unsaved edit, and it is still there after the cut.
    expect(await page.getByText('unsaved edits').count()).toBe(1);
    expect(await page.getByLabel('Model family').inputValue()).toBe('fibonacci');
    expect(await page.getByLabel('Periodic approximant', { exact: true }).isChecked()).toBe(true);
    const rows = await tileRows(page);
    expect(rows.map(([t]) => t)).toEqual(['L', 'S']);
    const [[, , nL], [, , nS]] = rows;
    // F(n+1) + F(n) = F(n+2) with F(n+1)/F(n) consecutive Fibonacci numbers.
    const n = F.indexOf(nS);
    expect(n).toBeGreaterThan(0);
    expect([nL, count]).toEqual([F[n + 1], F[n + 2]]);
  });

  for (const { family, p, q, shapes, cellCount } of [
    { family: 'penrose', p: 5, q: 3, shapes: [['thick', '72°/108°'], ['thin', '36°/144°']], cellCount: 1 },
    { family: 'octagonal', p: 12, q: 5, shapes: [['square', '90°'], ['rhombus', '45°/135°']], cellCount: 4 },
  ] as const) {
    it(`the ${family} ${p}/${q} approximant is drawn across its cell with its two tile shapes only`, async () => {
      const { page, errors } = await open('lead@harrowgate.test');
      const edge = 1;
      await page.goto(await projectWith(page, `${family} ${p}/${q}`, { family, approximant: { p, q }, edge }));
      const count = await generate(page);
      await page.locator('svg[aria-label^="Tiling of"]').waitFor();
      await expectNoCrash(page, errors);
      if (cellCount > 1) await page.getByLabel('Show').selectOption('2');
      expect(await page.locator('svg[aria-label^="Tiling of"] > polygon[stroke-dasharray]').count()).toBe(cellCount);
      const rows = await tileRows(page);
      expect(rows.map(([t, s]) => [t, s])).toEqual(shapes);
      // As many tiles in the cell as vertices (Euler on the torus), and the table counts them all.
      expect(rows[0][2] + rows[1][2]).toBe(count);
      expect(await page.textContent('[data-testid=vertex-summary]')).toContain(`${count.toLocaleString('en-US')} vertices in the cell`);
      // No sliver across the cell: every side drawn is one rhombus edge.
      expect(await longestDrawnSide(page)).toBeCloseTo(edge, 6);
      await screenshot(page, `tiling-${family}-${p}-${q}`);
    });
  }
});
