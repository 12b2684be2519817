import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import {
  canvasSample,
  inkPixels,
  modelTime,
  openApp,
  openView,
  screenshot,
  waitForTime,
  type AppPage,
} from './support/app';

const attr = async (page: Page, testid: string, name: string) =>
  Number(await page.getByTestId(testid).getAttribute(name));
const chartCanvas = (id: string) => `[data-testid=${id}] canvas`;

/** Every chart drawn, and each redrawn once the run has gone on by `dt` model time units. */
async function chartsChange(page: Page, ids: string[], dt = 2): Promise<void> {
  const before: number[] = [];
  for (const id of ids) {
    await expect.poll(() => inkPixels(page, chartCanvas(id)), { timeout: 30_000 }).toBeGreaterThan(2000);
    before.push((await canvasSample(page, chartCanvas(id))).hash);
  }
  await waitForTime(page, (await modelTime(page)) + dt);
  for (const [i, id] of ids.entries())
    await expect
      .poll(async () => (await canvasSample(page, chartCanvas(id))).hash, { timeout: 30_000 })
      .not.toBe(before[i]);
}

describe('Zonal, Hovmöller, Spectra and Flux views in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
    // The jet detector judges a time mean only once its window spans the flow's memory, the drag time
    // 1/μ = 50 of the default run (docs/significance.md); the views' window is 1/μ long, so it is whole
    // from t = 50 on. The same run from the command line (`stria run --until 80 --average 50`) finds
    // two significant jets in the mean of t = 30–80; t = 80 is about 40 s at this page's pace.
    await waitForTime(app.page, 80, 200_000);
  }, 240_000);

  afterAll(async () => {
    await session?.close();
  });

  it('counts the jets of the time-mean ū among the readouts', async () => {
    await expect
      .poll(async () => Number(await app.page.getByTestId('model-jets').getAttribute('data-count')))
      .toBeGreaterThanOrEqual(2);
  });

  it('Zonal: ū, −∂y(u′v′) and q̄ + βy with the staircase, moving on with the run; a new window restarts the means', async () => {
    const { page } = app;
    await openView(page, 'zonal');
    await page.getByTestId('zonal-view').waitFor();
    expect(await attr(page, 'zonal-view', 'data-jets')).toBeGreaterThanOrEqual(2);
    await expect(page.getByTestId('zonal-staircase').innerText()).resolves.toMatch(
      /sharpness index S = 1 − ρ = -?\d\.\d+/,
    );
    const t0 = await attr(page, 'zonal-view', 'data-time');
    await chartsChange(page, ['chart-ubar', 'chart-conv', 'chart-pv']);
    expect(await attr(page, 'zonal-view', 'data-time')).toBeGreaterThan(t0);
    await screenshot(page, 'zonal.png');
    // A shorter window: the mean starts again and then covers no more than it.
    await page.getByTestId('mean-span').fill('4');
    await page.getByTestId('mean-span').press('Enter');
    await expect
      .poll(
        async () => {
          const m = /t = ([\d.]+)–([\d.]+): (\d+) samples/.exec(await page.getByTestId('mean-window').innerText());
          return m ? Number(m[2]) - Number(m[1]) : Infinity;
        },
        { timeout: 30_000 },
      )
      .toBeLessThanOrEqual(4);
    // A bad entry is refused at the field, and the window stays.
    await page.getByTestId('mean-span').fill('-1');
    await page.getByTestId('mean-span').press('Enter');
    await expect(page.getByTestId('mean-span-error').innerText()).resolves.toMatch(
      /meanSpan must be a finite number > 0/,
    );
  });

  it('Hovmöller: ū(y, t) as an image in a backing store of CSS size × devicePixelRatio, with jet tracks, growing as the run goes on', async () => {
    const { page } = app;
    await openView(page, 'hovmoller');
    const canvas = '[data-testid=hovmoller-canvas]';
    await page.locator(canvas).waitFor();
    const a = await canvasSample(page, canvas);
    expect(a.red).toBeGreaterThan(1000);
    expect(a.blue).toBeGreaterThan(1000);
    const css = await page
      .locator(canvas)
      .evaluate((c: HTMLCanvasElement) => [c.clientWidth, c.clientHeight, c.width, c.height]);
    expect([css[2], css[3]]).toEqual([css[0], css[1]]);
    const columns = await attr(page, 'hovmoller-caption', 'data-columns');
    expect(await attr(page, 'hovmoller-caption', 'data-tracks')).toBeGreaterThan(0);
    await waitForTime(page, (await modelTime(page)) + 2);
    await expect
      .poll(() => attr(page, 'hovmoller-caption', 'data-columns'), { timeout: 30_000 })
      .toBeGreaterThan(columns);
    expect((await canvasSample(page, canvas)).hash).not.toBe(a.hash);
    await screenshot(page, 'hovmoller.png');
  });

  it('Spectra: E(k) with its zonal and residual parts, reference slopes and a fit over a chosen band; the 2D spectrum on request', async () => {
    const { page } = app;
    await openView(page, 'spectra');
    await page.getByTestId('chart-spectra').waitFor();
    await chartsChange(page, ['chart-spectra']);
    // The inverse-cascade range of a developed run: a slope between the −5/3 of the cascade and the −5 of the jets.
    const slope = Number(await page.getByTestId('spectra-fit').getAttribute('data-slope'));
    expect(slope).toBeLessThan(-1);
    expect(slope).toBeGreaterThan(-5);
    await expect(page.getByTestId('spectra-fit').innerText()).resolves.toMatch(/-?\d\.\d\d ± \d\.\d\d/);
    // Another band gives another fit; a band that runs backwards is refused at the field.
    await page.getByTestId('fit-hi').fill('40');
    await page.getByTestId('fit-hi').press('Enter');
    await expect
      .poll(async () => Number(await page.getByTestId('spectra-fit').getAttribute('data-slope')))
      .not.toBe(slope);
    await page.getByTestId('fit-lo').fill('50');
    await page.getByTestId('fit-lo').press('Enter');
    await expect(page.getByTestId('fit-lo-error').innerText()).resolves.toMatch(/lower to a higher k/);
    await page.getByTestId('show-2d').check();
    const map = '[data-testid=spectrum-2d]';
    await page.locator(map).waitFor();
    await expect.poll(async () => (await canvasSample(page, map)).red, { timeout: 30_000 }).toBeGreaterThan(500);
    await screenshot(page, 'spectra.png');
  });

  it('Flux: Π_E and Π_Z averaged over recent samples, with the eddy-to-mean conversion', async () => {
    const { page } = app;
    await openView(page, 'flux');
    await page.getByTestId('chart-flux-energy').waitFor();
    await chartsChange(page, ['chart-flux-energy', 'chart-flux-enstrophy', 'chart-conversion']);
    await expect.poll(() => attr(page, 'flux-caption', 'data-count'), { timeout: 30_000 }).toBeGreaterThan(2);
    expect(Number.isFinite(await attr(page, 'conversion', 'data-value'))).toBe(true);
    await page.getByTestId('spectral-average').selectOption('4');
    await expect.poll(() => attr(page, 'flux-caption', 'data-count'), { timeout: 30_000 }).toBeLessThanOrEqual(4);
    await screenshot(page, 'flux.png');
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
