import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, screenshot, type AppPage } from './support/app';

/** The field canvas's box in CSS pixels of the viewport. */
async function canvasBox(app: AppPage) {
  const box = await app.page.getByTestId('field-canvas').boundingBox();
  if (!box) throw new Error('no field canvas');
  return box;
}

describe('Layout of the Field view in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1280, height: 720 });
    app = await openApp(session);
    await app.page.getByTestId('field-canvas').waitFor();
  });

  afterAll(async () => {
    await session?.close();
  });

  it('at 1280 × 720 shows the whole figure with its axes without scrolling', async () => {
    const box = await canvasBox(app);
    expect(await app.page.evaluate(() => window.scrollY)).toBe(0);
    // The canvas holds the plot, the axis labels below it and the colour bar: all of it inside the window.
    expect(box.y).toBeGreaterThanOrEqual(0);
    expect(box.y + box.height).toBeLessThanOrEqual(720);
    expect(box.x + box.width).toBeLessThanOrEqual(1280);
    expect(box.height).toBeGreaterThan(300);
    await screenshot(app.page, 'layout-1280x720.png');
  });

  it('grows with the window, and more when the parameter column is folded away', async () => {
    const small = await canvasBox(app);
    await app.page.setViewportSize({ width: 1600, height: 1000 });
    await expect.poll(async () => (await canvasBox(app)).height).toBeGreaterThan(small.height + 150);
    const big = await canvasBox(app);
    expect(big.y + big.height).toBeLessThanOrEqual(1000);
    await app.page.setViewportSize({ width: 1280, height: 720 });
    await expect.poll(async () => (await canvasBox(app)).height).toBeCloseTo(small.height, 0);
    await app.page.getByTestId('fold-panel').click();
    await expect(app.page.getByRole('complementary', { name: 'Run and parameters' }).isVisible()).resolves.toBe(false);
    // The plot is as tall as the window allows; folded, the figure moves left and the view has the width.
    const folded = await canvasBox(app);
    expect(folded.x).toBeLessThan(small.x - 200);
    expect(folded.y + folded.height).toBeLessThanOrEqual(720);
    await screenshot(app.page, 'layout-folded.png');
    await app.page.getByTestId('unfold-panel').click();
    await app.page.getByTestId('model-steps').waitFor();
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
