import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { canvasSample, inkPixels, openApp, openView, screenshot, status, type AppPage } from './support/app';

const steps = async (app: AppPage, pane: string) => Number(await app.page.getByTestId(pane).getAttribute('data-steps'));

describe('Compare view in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1100 });
    app = await openApp(session);
    await openView(app.page, 'compare');
  });

  afterAll(async () => {
    await session?.close();
  });

  it('runs two models side by side, each in its own worker, with the main run paused', async () => {
    const { page } = app;
    await page.getByTestId('compare-start').click();
    await expect.poll(() => status(page)).toBe('paused');
    for (const pane of ['compare-pane-a', 'compare-pane-b'])
      await expect.poll(() => steps(app, pane), { timeout: 30_000 }).toBeGreaterThan(50);
    const a0 = await steps(app, 'compare-pane-a');
    const b0 = await steps(app, 'compare-pane-b');
    await expect.poll(() => steps(app, 'compare-pane-a'), { timeout: 30_000 }).toBeGreaterThan(a0 + 200);
    await expect.poll(() => steps(app, 'compare-pane-b'), { timeout: 30_000 }).toBeGreaterThan(b0 + 200);
    await expect(page.getByTestId('compare-pane-a').locator('h3').innerText()).resolves.toBe('A: β = 0');
    await expect(page.getByTestId('compare-pane-b').locator('h3').innerText()).resolves.toBe('B: β = 40');
  });

  it('shows the field, the zonal profile and the spectra of each, and the same seed makes them differ only by β', async () => {
    const { page } = app;
    const fieldA = '[data-testid=compare-pane-a] [data-testid=field-canvas]';
    const fieldB = '[data-testid=compare-pane-b] [data-testid=field-canvas]';
    for (const id of [
      'compare-pane-a-zonal',
      'compare-pane-b-zonal',
      'compare-pane-a-spectra',
      'compare-pane-b-spectra',
    ]) {
      await expect.poll(() => inkPixels(page, `[data-testid=${id}] canvas`), { timeout: 60_000 }).toBeGreaterThan(1500);
    }
    const a = await canvasSample(page, fieldA);
    const b = await canvasSample(page, fieldB);
    expect(a.red + a.blue).toBeGreaterThan(10_000);
    expect(b.hash).not.toBe(a.hash);
    // Let jets form in B (about t = 40 on the default run's pace, shared here by two runs).
    await page.waitForFunction(
      () => Number(document.querySelector('[data-testid=compare-pane-b]')?.getAttribute('data-steps')) > 3000,
      null,
      { timeout: 150_000 },
    );
    await screenshot(page, 'compare.png');
  }, 200_000);

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
