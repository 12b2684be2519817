import type { CDPSession, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { inkPixels, openApp, openView, waitForSteps, type AppPage } from './support/app';

/**
 * Every view on the large grids, where a chart once froze the tab: at 256² the spectrum's
 * hyperviscous shells hold energies below 1e-25, and the chart library's log-axis ticks looped
 * without end over them (the main thread blocked for tens of seconds and the heap grew past 1 GB).
 * Each view must answer and keep the page's JavaScript heap small. The bounds are a freeze detector,
 * not a speed measurement: a healthy page answers in milliseconds and holds a few tens of MB, the
 * frozen one blocked for 15–40 s and held 1–2 GB.
 */
const VIEWS = ['field', 'zonal', 'hovmoller', 'spectra', 'flux', 'budget', 'scales', 'plan', 'sweep', 'compare'];
/** Longest the main thread may take to answer after a view opened (ms). */
const ANSWER_BOUND_MS = 10_000;
/** Largest JavaScript heap of the page (bytes). */
const HEAP_BOUND = 300 * 2 ** 20;

async function heapUsed(cdp: CDPSession): Promise<number> {
  const { metrics } = await cdp.send('Performance.getMetrics');
  return metrics.find((m) => m.name === 'JSHeapUsedSize')?.value ?? NaN;
}

/** Time for the page to run a trivial script: how long its main thread is blocked. */
async function answerTime(page: Page): Promise<number> {
  const t = Date.now();
  await page.evaluate(() => 1);
  return Date.now() - t;
}

for (const n of [256, 512]) {
  describe(`Every view at ${n} × ${n} in Chromium`, () => {
    let session: BrowserSession;
    let app: AppPage;
    let cdp: CDPSession;

    beforeAll(async () => {
      session = await launchChromium({ width: 1400, height: 1000 });
      app = await openApp(session, `v=1&nx=${n}&ny=${n}`);
      cdp = await session.context.newCDPSession(app.page);
      await cdp.send('Performance.enable');
      await waitForSteps(app.page, 2);
    });

    afterAll(async () => {
      await session?.close();
    });

    it('runs the grid asked for', async () => {
      await expect(app.page.locator('#param-nx').inputValue()).resolves.toBe(String(n));
      await expect(app.page.locator('#param-ny').inputValue()).resolves.toBe(String(n));
    });

    for (const view of VIEWS) {
      it(`opens the ${view} view; the page answers and its heap stays small`, async () => {
        const { page } = app;
        await openView(page, view);
        // Two diagnostics rounds, so that the view has drawn what it shows.
        for (let i = 0; i < 4; i++) {
          await page.waitForTimeout(500);
          expect(await answerTime(page), `main thread blocked in the ${view} view`).toBeLessThan(ANSWER_BOUND_MS);
        }
        expect(await heapUsed(cdp), `JS heap in the ${view} view`).toBeLessThan(HEAP_BOUND);
        expect(app.problems).toEqual([]);
      });
    }

    it('draws the spectrum', async () => {
      const { page } = app;
      await openView(page, 'spectra');
      await page.getByTestId('chart-spectra').waitFor({ timeout: 60_000 });
      await expect
        .poll(() => inkPixels(page, '[data-testid=chart-spectra] canvas'), { timeout: 30_000 })
        .toBeGreaterThan(500);
    });
  });
}
