import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, pause, readText, resetAndStep, screenshot, status, steps, waitForSteps } from './support/app';

const checksum = (page: Page) => readText(page, 'checksum');

describe('Share and keep in Chromium', () => {
  let session: BrowserSession;
  const problems: string[][] = [];

  beforeAll(async () => {
    session = await launchChromium({ width: 1300, height: 1000 });
  });

  afterAll(async () => {
    await session?.close();
  });

  it('a shared link reproduces the run: the same state checksum after the same steps', async () => {
    const a = await openApp(session);
    problems.push(a.problems);
    await waitForSteps(a.page, 5);
    // A run off the defaults: another seed and β, changed mid-run.
    for (const [id, value] of [
      ['seed', '12345'],
      ['beta', '33'],
    ]) {
      await a.page.locator(`#param-${id}`).fill(value);
      await a.page.locator(`#param-${id}`).press('Enter');
    }
    await expect.poll(() => a.page.evaluate(() => location.hash)).toMatch(/beta=33.*seed=12345/);
    const link = await a.page.getByTestId('share-link').inputValue();
    expect(link).toMatch(/#v=1&.*beta=33.*seed=12345/);
    await resetAndStep(a.page, 6);
    const original = await checksum(a.page);
    await a.page.close();

    const b = await openApp(session, link.split('#')[1]);
    problems.push(b.problems);
    await expect.poll(() => status(b.page)).toBe('playing');
    await expect(b.page.locator('#param-beta').inputValue()).resolves.toBe('33');
    await resetAndStep(b.page, 6);
    expect(await checksum(b.page)).toBe(original);
    // And a different seed gives a different state.
    await b.page.locator('#param-seed').fill('12346');
    await b.page.locator('#param-seed').press('Enter');
    await resetAndStep(b.page, 6);
    expect(await checksum(b.page)).not.toBe(original);
    await b.page.close();
  });

  it('a bad link says what is wrong and opens the default scenario', async () => {
    const c = await openApp(session, 'v=1&nu_order=11&beta=fast');
    problems.push(c.problems);
    const message = await readText(c.page, 'link-error');
    expect(message).toMatch(/beta = “fast” is not a number/);
    expect(message).toMatch(/default scenario opened instead/);
    await expect(c.page.getByTestId('scenario').inputValue()).resolves.toBe('jets');
    await waitForSteps(c.page, 5);
    await screenshot(c.page, 'bad-link.png');
    await c.page.close();

    const d = await openApp(session, 'v=1&nu_order=11');
    problems.push(d.problems);
    await expect(readText(d.page, 'link-error')).resolves.toMatch(/nu_order = 11: must be an integer from 1 to 8/);
    await d.page.close();
  });

  it('saving then loading a run file resumes it exactly', async () => {
    const e = await openApp(session);
    problems.push(e.problems);
    const page = e.page;
    await waitForSteps(page, 30);
    await pause(page);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('save-run').click()]);
    expect(download.suggestedFilename()).toMatch(/^stria-run-t\d+\.\d\d\.json$/);
    const file = await download.path();
    const savedAt = await steps(page);
    const savedSum = await checksum(page);
    for (let i = 0; i < 5; i++) await page.getByTestId('step').click();
    await expect.poll(() => steps(page)).toBe(savedAt + 5);
    const continued = await checksum(page);

    // Let the run wander off, then load the file: back to the saved state, paused.
    await page.getByTestId('play-pause').click();
    await waitForSteps(page, savedAt + 40);
    await page.getByTestId('load-run').setInputFiles(file);
    await expect.poll(() => steps(page)).toBe(savedAt);
    expect(await status(page)).toBe('paused');
    expect(await checksum(page)).toBe(savedSum);
    await expect(readText(page, 'share-message')).resolves.toMatch(/Loaded .*paused at step/);
    for (let i = 0; i < 5; i++) await page.getByTestId('step').click();
    await expect.poll(() => steps(page)).toBe(savedAt + 5);
    expect(await checksum(page)).toBe(continued);
  });

  it('refuses a malformed run file naming the field, and the run goes on', async () => {
    const f = await openApp(session);
    problems.push(f.problems);
    await waitForSteps(f.page, 5);
    const broken = JSON.stringify({ format: 'stria-run', version: 1, params: { nx: 128 }, state: { time: -3 } });
    await f.page
      .getByTestId('load-run')
      .setInputFiles({ name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from(broken) });
    await expect(readText(f.page, 'share-message')).resolves.toMatch(
      /broken\.json was not loaded: run file: state\.time: model time must be ≥ 0/,
    );
    const n = await steps(f.page);
    await waitForSteps(f.page, n + 10);
    expect(await status(f.page)).toBe('playing');
  });

  it('ran without page errors or console warnings', () => {
    expect(problems.flat()).toEqual([]);
  });
});
