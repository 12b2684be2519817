import { readFile } from 'node:fs/promises';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../lib/io/csv';
import { readNetcdf } from '../lib/io/netcdfRead';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, screenshot, waitForTime, type AppPage } from './support/app';

/** Click an export button; the downloaded file's name and bytes. */
async function download(page: Page, testid: string): Promise<{ name: string; path: string; bytes: Buffer }> {
  const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).click()]);
  const path = await d.path();
  return { name: d.suggestedFilename(), path, bytes: await readFile(path) };
}

describe('Data exports in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
    await waitForTime(app.page, 6);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('the current state as a NetCDF snapshot file, read back in the page and here', async () => {
    const { page } = app;
    const f = await download(page, 'export-snapshot');
    expect(f.name).toMatch(/^stria-snapshot-t\d+\.\d\d\.nc$/);
    // NetCDF-3 64-bit offset: "CDF" and version byte 2.
    expect(Array.from(f.bytes.subarray(0, 4))).toEqual([0x43, 0x44, 0x46, 0x02]);
    await expect(page.getByTestId('export-message').innerText()).resolves.toMatch(
      /read back: NetCDF-3 64-bit offset, \d+ variables \(.*\bu\b.*\), 1 record/,
    );
    const nc = readNetcdf(f.bytes);
    expect(nc.variable('q').shape).toEqual([1, 128, 128]);
    expect(nc.attributes.Conventions).toBe('CF-1.8');
    const u = nc.readRecord('u', 0);
    expect(Array.from(u).some((x) => x !== 0)).toBe(true);
  });

  it('the zonal-mean samples as a NetCDF time series and as CSV', async () => {
    const { page } = app;
    const nc = await download(page, 'export-zonal-netcdf');
    expect(nc.name).toMatch(/^stria-zonal-t\d+\.\d\d\.nc$/);
    expect(Array.from(nc.bytes.subarray(0, 4))).toEqual([0x43, 0x44, 0x46, 0x02]);
    await expect(page.getByTestId('export-message').innerText()).resolves.toMatch(/read back: .* records/);
    const file = readNetcdf(nc.bytes);
    expect(file.numRecords).toBeGreaterThan(5);
    expect(file.variable('ubar').shape).toEqual([file.numRecords, 128]);
    const times = Array.from(file.readVariable('time'));
    // Equal intervals in model time (to within one step, dt ≤ 0.02).
    const gaps = times.slice(1).map((t, i) => t - times[i]);
    for (const g of gaps) expect(Math.abs(g - gaps[0])).toBeLessThan(0.02);
    const csv = await download(page, 'export-zonal-csv');
    expect(csv.name).toMatch(/\.csv$/);
    const table = parseCsv(csv.bytes);
    expect(table.header).toEqual(['time', 'step', 'y', 'ubar', 'qbar', 'upvp', 'vpqp', 'eke']);
    expect(table.rows.length % 128).toBe(0);
    await expect(page.getByTestId('export-message').innerText()).resolves.toMatch(/read back: 8 columns/);
  });

  it("a NetCDF file opened in the Compare view goes through Stria's diagnostics beside the predictions", async () => {
    const { page } = app;
    const nc = await download(page, 'export-snapshot');
    await openView(page, 'compare');
    await page
      .getByTestId('user-file')
      .setInputFiles({ name: nc.name, mimeType: 'application/x-netcdf', buffer: nc.bytes });
    await page.getByTestId('user-result').waitFor({ timeout: 60_000 });
    await expect(page.getByTestId('user-result').innerText()).resolves.toMatch(/netcdf3-64bit-offset/);
    // The file carries its run's parameters, so the planner's predictions sit beside the measurements.
    const table = await page.getByTestId('user-comparison').innerText();
    expect(table).toMatch(/rms velocity U/);
    // Subscripts are set as such (MathText), so the text reads kR and never the raw k_R.
    expect(table).toMatch(/Rhines wavenumber kR/);
    expect(table).not.toMatch(/k_R/);
    await screenshot(page, 'user-file.png');
    // What is not NetCDF is refused with the reason, as text.
    await page
      .getByTestId('user-file')
      .setInputFiles({ name: 'notes.nc', mimeType: 'text/plain', buffer: Buffer.from('<b>not netcdf</b>') });
    await expect(page.getByTestId('user-error').innerText()).resolves.toMatch(/not a NetCDF file/);
    expect(await page.getByTestId('user-error').evaluate((e) => e.querySelector('b'))).toBeNull();
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
