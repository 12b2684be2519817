import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { expect, inject } from 'vitest';
import type { BrowserSession } from './browser';

/** Where the browser tests leave their screenshots (gitignored), to be looked at. */
export const ARTIFACTS = resolve(import.meta.dirname, '../artifacts');

export async function screenshot(page: Page, name: string): Promise<void> {
  await mkdir(ARTIFACTS, { recursive: true });
  await page.screenshot({ path: resolve(ARTIFACTS, name), fullPage: true });
}

/** A page of the app and the problems it reported (page errors, console warnings, failed requests). */
export interface AppPage {
  page: Page;
  problems: string[];
}

/** Open the built app (optionally at a URL hash) and wait for its first snapshot. */
export async function openApp(session: BrowserSession, hash = ''): Promise<AppPage> {
  const page = await session.context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    // The readback hint is provoked by the tests' own getImageData calls, not by the page.
    if (m.text().includes('willReadFrequently')) return;
    if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
  });
  page.on('requestfailed', (r) => problems.push(`request failed: ${r.url()}`));
  page.on('response', (r) => {
    if (r.status() >= 400) problems.push(`HTTP ${r.status()}: ${r.url()}`);
  });
  await page.goto(`${inject('baseUrl')}${hash ? `#${hash}` : ''}`);
  await page.getByTestId('model-steps').waitFor();
  return { page, problems };
}

export function readText(page: Page, testid: string): Promise<string> {
  return page.getByTestId(testid).innerText();
}

export async function steps(page: Page): Promise<number> {
  return Number(await readText(page, 'model-steps'));
}

export async function modelTime(page: Page): Promise<number> {
  return Number(await readText(page, 'model-time'));
}

export const status = (page: Page): Promise<string> => readText(page, 'status');

/** Wait until the run has gone past `n` steps (the page is playing). */
export async function waitForSteps(page: Page, n: number): Promise<void> {
  await page.waitForFunction((n0) => Number(document.querySelector('[data-testid=model-steps]')?.textContent) > n0, n, {
    timeout: 60_000,
  });
}

/** Pause with the play/pause button and wait until the page shows it. */
export async function pause(page: Page): Promise<void> {
  if ((await status(page)) !== 'paused') await page.getByTestId('play-pause').click();
  await expect.poll(() => status(page)).toBe('paused');
}

/** Start again from t = 0 while paused, then take `n` single steps. */
export async function resetAndStep(page: Page, n: number): Promise<void> {
  await pause(page);
  await page.getByTestId('reset').click();
  await expect.poll(() => steps(page)).toBe(0);
  for (let i = 0; i < n; i++) await page.getByTestId('step').click();
  await expect.poll(() => steps(page)).toBe(n);
}

/** FNV-1a hash of a canvas's pixels and how many are clearly red or clearly blue, read in the page. */
export function canvasSample(
  page: Page,
  selector: string,
): Promise<{ hash: number; red: number; blue: number; width: number; height: number }> {
  return page.evaluate((sel) => {
    const canvas = document.querySelector<HTMLCanvasElement>(sel);
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) throw new Error(`no canvas ${sel}`);
    const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
    let hash = 0x811c9dc5;
    let red = 0;
    let blue = 0;
    for (let i = 0; i < data.length; i += 4) {
      for (let j = 0; j < 3; j++) hash = Math.imul(hash ^ data[i + j], 0x01000193) >>> 0;
      if (data[i] > data[i + 2] + 40) red++;
      if (data[i + 2] > data[i] + 40) blue++;
    }
    return { hash, red, blue, width: canvas.width, height: canvas.height };
  }, selector);
}

/** Pixels of a canvas that are clearly drawn on (any channel below 200): a chart with lines, not an empty frame. */
export function inkPixels(page: Page, selector: string): Promise<number> {
  return page.evaluate((sel) => {
    const canvas = document.querySelector<HTMLCanvasElement>(sel);
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) throw new Error(`no canvas ${sel}`);
    const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
    let n = 0;
    for (let i = 0; i < data.length; i += 4)
      if (data[i + 3] > 0 && (data[i] < 200 || data[i + 1] < 200 || data[i + 2] < 200)) n++;
    return n;
  }, selector);
}

/** Open a view by its tab. */
export async function openView(page: Page, id: string): Promise<void> {
  await page.getByTestId(`tab-${id}`).click();
  await page.getByTestId(`view-${id}`).waitFor();
}

/** Wait until the model time has gone past `t`. */
export async function waitForTime(page: Page, t: number, timeout = 60_000): Promise<void> {
  await page.waitForFunction((t0) => Number(document.querySelector('[data-testid=model-time]')?.textContent) > t0, t, {
    timeout,
  });
}
