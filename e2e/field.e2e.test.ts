import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import {
  canvasSample,
  modelTime,
  openApp,
  pause,
  screenshot,
  status,
  steps,
  waitForSteps,
  type AppPage,
} from './support/app';

// Drawn at twice the CSS resolution, to check that the canvas backing store follows devicePixelRatio.
const DPR = 2;
const FIELD = '[data-testid=field-canvas]';

/** The plot box of the figure in CSS pixels, as the page laid it out. */
async function plotBox(page: Page): Promise<{ x: number; y: number; w: number; h: number }> {
  return JSON.parse((await page.locator(FIELD).getAttribute('data-plot')) ?? 'null');
}

/** Pixels of the plot area only (not axes and colour bar): clearly red, clearly blue, and a hash. */
function plotSample(page: Page, box: { x: number; y: number; w: number; h: number }) {
  return page.evaluate(
    ([b, dpr]) => {
      const canvas = document.querySelector<HTMLCanvasElement>('[data-testid=field-canvas]');
      const ctx = canvas?.getContext('2d');
      if (!canvas || !ctx) throw new Error('no field canvas');
      const data = ctx.getImageData(
        Math.round(b.x * dpr),
        Math.round(b.y * dpr),
        Math.round(b.w * dpr),
        Math.round(b.h * dpr),
      ).data;
      let red = 0;
      let blue = 0;
      let hash = 0x811c9dc5;
      for (let i = 0; i < data.length; i += 4) {
        for (let j = 0; j < 3; j++) hash = Math.imul(hash ^ data[i + j], 0x01000193) >>> 0;
        if (data[i] > data[i + 2] + 40) red++;
        if (data[i + 2] > data[i] + 40) blue++;
      }
      return { red, blue, hash, n: data.length / 4 };
    },
    [box, DPR] as const,
  );
}

describe('Field view in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ deviceScaleFactor: DPR, width: 1300, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('opens on the default scenario playing, with the caution shown', async () => {
    const { page } = app;
    await expect.poll(() => status(page)).toBe('playing');
    await expect(page.getByTestId('not-a-forecast').innerText()).resolves.toMatch(
      /not a weather, ocean or climate forecast/,
    );
    await expect(page.getByTestId('not-a-forecast').innerText()).resolves.toMatch(/Stria's own/);
    await expect(page.getByTestId('scenario').inputValue()).resolves.toBe('jets');
  });

  it('draws u with both signs (the jets eastward, the flow between westward), in a backing store of CSS size × devicePixelRatio, and it moves on while playing', async () => {
    const { page } = app;
    await waitForSteps(page, 200);
    const box = await plotBox(page);
    const a = await plotSample(page, box);
    // u has both signs, and the colour map shows them apart.
    expect(a.red).toBeGreaterThan(0.05 * a.n);
    expect(a.blue).toBeGreaterThan(0.05 * a.n);
    const css = await page
      .locator(FIELD)
      .evaluate((c: HTMLCanvasElement) => ({ w: c.clientWidth, h: c.clientHeight, bw: c.width, bh: c.height }));
    expect(css.bw).toBe(Math.round(css.w * DPR));
    expect(css.bh).toBe(Math.round(css.h * DPR));
    // The domain is square, and so is the plot.
    expect(box.w).toBe(box.h);

    const frames = Number(await page.locator(FIELD).getAttribute('data-frames'));
    const t = await modelTime(page);
    await page.waitForFunction(
      (t0) => Number(document.querySelector('[data-testid=model-time]')?.textContent) > t0 + 1,
      t,
      { timeout: 60_000 },
    );
    const b = await plotSample(page, box);
    expect(b.hash).not.toBe(a.hash);
    expect(Number(await page.locator(FIELD).getAttribute('data-frames'))).toBeGreaterThan(frames);
    await screenshot(page, 'field.png');
  });

  it('pauses, steps once and plays again', async () => {
    const { page } = app;
    await pause(page);
    const held = await steps(page);
    const still = await canvasSample(page, FIELD);
    await page.waitForTimeout(300);
    expect(await steps(page)).toBe(held);
    expect((await canvasSample(page, FIELD)).hash).toBe(still.hash);
    await page.getByTestId('step').click();
    await expect.poll(() => steps(page)).toBe(held + 1);
    await page.getByTestId('play-pause').click();
    await expect.poll(() => status(page)).toBe('playing');
  });

  it('runs until a given model time, then pauses there', async () => {
    const { page } = app;
    await pause(page);
    const target = Math.ceil((await modelTime(page)) + 1);
    await page.locator('#run-until').fill(String(target));
    await page.getByTestId('run-until').click();
    await expect.poll(() => status(page), { timeout: 60_000 }).toBe('paused');
    const t = await modelTime(page);
    expect(t).toBeGreaterThanOrEqual(target);
    // It stopped at the first step past the target: less than one step (dt ≤ 0.02) beyond it.
    expect(t - target).toBeLessThan(0.02);
    await page.getByTestId('play-pause').click();
    await expect.poll(() => status(page)).toBe('playing');
  });

  it('switches to ζ and to a fixed colour range', async () => {
    const { page } = app;
    await page.getByTestId('field-zeta').check();
    await expect.poll(() => page.locator(FIELD).getAttribute('aria-label')).toMatch(/^ζ {2}relative vorticity/);
    await page.getByTestId('range-fixed').check();
    const fixed = Number(await page.locator(FIELD).getAttribute('data-range'));
    expect(fixed).toBeGreaterThan(0);
    await waitForSteps(page, (await steps(page)) + 20);
    expect(Number(await page.locator(FIELD).getAttribute('data-range'))).toBe(fixed);
    await screenshot(page, 'field-zeta-fixed.png');
  });

  it('exports the figure as a PNG file', async () => {
    const { page } = app;
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-png').click()]);
    expect(download.suggestedFilename()).toMatch(/^stria-zeta-t\d+\.\d\d\.png$/);
    const bytes = await readFile(await download.path());
    expect(Array.from(bytes.subarray(0, 8))).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    // The PNG is the whole figure at device resolution: IHDR width and height follow the signature.
    const css = await page.locator(FIELD).evaluate((c: HTMLCanvasElement) => [c.width, c.height]);
    expect([bytes.readUInt32BE(16), bytes.readUInt32BE(20)]).toEqual(css);
  });

  it('records the field as a WebM video', async () => {
    const { page } = app;
    const canvas = page.getByTestId('field-canvas');
    const framesBefore = Number(await canvas.getAttribute('data-frames'));
    await page.getByTestId('record').click();
    await waitForSteps(page, (await steps(page)) + 100);
    // Steps alone do not make a video: wait until the canvas has been repainted (a captured frame
    // each time) for a while, which a loaded machine can take longer to do than 100 steps.
    await page.waitForFunction(
      (n) => Number(document.querySelector('[data-testid="field-canvas"]')?.getAttribute('data-frames')) >= n,
      framesBefore + 40,
      { timeout: 60_000 },
    );
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('record').click()]);
    expect(download.suggestedFilename()).toMatch(/\.webm$/);
    const bytes = await readFile(await download.path());
    // Every WebM file starts with the EBML magic number.
    expect(Array.from(bytes.subarray(0, 4))).toEqual([0x1a, 0x45, 0xdf, 0xa3]);
    expect(bytes.length).toBeGreaterThan(1000);
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
