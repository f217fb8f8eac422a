/**
 * The main journey of a new user, against the production build with the demo seed: sign in → new project
 * from the icosahedral starter → workspace → cut the 2/1 approximant → powder pattern → lay a measured
 * pattern over it (a local file, then the same file kept as a project dataset) → save a revision →
 * download CIF and XYZ → a second user forks the project from its workspace.
 *
 * Outside references:
 * - The measured pattern is the app's own calculated curve (its CSV download) × a scale + a flat
 *   background, with Gaussian counting noise σ = √y. For a model that fits, R_wp must then come out
 *   at the expected R, R_exp = √((N − P)/Σ w y_obs²) with w = 1/y_obs and P = 2 fitted parameters
 *   (Young, The Rietveld Method, IUCr/OUP 1993, ch. 1). A wrong scale, background, weighting or
 *   interpolation moves R_wp away from R_exp.
 * - The CIF is read by gemmi (Debian's python3-gemmi), not by our reader; its atom count must equal the
 *   XYZ's and approximantVertexCount(2, 1) = 136, the model-set density count of the plain P vertex
 *   model (see workspace.e2e.ts for the density-formula check of that number).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { baseUrl, launch, screenshot } from './browser';
import { runPython } from '../helpers/python';
import { approximantVertexCount } from '../../lib/models/icosahedral/approximant';

const PASSWORD = 'quasi-demo-2026';
let browser: Browser;
const contexts: BrowserContext[] = [];
const work = mkdtempSync(path.join(tmpdir(), 'tauforge-journey-'));

beforeAll(async () => {
  browser = await launch();
});
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => undefined);
  await browser?.close();
  rmSync(work, { recursive: true, force: true });
});

async function signedIn(email: string): Promise<Page> {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true });
  contexts.push(ctx);
  const page = await ctx.newPage();
  await page.goto(`${baseUrl}/signin`);
  await page.fill('input[name=email]', email);
  await page.fill('input[name=password]', PASSWORD);
  await page.click('button[type=submit]');
  await page.waitForURL(/\/projects$/);
  return page;
}

async function download(page: Page, click: () => Promise<void>): Promise<{ name: string; text: string }> {
  const [d] = await Promise.all([page.waitForEvent('download'), click()]);
  return { name: d.suggestedFilename(), text: readFileSync((await d.path())!, 'utf8') };
}

/** Deterministic standard normal numbers (Park–Miller generator, Box–Muller). */
function normals(seed: number): () => number {
  let s = seed;
  const u = () => (s = (s * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

function rwpShown(text: string | null): number {
  const m = /R_wp = ([\d.]+) %/.exec(text ?? '');
  if (!m) throw new Error(`no R_wp in "${text}"`);
  return Number(m[1]) / 100;
}

describe('journey', () => {
  it('cut, compare with a measured pattern, save, download CIF, fork', async () => {
    const page = await signedIn('lead@harrowgate.test');

    // A new project from the icosahedral starter, unlisted so a colleague with the link can fork it.
    await page.click('text=New project');
    await page.check('input[value=icosahedral]');
    await page.fill('input[name=name]', `Journey 2/1 ${Date.now()}`);
    await page.selectOption('select[name=visibility]', 'unlisted');
    await page.click('button[type=submit]');
    await page.waitForURL(/\/projects\/\d+$/);
    const projectUrl = page.url();
    await page.getByRole('link', { name: 'Open workspace' }).click();
    await page.waitForURL(/\/workspace$/);
    await page.waitForSelector('[data-testid=estimate]');
    expect(await page.getByLabel('Order p/q').inputValue()).toBe('2/1');

    await page.getByRole('button', { name: /Generate|Cut again/ }).click();
    await page.waitForSelector('[data-testid=atom-count]', { timeout: 60_000 });
    const count = Number((await page.textContent('[data-testid=atom-count]'))!.replace(/,/g, ''));
    expect(count).toBe(approximantVertexCount(2, 1));
    expect(count).toBe(136);

    // Powder pattern, then its calculated curve as CSV.
    await page.getByRole('tab', { name: 'Diffraction' }).click();
    await page.getByRole('tab', { name: 'Powder pattern' }).click();
    await page.getByRole('button', { name: 'Compute powder pattern' }).click();
    await page.waitForSelector('[aria-label="Powder pattern"] canvas', { timeout: 90_000 });
    const curve = await download(page, () => page.getByRole('button', { name: 'CSV' }).click());
    const rows = curve.text.trim().split('\n');
    expect(rows[0]).toBe('two_theta_deg,calculated');
    const calc = rows.slice(1).map((r) => r.split(',').map(Number));

    // The measured pattern: 12–88° of that curve, scaled, on a background, with counting noise.
    const inside = calc.filter(([tt]) => tt >= 12 && tt <= 88);
    const top = Math.max(...inside.map(([, y]) => y));
    const gauss = normals(20261201);
    const measured = inside.map(([tt, y]) => {
      const mean = (3000 * y) / top + 100;
      return [tt, Math.max(1, mean + Math.sqrt(mean) * gauss())];
    });
    const sumY = measured.reduce((s, [, y]) => s + y, 0);
    const rExp = Math.sqrt((measured.length - 2) / sumY);
    const file = path.join(work, 'journey-measured.xy');
    writeFileSync(file, ['# 2theta intensity (synthetic, see journey.e2e.ts)', ...measured.map(([tt, y]) => `${tt.toFixed(4)} ${y.toFixed(2)}`)].join('\n') + '\n');

    // A file that is not a pattern is refused with its line, and nothing is laid over the curve.
    const bad = path.join(work, 'not-a-pattern.xy');
    writeFileSync(bad, '2theta intensity\n10.0 5\n10.02 lots\n');
    await page.setInputFiles('input[aria-label="Measured pattern file"]', bad);
    await expect.poll(() => page.getByRole('alert').filter({ hasText: 'line 3' }).count()).toBe(1);
    expect(await page.locator('[data-testid=rwp]').count()).toBe(0);

    // The local file: R_wp is shown and sits at the expected R.
    await page.setInputFiles('input[aria-label="Measured pattern file"]', file);
    await page.waitForSelector('[data-testid=rwp]');
    const rwpLocal = rwpShown(await page.textContent('[data-testid=rwp]'));
    expect(Math.abs(rwpLocal - rExp) / rExp).toBeLessThan(0.1);
    await expect.poll(() => page.locator('table tbody tr').count()).toBeGreaterThan(5);
    await screenshot(page, 'journey-compare-local');

    // Keep it as a project dataset, then compare with the dataset: the same R_wp.
    await page.getByRole('button', { name: 'Keep in this project' }).click();
    await page.getByText('is now a dataset of this project').waitFor();
    await page.getByRole('button', { name: 'remove' }).click();
    expect(await page.locator('[data-testid=rwp]').count()).toBe(0);
    await page.getByLabel('Dataset from this project').selectOption({ label: 'journey-measured.xy' });
    await page.waitForSelector('[data-testid=rwp]');
    expect(rwpShown(await page.textContent('[data-testid=rwp]'))).toBeCloseTo(rwpLocal, 6);

    // A simulated range that misses the measured one says so instead of showing nothing.
    await page.getByLabel('2θ start in degrees').fill('89');
    await page.getByRole('button', { name: 'Compute powder pattern' }).click();
    await page.waitForSelector('[data-testid=compare-error]', { timeout: 90_000 });
    expect(await page.textContent('[data-testid=compare-error]')).toMatch(/12\.00–88\.00°/);
    await screenshot(page, 'journey-compare-out-of-range');

    // Save a revision with a message; the header names it.
    await page.getByRole('button', { name: 'Save revision…' }).click();
    await page.fill('#save-message', 'Compared with the measured pattern');
    await page.getByRole('button', { name: 'Save revision', exact: true }).click();
    await page.getByText('Revision 2 — Compared with the measured pattern').waitFor();

    // CIF and XYZ of the cut: gemmi reads the CIF and counts the same atoms as the XYZ.
    await page.getByLabel('File format').selectOption('cif');
    const cif = await download(page, () => page.getByRole('button', { name: 'Download' }).click());
    expect(cif.name).toMatch(/\.cif$/);
    const cifFile = path.join(work, cif.name);
    writeFileSync(cifFile, cif.text);
    // The CIF carries the space group and its asymmetric unit (a comment line says which): gemmi expands it.
    expect(cif.text).toMatch(/^# Tauforge symmetry: /m);
    const [sites, a] = runPython<number[]>('import gemmi, sys, json; s = gemmi.read_small_structure(sys.stdin.read()); print(json.dumps([len(s.get_all_unit_cell_sites()), s.cell.a]))', cifFile);
    await page.getByLabel('File format').selectOption('xyz');
    const xyz = await download(page, () => page.getByRole('button', { name: 'Download' }).click());
    expect(Number(xyz.text.split('\n')[0])).toBe(count);
    expect(sites).toBe(count);
    expect(a).toBeGreaterThan(20);

    // A colleague forks it from the workspace and lands in the fork's own workspace.
    const student = await signedIn('student@harrowgate.test');
    await student.goto(`${projectUrl}/workspace`);
    await student.waitForSelector('[data-testid=estimate]');
    await student.getByRole('button', { name: 'Fork' }).click();
    await student.waitForURL((u) => /\/projects\/\d+\/workspace$/.test(u.pathname) && !u.href.startsWith(projectUrl + '/'), { timeout: 30_000 });
    // The fork carries the parent's history: its head is the parent's revision 2, message and all.
    await student.getByRole('heading', { name: /^Journey 2\/1 \d+ \(fork\)$/ }).waitFor();
    await student.getByText('Revision 2 — Compared with the measured pattern').waitFor();
    await screenshot(student, 'journey-forked');
  });

  it('decagonal approximant: the form drops the patch radius, the CIF is orthorhombic and holds every point', async () => {
    // Outside reference: a rhombus tiling has as many vertices as tiles (Euler, V − E + F = 1 with every
    // tile four-sided), and Penrose thick:thin = τ (de Bruijn 1981), so the vertex density per layer is
    // (τ + 1)/(τ sin 72° + sin 36°) per edge². An approximant's phason strain moves it slightly: 1 %.
    const page = await signedIn('lead@harrowgate.test');
    await page.click('text=New project');
    await page.check('input[value=decagonal]');
    await page.fill('input[name=name]', `Journey decagonal ${Date.now()}`);
    await page.click('button[type=submit]');
    await page.waitForURL(/\/projects\/\d+$/);
    await page.getByRole('link', { name: 'Open workspace' }).click();
    await page.waitForSelector('[data-testid=estimate]');
    expect(await page.getByLabel(/Patch radius/).count()).toBe(1);
    expect(await page.getByLabel(/Layer spacing/).inputValue()).toBe('2.04');
    await page.getByLabel('Periodic approximant', { exact: true }).check();
    await expect.poll(() => page.getByLabel(/Patch radius/).count()).toBe(0);
    const edge = Number(await page.getByLabel(/Edge length/).inputValue());
    const layers = Number(await page.getByLabel(/Layers per period/).inputValue());
    await page.getByRole('button', { name: /Generate|Cut again/ }).click();
    await page.waitForSelector('[data-testid=atom-count]', { timeout: 60_000 });
    const count = Number((await page.textContent('[data-testid=atom-count]'))!.replace(/,/g, ''));
    // The viewer loads lazily; let it draw before the picture is taken.
    await page.waitForFunction(() => ((window as unknown as { __tauforgeViewer?: { frames(): number } }).__tauforgeViewer?.frames() ?? 0) > 0, null, { timeout: 60_000 });
    await screenshot(page, 'journey-decagonal');

    await page.getByLabel('File format').selectOption('cif');
    const cif = await download(page, () => page.getByRole('button', { name: 'Download' }).click());
    const cifFile = path.join(work, cif.name);
    writeFileSync(cifFile, cif.text);
    const [sites, a, b, , alpha, beta, gamma] = runPython<number[]>(
      'import gemmi, sys, json; s = gemmi.read_small_structure(sys.stdin.read()); c = s.cell; print(json.dumps([len(s.get_all_unit_cell_sites()), c.a, c.b, c.c, c.alpha, c.beta, c.gamma]))',
      cifFile,
    );
    expect(sites).toBe(count);
    expect([alpha, beta, gamma]).toEqual([90, 90, 90]);
    expect(await page.textContent('body')).toContain(`a, b, c = ${a.toFixed(3)}, ${b.toFixed(3)}`);
    const tau = (1 + Math.sqrt(5)) / 2;
    const deg = Math.PI / 180;
    const perEdge2 = (tau + 1) / (tau * Math.sin(72 * deg) + Math.sin(36 * deg));
    const perLayer = count / layers;
    expect(Math.abs(perLayer / ((a * b) / edge ** 2) - perEdge2) / perEdge2).toBeLessThan(0.01);
  });
});
