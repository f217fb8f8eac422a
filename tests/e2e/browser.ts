import { chromium, type Browser, type Page } from 'playwright-core';
import { mkdirSync } from 'node:fs';
import path from 'node:path';

export const baseUrl = process.env.TAUFORGE_BASE_URL ?? 'http://127.0.0.1:3000';
export const artifacts = path.join(path.dirname(new URL(import.meta.url).pathname), 'artifacts');

/** Debian's Chromium, never a downloaded browser; WebGL2 through SwiftShader in software. */
export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.TAUFORGE_CHROMIUM ?? '/usr/bin/chromium',
    args: ['--use-angle=swiftshader', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(artifacts, { recursive: true });
  const file = path.join(artifacts, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Frames the 3D viewer has drawn so far (0 before it mounts); it renders on demand, so a count that stops means idle. */
export function viewerFrames(page: Page): Promise<number> {
  return page.evaluate('window.__tauforgeViewer ? window.__tauforgeViewer.frames() : 0') as Promise<number>;
}

/** Sign in as the demo lead and open the demo "Icosahedral 2/1 vertex model" project's page. */
export async function signInAndOpenProject(page: Page): Promise<void> {
  await page.goto(`${baseUrl}/signin`);
  await page.fill('input[name=email]', 'lead@harrowgate.test');
  await page.fill('input[name=password]', 'quasi-demo-2026');
  await page.click('button[type=submit]');
  await page.waitForURL(/\/projects$/);
  await page.click('text=Icosahedral 2/1 vertex model');
  await page.waitForURL(/\/projects\/\d+$/);
}

/** As signInAndOpenProject, then that project's workspace. */
export async function signInAndOpenWorkspace(page: Page): Promise<void> {
  await signInAndOpenProject(page);
  await page.goto(`${page.url()}/workspace`);
  await page.waitForSelector('[data-testid=estimate]');
}
