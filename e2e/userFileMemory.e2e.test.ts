import type { CDPSession } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ncgen, runNcgen } from '../test/io/ncgenTool';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, readText, type AppPage } from './support/app';

/**
 * A netCDF-4 file of a few hundred kB whose dimensions are 16384 × 16384 but whose chunks were never
 * written: the Compare view once allocated the whole grid for it (4.7–6.3 GB, "Array buffer
 * allocation failed"). Now the estimate from its dimensions is refused against the page's memory
 * budget before anything is allocated, with the subsample that fits, and a subsample is analysed.
 */
const N = 16384;
function hugeSparseFile(): Buffer {
  const axis = Array.from({ length: N }, (_, i) => i * 1000).join(', ');
  return Buffer.from(
    ncgen(
      `netcdf huge {
dimensions:
  time = 1 ; y = ${N} ; x = ${N} ;
variables:
  double time(time) ; time:units = "s" ;
  double y(y) ; y:units = "m" ;
  double x(x) ; x:units = "m" ;
  float u(time, y, x) ; u:units = "m s-1" ; u:_ChunkSizes = 1, 512, 512 ;
  float v(time, y, x) ; v:units = "m s-1" ; v:_ChunkSizes = 1, 512, 512 ;
data:
  time = 0 ;
  y = ${axis} ;
  x = ${axis} ;
}
`,
      'nc4',
    ),
  );
}

describe.runIf(runNcgen)("A user's file too large for the page's memory, in Chromium", () => {
  let session: BrowserSession;
  let app: AppPage;
  let cdp: CDPSession;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
    cdp = await session.context.newCDPSession(app.page);
    await cdp.send('Performance.enable');
  });

  afterAll(async () => {
    await session?.close();
  });

  it('is refused with the estimate and the subsample that fits, then read as that subsample', async () => {
    const { page } = app;
    await openView(page, 'compare');
    const file = { name: 'huge.nc', mimeType: 'application/x-netcdf', buffer: hugeSparseFile() };
    await page.getByTestId('user-file').setInputFiles(file);
    await page.getByTestId('user-error').waitFor({ timeout: 60_000 });
    await expect(readText(page, 'user-error')).resolves.toMatch(
      /^huge\.nc: "u" and "v" on 16384 × 16384 points need about [\d.]+ GiB \(.*\), more than the memory budget of [\d.]+ [GM]iB; every \d+(st|nd|rd|th) point \(\d+ × \d+\) would fit: set "every K-th point" to \d+ or more/,
    );
    const { metrics } = await cdp.send('Performance.getMetrics');
    expect(metrics.find((m) => m.name === 'JSHeapUsedSize')!.value).toBeLessThan(300 * 2 ** 20);
    await page.getByTestId('user-subsample').fill('64');
    await page.getByTestId('user-subsample').press('Enter');
    await page.getByTestId('user-result').waitFor({ timeout: 60_000 });
    await expect(page.getByTestId('user-result').innerText()).resolves.toMatch(/256 × 256 points/);
    expect(app.problems).toEqual([]);
  });
});
