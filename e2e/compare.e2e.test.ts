import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../lib/io/csv';
import { ncgen, runNcgen } from '../test/io/ncgenTool';
import { launchChromium, type BrowserSession } from './support/browser';
import { canvasSample, inkPixels, openApp, openView, screenshot, status, type AppPage } from './support/app';

const steps = async (app: AppPage, pane: string) => Number(await app.page.getByTestId(pane).getAttribute('data-steps'));
/** The x and y ranges a chart last drew ("min max"; UPlotChart). */
const ranges = async (page: Page, id: string) => {
  const c = page.getByTestId(id);
  return `${await c.getAttribute('data-x-range')} | ${await c.getAttribute('data-y-range')}`;
};
/** Raw subscript or superscript notation in shown text: k_R, U_rms, ^{1/4}. */
const RAW_NOTATION = /[\p{L}\d)]_[\p{L}{]|\^\{/u;

/**
 * A doubly periodic 32 × 32 flow in metres, u = −∂ψ/∂y and v = ∂ψ/∂x of a streamfunction of six
 * Fourier modes (amplitudes ∝ 1/k², phases moving from record to record), four records: periodic
 * in both directions by construction, a power of two, so it has spectra and (from ζ of u and v)
 * spectral fluxes.
 */
function periodicFile(): Uint8Array {
  const n = 32;
  const dx = 1000;
  const L = n * dx;
  const modes = [
    [0, 3],
    [1, 2],
    [2, 1],
    [3, 3],
    [4, 0],
    [1, 5],
  ];
  const records = 4;
  const u: string[] = [];
  const v: string[] = [];
  for (let r = 0; r < records; r++)
    for (let j = 0; j < n; j++)
      for (let i = 0; i < n; i++) {
        let uu = 0;
        let vv = 0;
        for (const [m, [a, b]] of modes.entries()) {
          const kx = (2 * Math.PI * a) / L;
          const ky = (2 * Math.PI * b) / L;
          const amp = 6e-4 / (kx * kx + ky * ky);
          const phase = kx * i * dx + ky * j * dx + 0.7 * m * (r + 1);
          // ψ = amp cos(phase): u = −∂ψ/∂y = amp ky sin, v = ∂ψ/∂x = −amp kx sin.
          uu += amp * ky * Math.sin(phase);
          vv += -amp * kx * Math.sin(phase);
        }
        u.push(uu.toPrecision(8));
        v.push(vv.toPrecision(8));
      }
  const axis = Array.from({ length: n }, (_, i) => i * dx).join(', ');
  return ncgen(
    `netcdf periodic {
dimensions:
  time = ${records} ; y = ${n} ; x = ${n} ;
variables:
  double time(time) ; time:units = "s" ;
  double y(y) ; y:units = "m" ; y:axis = "Y" ;
  double x(x) ; x:units = "m" ; x:axis = "X" ;
  double u(time, y, x) ; u:units = "m s-1" ;
  double v(time, y, x) ; v:units = "m s-1" ;
data:
  time = ${Array.from({ length: records }, (_, r) => r * 3600).join(', ')} ;
  y = ${axis} ;
  x = ${axis} ;
  u = ${u.join(', ')} ;
  v = ${v.join(', ')} ;
}
`,
    'nc3',
  );
}

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

  it('draws A and B on the same axes, gives numbers for each, and shows no raw notation', async () => {
    const { page } = app;
    await page.getByTestId('compare-play').click();
    await expect(page.getByTestId('compare-play').innerText()).resolves.toBe('Play both');
    for (const chart of ['zonal', 'spectra']) {
      // Equal colours were shared before; the profile's ū range and the spectra's k and E ranges now are too.
      await expect
        .poll(
          async () => [await ranges(page, `compare-pane-a-${chart}`), await ranges(page, `compare-pane-b-${chart}`)],
          {
            timeout: 30_000,
          },
        )
        .toSatisfy(([a, b]) => a === b && !a.includes('null') && /\d.* \| .*\d/.test(a));
    }
    for (const pane of ['compare-pane-a', 'compare-pane-b'])
      // U_rms as a number with its standard error, not a word.
      await expect(page.getByTestId(`${pane}-urms`).innerText()).resolves.toMatch(/^\d\.\d+( ± \d[\d.]*)?$/);
    // R_β = √2 (β²ε/μ⁵)^{1/20} needs β: a number for B (β = 40), none for A (β = 0).
    await expect(page.getByTestId('compare-pane-b-rbeta').innerText()).resolves.toMatch(/^\d+(\.\d+)?( ± \d[\d.]*)?$/);
    await expect(page.getByTestId('compare-pane-a-rbeta').innerText()).resolves.toBe('—');
    expect(await page.getByTestId('compare-pair').innerText()).not.toMatch(RAW_NOTATION);
    await screenshot(page, 'compare-shared-axes.png');
  });

  it('exports both panes as one PNG and their profiles and spectra as CSV', async () => {
    const { page } = app;
    const get = async (testid: string) => {
      const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).click()]);
      return { name: d.suggestedFilename(), bytes: await readFile(await d.path()) };
    };
    const image = await get('export-view-png');
    expect(image.name).toMatch(/^stria-compare-.*\.png$/);
    expect(Array.from(image.bytes.subarray(1, 4))).toEqual([0x50, 0x4e, 0x47]);
    expect(image.bytes.readUInt32BE(16)).toBeGreaterThan(600);
    const profiles = parseCsv((await get('export-compare-profiles')).bytes);
    expect(profiles.header).toEqual(['y', 'A_ubar_latest', 'A_ubar_time_mean', 'B_ubar_latest', 'B_ubar_time_mean']);
    expect(profiles.rows.length).toBe(128);
    const spectra = parseCsv((await get('export-compare-spectra')).bytes);
    expect(spectra.header).toEqual([
      'k',
      'A_E_total',
      'A_E_zonal',
      'A_E_residual',
      'B_E_total',
      'B_E_zonal',
      'B_E_residual',
    ]);
    expect(spectra.rows.length).toBeGreaterThan(20);
  });

  it.runIf(runNcgen)(
    "gives a user's doubly periodic file its spectra and fluxes, and numbers in every row of its comparison",
    async () => {
      const { page } = app;
      for (const [id, x] of [
        ['user-beta', '1.6e-11'],
        ['user-eps', '1e-9'],
        ['user-mu', '1e-6'],
      ]) {
        await page.getByTestId(id).fill(x);
        await page.getByTestId(id).press('Enter');
      }
      await page.getByTestId('user-file').setInputFiles({
        name: 'periodic.nc',
        mimeType: 'application/x-netcdf',
        buffer: Buffer.from(periodicFile()),
      });
      const result = page.getByTestId('user-result');
      await result.waitFor({ timeout: 60_000 });
      await expect(result.innerText()).resolves.toMatch(/periodic in x:\s*yes, in y:\s*yes/);
      for (const id of ['user-spectra', 'user-flux'])
        await expect
          .poll(() => inkPixels(page, `[data-testid=${id}] canvas`), { timeout: 30_000 })
          .toBeGreaterThan(500);
      expect(await page.getByTestId('user-spectra-block').getAttribute('data-records')).toBe('4');
      // The regime row shows R_β beside the regime's name, measured and predicted.
      for (const side of ['measured', 'predicted'])
        await expect(page.getByTestId(`user-${side}-R_beta`).innerText()).resolves.toMatch(/^\d[\d.e+−-]* \(/);
      expect(await page.getByTestId('user-data').innerText()).not.toMatch(RAW_NOTATION);
      await screenshot(page, 'compare-user-file.png');
    },
  );

  it('runs both to one model time and holds them there', async () => {
    const { page } = app;
    await page.getByTestId('compare-until').fill('3');
    await page.getByTestId('compare-until').press('Enter');
    await page.getByTestId('compare-start').click();
    const time = async (pane: string) => Number(await page.getByTestId(pane).getAttribute('data-time'));
    for (const pane of ['compare-pane-a', 'compare-pane-b'])
      await expect.poll(() => time(pane), { timeout: 60_000 }).toBeGreaterThanOrEqual(3 - 1e-9);
    // Each stops at its first step reaching t = 3, so within one step (dt ≤ 0.02, the scenario's largest) past it.
    for (const pane of ['compare-pane-a', 'compare-pane-b']) expect(await time(pane)).toBeLessThanOrEqual(3.02 + 1e-9);
    const a = await steps(app, 'compare-pane-a');
    await page.waitForTimeout(1500);
    expect(await steps(app, 'compare-pane-a')).toBe(a);
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
