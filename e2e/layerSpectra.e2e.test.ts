import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../lib/io/csv';
import { launchChromium, type BrowserSession } from './support/browser';
import { inkPixels, openApp, openView, pause, readText, screenshot, waitForTime, type AppPage } from './support/app';

async function csvOf(page: Page, testid: string): Promise<Record<string, number[]>> {
  const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).click()]);
  const t = parseCsv(await readFile(await d.path()));
  return Object.fromEntries(t.header.map((h, j) => [h, t.rows.map((r) => Number(r[j]))]));
}

describe('Spectra and Flux of a two-layer run in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('Spectra: barotropic or baroclinic, and their CSV', async () => {
    const { page } = app;
    await page.getByTestId('scenario').selectOption('atmosphere-two-layer');
    await expect.poll(() => readText(page, 'scenario-description')).toMatch(/Equal layers/);
    await waitForTime(page, 1, 120_000);
    await openView(page, 'spectra');
    await page.getByTestId('chart-layer-spectra').waitFor({ timeout: 30_000 });
    await expect
      .poll(() => inkPixels(page, '[data-testid=chart-layer-spectra] canvas'), { timeout: 30_000 })
      .toBeGreaterThan(1000);
    await page.getByTestId('layer-spectra-baroclinic').check();
    await expect(page.getByTestId('layer-spectra').getAttribute('data-mode')).resolves.toBe('baroclinic');
    await expect
      .poll(() => inkPixels(page, '[data-testid=chart-layer-spectra] canvas'), { timeout: 30_000 })
      .toBeGreaterThan(1000);
    await screenshot(page, 'two-layer-spectra.png');
    const kd = Number(await page.locator('#param-kd').inputValue());
    const csv = await csvOf(page, 'export-layer-spectra-csv');
    expect(Object.keys(csv)).toEqual(['k', 'KE_barotropic', 'KE_baroclinic', 'APE']);
    const dk = csv.k[0];
    // Per mode APE/KE_bc = k_d²/K² (½h₁h₂k_d²|τ̂|² over ½h₁h₂K²|τ̂|², docs/two-layer.md) [derived]; shell s holds
    // K in [(s + ½)dk, (s + 3/2)dk] (spectra.ts), so the shell ratio lies between the ratios at its edges.
    let compared = 0;
    for (let s = 0; s < csv.k.length; s++) {
      if (!(csv.KE_baroclinic[s] > 0)) continue;
      const r = csv.APE[s] / csv.KE_baroclinic[s];
      const rel = 1e-12;
      expect(r, `shell ${s}`).toBeLessThanOrEqual((kd / ((s + 0.5) * dk)) ** 2 * (1 + rel));
      expect(r, `shell ${s}`).toBeGreaterThanOrEqual((kd / ((s + 1.5) * dk)) ** 2 * (1 - rel));
      compared++;
    }
    expect(compared).toBeGreaterThan(20);
    expect(csv.KE_barotropic.some((e) => e > 0)).toBe(true);
  }, 180_000);

  it('Flux: the modes’ fluxes and the exchange between them, and their CSV', async () => {
    const { page } = app;
    await openView(page, 'flux');
    await page.getByTestId('chart-layer-flux').waitFor({ timeout: 30_000 });
    for (const mode of ['baroclinic', 'exchange', 'barotropic']) {
      await page.getByTestId(`layer-flux-${mode}`).check();
      await expect(page.getByTestId('layer-flux').getAttribute('data-mode')).resolves.toBe(mode);
      await expect
        .poll(() => inkPixels(page, '[data-testid=chart-layer-flux] canvas'), { timeout: 30_000 })
        .toBeGreaterThan(1000);
      if (mode === 'exchange') await screenshot(page, 'two-layer-flux-exchange.png');
    }
    await expect(page.getByTestId('layer-flux-caption').locator('sub').first().innerText()).resolves.toBe('bt');
    // The numbers and the CSV of one moment: paused, and the last update shown (the run moves on otherwise).
    await pause(page);
    const exchangeShown = () => page.getByTestId('layer-flux').getAttribute('data-exchange');
    let last = await exchangeShown();
    await expect
      .poll(
        async () => {
          const now = await exchangeShown();
          const same = now === last;
          last = now;
          return same;
        },
        { timeout: 10_000, interval: 300 },
      )
      .toBe(true);
    const csv = await csvOf(page, 'export-layer-flux-csv');
    expect(Object.keys(csv)).toEqual(['k', 'exchange_X', 'k_edge', 'Pi', 'Pi_barotropic', 'Pi_baroclinic']);
    // Advection conserves energy: the flux through the last edge is zero to round-off (docs/two-layer.md) [derived].
    const scale = Math.max(...csv.Pi.map(Math.abs));
    expect(scale).toBeGreaterThan(0);
    expect(Math.abs(csv.Pi[csv.Pi.length - 1])).toBeLessThanOrEqual(1e-9 * scale);
    // The exchange shown is the sum of the exchange per shell (a mean of sums is the sum of the means) [derived].
    const net = Number(await page.getByTestId('layer-flux').getAttribute('data-exchange'));
    const sum = csv.exchange_X.reduce((a, b) => a + b, 0);
    const gross = csv.exchange_X.reduce((a, b) => a + Math.abs(b), 0);
    expect(Math.abs(sum - net)).toBeLessThanOrEqual(1e-9 * gross);
    expect(app.problems).toEqual([]);
  });
});
