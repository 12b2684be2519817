import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../lib/io/csv';
import { readNetcdf } from '../lib/io/netcdfRead';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, waitForTime, type AppPage } from './support/app';
import { ARTIFACTS } from './support/app';
import { resolve } from 'node:path';
import { writeFile } from 'node:fs/promises';

/** Click a button; the downloaded file's name and bytes. */
async function download(page: Page, testid: string): Promise<{ name: string; bytes: Buffer }> {
  const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).first().click()]);
  return { name: d.suggestedFilename(), bytes: await readFile(await d.path()) };
}

/** PNG signature, width and height (IHDR), and how many distinct byte values the file holds (not a blank image). */
function png(bytes: Buffer): { width: number; height: number } {
  expect(Array.from(bytes.subarray(0, 8))).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return { width: bytes.readUInt32BE(16), height: bytes.readUInt32BE(20) };
}

/** The PNG of a view: as large as the figure on screen, and more than a blank page (a white PNG compresses to almost nothing). */
async function viewPng(page: Page, name: string): Promise<void> {
  const f = await download(page, 'export-view-png');
  expect(f.name).toMatch(/^stria-.*\.png$/);
  const { width, height } = png(f.bytes);
  expect(width).toBeGreaterThan(300);
  expect(height).toBeGreaterThan(150);
  expect(f.bytes.length).toBeGreaterThan(8000);
  await writeFile(resolve(ARTIFACTS, `export-${name}.png`), f.bytes);
}

describe('Every view exports its figure as PNG and the data behind it', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
    await waitForTime(app.page, 4);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('Zonal: PNG, profiles and jets as CSV', async () => {
    const { page } = app;
    await openView(page, 'zonal');
    await page.getByTestId('zonal-view').waitFor();
    await viewPng(page, 'zonal');
    const csv = parseCsv((await download(page, 'export-zonal-profiles')).bytes);
    expect(csv.header).toEqual([
      'y',
      'ubar_latest',
      'ubar_time_mean',
      'conv_upvp_latest',
      'conv_upvp_time_mean',
      'qtot_latest',
      'qtot_time_mean',
      'qtot_staircase_fit',
    ]);
    expect(csv.rows.length).toBe(128);
  });

  it('Hovmöller: PNG and ū(t, y) as NetCDF', async () => {
    const { page } = app;
    await openView(page, 'hovmoller');
    await page.getByTestId('hovmoller-canvas').waitFor();
    await viewPng(page, 'hovmoller');
    const nc = readNetcdf((await download(page, 'export-hovmoller-nc')).bytes);
    const columns = Number(await page.getByTestId('hovmoller-caption').getAttribute('data-columns'));
    expect(nc.variable('ubar').shape).toEqual([expect.any(Number), 128]);
    expect(nc.variable('ubar').shape[0]).toBeGreaterThanOrEqual(columns - 1);
    expect(nc.attributes.Conventions).toBe('CF-1.8');
  });

  it('Spectra: PNG and the spectra as CSV', async () => {
    const { page } = app;
    await openView(page, 'spectra');
    await page.getByTestId('chart-spectra').waitFor();
    await viewPng(page, 'spectra');
    const csv = parseCsv((await download(page, 'export-spectra-csv')).bytes);
    expect(csv.header.slice(0, 4)).toEqual(['k', 'E_total', 'E_zonal', 'E_residual']);
    expect(csv.rows.length).toBeGreaterThan(20);
  });

  it('Flux: PNG, fluxes and the conversion series as CSV', async () => {
    const { page } = app;
    await openView(page, 'flux');
    await page.getByTestId('chart-flux-energy').waitFor();
    await viewPng(page, 'flux');
    expect(parseCsv((await download(page, 'export-flux-csv')).bytes).header).toEqual(['k_edge', 'Pi_E', 'Pi_Z']);
    expect(parseCsv((await download(page, 'export-conversion-csv')).bytes).header).toEqual(['time', 'conversion_C']);
  });

  it('Budget: PNG and the budget history as CSV', async () => {
    const { page } = app;
    await openView(page, 'budget');
    await page.getByTestId('chart-energy').waitFor();
    await viewPng(page, 'budget');
    const csv = parseCsv((await download(page, 'export-budget-csv')).bytes);
    expect(csv.header).toContain('energy_injection');
    expect(csv.rows.length).toBeGreaterThan(10);
  });

  it('Scale ladder: PNG (the drawing rasterised) and the wavenumbers as CSV', async () => {
    const { page } = app;
    await openView(page, 'scales');
    await page.getByTestId('scale-ladder').waitFor();
    await viewPng(page, 'ladder');
    const csv = parseCsv((await download(page, 'export-ladder-csv')).bytes);
    expect(csv.header).toEqual(['row', 'scale', 'symbol', 'k', 'length_2pi_over_k', 'what']);
    expect(csv.rows.some((r) => r[1] === 'rhines')).toBe(true);
  });

  it('Field: the fields on the grid as NetCDF beside its PNG', async () => {
    const { page } = app;
    await openView(page, 'field');
    const nc = readNetcdf((await download(page, 'export-field-nc')).bytes);
    expect(nc.variable('u').shape).toEqual([1, 128, 128]);
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
