import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, screenshot, status, steps, waitForSteps, type AppPage } from './support/app';

describe('Keyboard in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1300, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('space pauses and plays, → takes one step', async () => {
    const { page } = app;
    await waitForSteps(page, 5);
    await page.locator('h1').click();
    await page.keyboard.press(' ');
    await expect.poll(() => status(page)).toBe('paused');
    const n = await steps(page);
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => steps(page)).toBe(n + 1);
    await page.keyboard.press('ArrowRight');
    await expect.poll(() => steps(page)).toBe(n + 2);
    await page.keyboard.press(' ');
    await expect.poll(() => status(page)).toBe('playing');
  });

  it('leaves keys alone while typing in a field', async () => {
    const { page } = app;
    const eps = page.locator('#param-eps');
    await eps.click();
    await page.keyboard.press('End');
    await page.keyboard.press(' ');
    await page.keyboard.press('ArrowRight');
    expect(await status(page)).toBe('playing');
    await expect(eps.inputValue()).resolves.toBe('0.02 ');
    await eps.press('Escape');
  });

  it('shows where the keyboard focus is', async () => {
    const { page } = app;
    await page.locator('h1').click();
    await page.keyboard.press('Tab');
    const outline = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      return el ? getComputedStyle(el).outlineStyle : 'none';
    });
    expect(outline).toBe('solid');
    await screenshot(page, 'focus.png');
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
