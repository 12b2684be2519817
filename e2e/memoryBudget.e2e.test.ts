import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { decodeRunFile, encodeRunFile } from '../lib/io/runFile';
import { CHECKPOINT_FORMAT, CHECKPOINT_VERSION } from '../lib/model/checkpoint';
import { validateParams } from '../lib/model/validateParams';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, readText, steps, waitForSteps } from './support/app';

// The app's memory budget (src/appMemory.ts) on a device of 2 GiB: a quarter, 512 MiB, which a
// 1024² run exceeds. navigator.deviceMemory (Device Memory API) is set to 2 before the page runs.
function smallDevice(): void {
  Object.defineProperty(Navigator.prototype, 'deviceMemory', { get: () => 2, configurable: true });
}

const NEEDS = /1024 × 1024 needs ≈ \d+ MiB; the app's budget is 512 MiB \(a quarter of this device's 2 GiB\)/;

describe('The memory budget in Chromium', () => {
  let session: BrowserSession;
  const problems: string[][] = [];

  beforeAll(async () => {
    session = await launchChromium({ width: 1300, height: 1000 });
    await session.context.addInitScript(smallDevice);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('the grid field refuses 1024 × 1024 with the estimate, and the run goes on', async () => {
    const app = await openApp(session);
    problems.push(app.problems);
    const { page } = app;
    expect(await page.evaluate(() => (navigator as Navigator & { deviceMemory?: number }).deviceMemory)).toBe(2);
    await page.locator('#param-nx').selectOption('1024');
    await expect(readText(page, 'param-notice')).resolves.toMatch(/New grid 1024 × 128/);
    // The fields show the grid in force once a snapshot of the new grid has come.
    await expect.poll(() => page.locator('#param-nx').inputValue()).toBe('1024');
    await page.locator('#param-ny').selectOption('1024');
    await expect(readText(page, 'error-ny')).resolves.toMatch(
      new RegExp(`${NEEDS.source} \\(the run goes on with ny = 128\\)`),
    );
    const n = await steps(page);
    await waitForSteps(page, n + 3);
    await page.close();
  });

  it('a link to a 1024 × 1024 run is refused with the estimate; the default scenario opens', async () => {
    const app = await openApp(session, 'v=1&nx=1024&ny=1024');
    problems.push(app.problems);
    await expect(readText(app.page, 'link-error')).resolves.toMatch(NEEDS);
    await expect(app.page.locator('#param-nx').inputValue()).resolves.toBe('128');
    await app.page.close();
  });

  it('a run file of 1024 × 1024 is refused with the estimate before it is loaded', async () => {
    const app = await openApp(session);
    problems.push(app.problems);
    const params = validateParams({ nx: 1024, ny: 1024 });
    const qHat = new Float64Array(2 * 1024 * 513);
    const text = encodeRunFile({
      format: CHECKPOINT_FORMAT,
      version: CHECKPOINT_VERSION,
      params,
      time: 0,
      steps: 0,
      dt: params.dt,
      rng: [1, 2, 3, 4],
      qHat,
    });
    expect(decodeRunFile(text).params).toEqual(params); // a good file: only its size is refused
    await app.page
      .getByTestId('load-run')
      .setInputFiles({ name: 'large.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await expect(readText(app.page, 'share-message')).resolves.toMatch(
      new RegExp(`^large\\.json was not loaded: ${NEEDS.source}\\. The current run goes on\\.`),
    );
    await expect(app.page.locator('#param-nx').inputValue()).resolves.toBe('128');
    await app.page.close();
  });

  it('ran without page errors or console warnings', () => {
    expect(problems.flat()).toEqual([]);
  });
});
