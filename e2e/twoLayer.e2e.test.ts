import { extname, resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import {
  ARTIFACTS,
  canvasSample,
  inkPixels,
  modelTime,
  openApp,
  openView,
  pause,
  readText,
  screenshot,
  waitForTime,
  type AppPage,
} from './support/app';

const attr = async (page: Page, testid: string, name: string) =>
  Number(await page.getByTestId(testid).getAttribute(name));

describe('Two-layer runs in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('layers = 2 from the parameter panel starts a new run, which plays in the worker', async () => {
    const { page } = app;
    await waitForTime(page, 2);
    const kd = page.locator('#param-kd');
    await kd.fill('4');
    await kd.press('Enter');
    await expect.poll(() => readText(page, 'param-notice')).toMatch(/k_?d|kd/);
    // Paused, so that the new run's clock can be read at its start.
    await pause(page);
    expect(await modelTime(page)).toBeGreaterThan(2);
    await page.locator('#param-layers').selectOption('2');
    await expect.poll(() => readText(page, 'param-notice')).toMatch(/2 layers: the run started afresh from t = 0/);
    await expect.poll(() => modelTime(page)).toBe(0);
    await page.getByTestId('play-pause').click();
    await waitForTime(page, 0.5);
    await page.getByTestId('layer-upper').waitFor();
  });

  it('the atmosphere-like scenario grows eddies from its seed and shows the four layer views of the field', async () => {
    const { page } = app;
    await page.getByTestId('scenario').selectOption('atmosphere-two-layer');
    await expect.poll(() => readText(page, 'scenario-description')).toMatch(/Equal layers/);
    expect(await modelTime(page)).toBeLessThan(2);
    // The seed grows e-fold about every 1/(2σ) and the eddies are grown by t ≈ 12 (twoLayerScenarios.ts).
    await waitForTime(page, 16, 240_000);
    const field = '[data-testid=field-canvas]';
    const seen = new Set<number>();
    for (const view of ['upper', 'lower', 'barotropic', 'baroclinic']) {
      await page.getByTestId(`layer-${view}`).check();
      await expect.poll(() => page.getByTestId(`layer-${view}`).isChecked()).toBe(true);
      await page.waitForTimeout(400);
      const s = await canvasSample(page, field);
      // Eddies: both signs of u, well away from a blank field.
      expect(s.red, view).toBeGreaterThan(500);
      expect(s.blue, view).toBeGreaterThan(500);
      seen.add(s.hash);
      if (view === 'upper' || view === 'baroclinic') await screenshot(page, `two-layer-field-${view}.png`);
    }
    expect(seen.size).toBe(4);
  }, 300_000);

  it('Zonal: each layer’s ū and PV with the heat flux, carried poleward once eddies grow', async () => {
    const { page } = app;
    await openView(page, 'zonal');
    await page.getByTestId('layer-zonal').waitFor({ timeout: 30_000 });
    for (const id of ['chart-layer-ubar', 'chart-layer-pv', 'chart-heat'])
      await expect.poll(() => inkPixels(page, `[data-testid=${id}] canvas`), { timeout: 30_000 }).toBeGreaterThan(2000);
    // The shear is positive (U₁ > U₂): growing baroclinic eddies carry heat down the gradient, ⟨v′τ′⟩ > 0.
    await expect.poll(() => attr(page, 'layer-zonal', 'data-heat'), { timeout: 30_000 }).toBeGreaterThan(0);
    await expect(readText(page, 'layer-heat')).resolves.toMatch(/down the mean temperature gradient/);
    await screenshot(page, 'two-layer-zonal.png');
    // Jets of the barotropic flow, significant in the time mean over the flow memory 1/(μh₂) = 4.6
    // (in a trial: two, 3.1 ± 0.5 apart, by t ≈ 17.6, about a minute of play here).
    await expect.poll(() => attr(page, 'model-jets', 'data-count'), { timeout: 120_000 }).toBeGreaterThanOrEqual(1);
    // The barotropic ū over time: bands that persist once the eddies have grown.
    await openView(page, 'hovmoller');
    await page.waitForTimeout(800);
    await screenshot(page, 'two-layer-hovmoller.png');
  });

  it('Energy cycle: positive generation, conversion and transfer, live, with PNG and CSV export', async () => {
    const { page } = app;
    await openView(page, 'cycle');
    const cycle = page.getByTestId('energy-cycle');
    await cycle.waitFor({ timeout: 30_000 });
    // G > 0 → C > 0 → T > 0 in growing and equilibrated baroclinic eddies [practice; docs/two-layer.md].
    await expect.poll(() => attr(page, 'energy-cycle', 'data-generation'), { timeout: 30_000 }).toBeGreaterThan(0);
    expect(await attr(page, 'energy-cycle', 'data-conversion')).toBeGreaterThan(0);
    expect(await attr(page, 'energy-cycle', 'data-transfer')).toBeGreaterThan(0);
    const g0 = await attr(page, 'energy-cycle', 'data-generation');
    await expect.poll(() => attr(page, 'energy-cycle', 'data-generation'), { timeout: 30_000 }).not.toBe(g0);
    await expect
      .poll(() => inkPixels(page, '[data-testid=chart-cycle] canvas'), { timeout: 30_000 })
      .toBeGreaterThan(2000);
    // ξ = δk_d²(U₁ − U₂)/((1 + δ)β) = 6.436²/(2 × 10.95) = 1.89 [derived: lib/analysis/summary.ts, docs/two-layer.md section 4].
    await expect
      .poll(() => readText(page, 'cycle-summary'), { timeout: 30_000 })
      .toMatch(/supercriticality ξ = 1\.89.*generation \d/);
    await screenshot(page, 'two-layer-cycle.png');
    for (const testid of ['export-view-png', 'export-cycle']) {
      const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).click()]);
      expect(d.suggestedFilename()).toMatch(/^stria-energy-cycle-.*\.(png|csv)$/);
      // Kept beside the screenshots, to be looked at.
      await d.saveAs(resolve(ARTIFACTS, `two-layer-export${extname(d.suggestedFilename())}`));
    }
    await expect(readText(page, 'view-export-note')).resolves.toMatch(
      /Saved stria-energy-cycle-.*\.csv: the energy cycle at \d+ times/,
    );
    expect(app.problems).toEqual([]);
  });

  it('the ocean-like scenario grows eddies too: the cycle turns with positive generation', async () => {
    const { page } = app;
    await page.getByTestId('scenario').selectOption('ocean-two-layer');
    await expect.poll(() => readText(page, 'scenario-description')).toMatch(/thin upper layer/);
    await waitForTime(page, 13, 240_000);
    await expect.poll(() => attr(page, 'energy-cycle', 'data-generation'), { timeout: 30_000 }).toBeGreaterThan(0);
    await expect.poll(() => attr(page, 'energy-cycle', 'data-transfer'), { timeout: 30_000 }).toBeGreaterThan(0);
    await screenshot(page, 'two-layer-ocean-cycle.png');
    await openView(page, 'field');
    await page.getByTestId('layer-upper').check();
    await page.waitForTimeout(400);
    await screenshot(page, 'two-layer-ocean-field.png');
    // The state and the zonal means as the layered files, each read back in the page before it is offered.
    for (const [kind, read] of [
      ['snapshot', /of both layers on 128 × 128.*read back: .*variables \(.*u.*\), 1 record/],
      ['zonal-netcdf', /of each layer and the heat flux.*read back: .*heat_flux/],
      ['zonal-csv', /read back: 14 columns \(time, step, y, ubar1, ubar2/],
    ] as const) {
      await Promise.all([page.waitForEvent('download'), page.getByTestId(`export-${kind}`).click()]);
      await expect.poll(() => readText(page, 'export-message'), { timeout: 30_000 }).toMatch(read);
    }
    expect(app.problems).toEqual([]);
  }, 300_000);
});
