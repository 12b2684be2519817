import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, pause, readText, screenshot, steps, waitForTime, type AppPage } from './support/app';

describe('Loading a run file in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1280, height: 900 });
    app = await openApp(session);
    await waitForTime(app.page, 6);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('shows the loaded state at once: its readouts, then the Zonal and Hovmöller views without waiting', async () => {
    const { page } = app;
    await pause(page);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('save-run').click()]);
    const file = await download.path();
    const savedAt = await steps(page);
    const energy = Number(await readText(page, 'model-energy'));
    const cfl = Number(await readText(page, 'model-cfl'));
    // A new run from the Reset button, then the file: nothing is stepped after loading.
    await page.getByTestId('reset').click();
    await expect.poll(() => steps(page)).toBe(0);
    await page.getByTestId('load-run').setInputFiles(file);
    await expect.poll(() => steps(page)).toBe(savedAt);
    await expect(readText(page, 'share-message')).resolves.toMatch(/Loaded .*paused at step/);
    // The state's own energy and CFL number, as the step that was taken at the save reported them
    // (the step report then was of the state before its last step: within a step's change).
    const shownEnergy = Number(await readText(page, 'model-energy'));
    expect(shownEnergy).toBeGreaterThan(0);
    expect(Math.abs(shownEnergy / energy - 1)).toBeLessThan(0.02);
    expect(Number(await readText(page, 'model-cfl'))).toBeGreaterThan(0.5 * cfl);
    expect(Number(await readText(page, 'model-dt'))).toBeGreaterThan(0);
    // A first sample of the diagnostics, at once, while paused.
    await expect(readText(page, 'means-window')).resolves.toMatch(/\(1 sample\)/);
    await openView(page, 'zonal');
    await page.getByTestId('zonal-view').waitFor({ timeout: 5000 });
    expect(await page.getByTestId('zonal-waiting').count()).toBe(0);
    await openView(page, 'hovmoller');
    await page.getByTestId('hovmoller-canvas').waitFor({ timeout: 5000 });
    expect(await page.getByTestId('hovmoller-waiting').count()).toBe(0);
    expect(await steps(page)).toBe(savedAt);
    await screenshot(page, 'loaded-run.png');
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
