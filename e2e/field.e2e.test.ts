import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';

const SCREENSHOT = resolve(import.meta.dirname, 'artifacts/field.png');
// Drawn at twice the CSS resolution, to check that the canvas backing store follows devicePixelRatio.
const DPR = 2;

interface Sample {
  /** FNV-1a hash of the canvas pixels as read back from its 2D context. */
  hash: number;
  /** Pixels clearly red (positive ζ) and clearly blue (negative ζ). */
  red: number;
  blue: number;
  width: number;
  height: number;
  cssWidth: number;
  cssHeight: number;
  frames: number;
  time: number;
  steps: number;
}

/** Read the canvas pixels and the readouts in one go, in the page. */
function sample(page: Page): Promise<Sample> {
  return page.evaluate(() => {
    const canvas = document.querySelector<HTMLCanvasElement>('[data-testid=field-canvas]');
    const ctx = canvas?.getContext('2d');
    if (!canvas || !ctx) throw new Error('no field canvas');
    const data = ctx.getImageData(0, 0, canvas.width, canvas.height).data;
    let hash = 0x811c9dc5;
    let red = 0;
    let blue = 0;
    for (let i = 0; i < data.length; i += 4) {
      for (let j = 0; j < 3; j++) hash = Math.imul(hash ^ data[i + j], 0x01000193) >>> 0;
      if (data[i] > data[i + 2] + 40) red++;
      if (data[i + 2] > data[i] + 40) blue++;
    }
    const text = (id: string) => Number(document.querySelector(`[data-testid=${id}]`)?.textContent ?? NaN);
    return {
      hash,
      red,
      blue,
      width: canvas.width,
      height: canvas.height,
      cssWidth: canvas.clientWidth,
      cssHeight: canvas.clientHeight,
      frames: Number(canvas.dataset.frames),
      time: text('model-time'),
      steps: text('model-steps'),
    };
  });
}

/** Wait until the readouts show a model time beyond t (the page is playing). */
async function waitForTime(page: Page, t: number): Promise<void> {
  await page.waitForFunction((t0) => Number(document.querySelector('[data-testid=model-time]')?.textContent) > t0, t, { timeout: 60_000 });
}

const status = (page: Page) => page.getByTestId('status').textContent();

describe('Field view in Chromium', () => {
  let session: BrowserSession;
  let page: Page;
  const problems: string[] = [];

  beforeAll(async () => {
    session = await launchChromium({ deviceScaleFactor: DPR });
    page = await session.context.newPage();
    page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
    page.on('console', (m) => {
      // The readback hint is provoked by this test's own getImageData calls, not by the page.
      if (m.text().includes('willReadFrequently')) return;
      if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
    });
    page.on('requestfailed', (r) => problems.push(`request failed: ${r.url()}`));
    page.on('response', (r) => {
      if (r.status() >= 400) problems.push(`HTTP ${r.status()}: ${r.url()}`);
    });
    await page.goto(inject('baseUrl'));
  });

  afterAll(async () => {
    await session?.close();
  });

  it('draws ζ, and the field and the model time move on while playing', async () => {
    await page.getByText('not a weather or ocean forecast').waitFor();
    await waitForTime(page, 0.5);
    const a = await sample(page);
    expect(a.frames).toBeGreaterThan(0);
    // A forced turbulent field has both signs of vorticity, and the colour map shows them apart.
    expect(a.red).toBeGreaterThan(0.05 * a.width * a.height);
    expect(a.blue).toBeGreaterThan(0.05 * a.width * a.height);
    // The backing store is the CSS box times devicePixelRatio, and the domain is square.
    expect(a.width).toBe(Math.round(a.cssWidth * DPR));
    expect(a.height).toBe(Math.round(a.cssHeight * DPR));
    expect(a.cssWidth).toBe(a.cssHeight);

    await waitForTime(page, a.time + 2);
    const b = await sample(page);
    expect(b.time).toBeGreaterThan(a.time);
    expect(b.steps).toBeGreaterThan(a.steps);
    expect(b.frames).toBeGreaterThan(a.frames);
    expect(b.hash).not.toBe(a.hash);

    await mkdir(resolve(SCREENSHOT, '..'), { recursive: true });
    await page.screenshot({ path: SCREENSHOT, fullPage: true });
  });

  it('pauses, steps once and plays again', async () => {
    await page.getByTestId('pause').click();
    await expect.poll(() => status(page)).toBe('paused');
    const held = await sample(page);
    await page.waitForTimeout(400);
    const still = await sample(page);
    expect(still.steps).toBe(held.steps);
    expect(still.hash).toBe(held.hash);

    await page.getByTestId('step').click();
    await expect.poll(async () => (await sample(page)).steps).toBe(held.steps + 1);

    await page.getByTestId('play').click();
    await expect.poll(() => status(page)).toBe('playing');
    await waitForTime(page, still.time + 0.2);
  });

  it('ran without page errors or console warnings', () => {
    expect(problems).toEqual([]);
  });
});
