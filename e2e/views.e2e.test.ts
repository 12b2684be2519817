import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { canvasSample, modelTime, openApp, openView, screenshot, waitForSteps, type AppPage } from './support/app';

describe('Budget and Scale ladder views in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('lists only the views that work', async () => {
    const tabs = await app.page.getByRole('tab').allInnerTexts();
    expect(tabs).toEqual([
      'Field',
      'Zonal',
      'Hovmöller',
      'Spectra',
      'Flux',
      'Budget',
      'Energy cycle',
      'Scale ladder',
      'Plan',
      'Sweep',
      'Compare',
    ]);
  });

  it('says that the energy cycle belongs to two-layer runs when the run has one layer', async () => {
    await openView(app.page, 'cycle');
    await expect(app.page.getByTestId('cycle-one-layer').innerText()).resolves.toMatch(/two-layer runs/);
  });

  it('draws the budget charts, and they grow as the run goes on', async () => {
    const { page } = app;
    await page.getByTestId('tab-budget').click();
    await waitForSteps(page, 100);
    const view = page.getByTestId('budget-view');
    await expect.poll(async () => Number(await view.getAttribute('data-samples'))).toBeGreaterThan(10);
    const charts = ['chart-energy', 'chart-energy-rates', 'chart-enstrophy-rates', 'chart-residual'];
    const before = [];
    for (const id of charts) {
      await expect.poll(async () => Number(await page.getByTestId(id).getAttribute('data-points'))).toBeGreaterThan(10);
      before.push(await canvasSample(page, `[data-testid=${id}] canvas`));
    }
    const points = Number(await page.getByTestId('chart-energy').getAttribute('data-points'));
    const t = await modelTime(page);
    await page.waitForFunction(
      (t0) => Number(document.querySelector('[data-testid=model-time]')?.textContent) > t0 + 2,
      t,
      { timeout: 60_000 },
    );
    await expect
      .poll(async () => Number(await page.getByTestId('chart-energy').getAttribute('data-points')))
      .toBeGreaterThan(points);
    for (const [i, id] of charts.entries()) {
      await expect
        .poll(async () => (await canvasSample(page, `[data-testid=${id}] canvas`)).hash, { timeout: 10_000 })
        .not.toBe(before[i].hash);
    }
    // The residual of the budget is round-off, relative to its largest term.
    const residual = Number(await page.getByTestId('residual-max').getAttribute('data-value'));
    expect(residual).toBeGreaterThan(0);
    expect(residual).toBeLessThan(1e-12);
    await screenshot(page, 'budget.png');
  });

  it('draws the scale ladder, and its measured Rhines wavenumber moves with U_rms', async () => {
    const { page } = app;
    await page.getByTestId('tab-scales').click();
    const ladder = page.getByTestId('scale-ladder');
    await ladder.waitFor();
    for (const id of [
      'fixed-domain',
      'fixed-transitional',
      'fixed-friction',
      'fixed-forcing',
      'fixed-grid',
      'predicted-rhines',
      'measured-rhines',
      'measured-dissipation',
    ]) {
      await expect(page.getByTestId(`rung-${id}`).count(), id).resolves.toBe(1);
    }
    const k0 = Number(await page.getByTestId('rung-measured-rhines').getAttribute('data-k'));
    expect(k0).toBeGreaterThan(0);
    await expect
      .poll(async () => Number(await page.getByTestId('rung-measured-rhines').getAttribute('data-k')), {
        timeout: 30_000,
      })
      .not.toBe(k0);
    await expect(page.getByTestId('predicted-regime').innerText()).resolves.toMatch(/zonostrophic/);
    await expect(page.getByTestId('measured-rbeta').innerText()).resolves.toMatch(/^\d+\.\d+$/);
    // Another Rhines convention moves the Rhines rung, and says which it is.
    const kR = Number(await page.getByTestId('rung-predicted-rhines').getAttribute('data-k'));
    await page.locator('#rhines-convention').selectOption('sqrtUbeta');
    const kOther = Number(await page.getByTestId('rung-predicted-rhines').getAttribute('data-k'));
    // (U/β)^½ placed at 2π/L is 2π√2 times k_R = (β/2U)^½.
    expect(kOther / kR).toBeCloseTo(2 * Math.PI * Math.SQRT2, 6);
    await screenshot(page, 'scales.png');
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
