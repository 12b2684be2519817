import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expandSweep } from '../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../lib/sweep/sweepSpec';
import { runSweepJob } from '../lib/sweep/runSweepJob';
import { sealRecord } from '../lib/sweep/sweepRecord';
import { tableRows } from '../lib/sweep/sweepTable';
import { ncgen, runNcgen } from '../test/io/ncgenTool';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, type AppPage } from './support/app';

/**
 * User data that repeats itself, which a keyed list of the page once refused (Svelte's
 * each_key_duplicate: no result, no message): a netCDF-4 file with the same compound attribute on
 * two variables (the reader's note about it comes twice), and a sweep journal holding the same runs
 * twice (two sweeps into one directory, before sweeps took a lock).
 */
function compoundAttributeFile(): Uint8Array {
  const n = 32;
  const grid = (f: (i: number, j: number) => number) =>
    Array.from({ length: n * n }, (_, k) => f(k % n, Math.floor(k / n)).toPrecision(6)).join(', ');
  const axis = Array.from({ length: n }, (_, i) => i * 1000).join(', ');
  return ncgen(
    `netcdf repeated {
types:
  compound pair { int a ; double b ; } ;
dimensions:
  time = 1 ; y = ${n} ; x = ${n} ;
variables:
  double y(y) ; y:units = "m" ; y:axis = "Y" ;
  double x(x) ; x:units = "m" ; x:axis = "X" ;
  double u(time, y, x) ; u:units = "m s-1" ; pair u:meta = {1, 2.5} ;
  double v(time, y, x) ; v:units = "m s-1" ; pair v:meta = {1, 2.5} ;
data:
  y = ${axis} ;
  x = ${axis} ;
  u = ${grid((i, j) => Math.cos((6 * Math.PI * j) / n) + 0.1 * Math.sin((2 * Math.PI * i) / n))} ;
  v = ${grid((i) => 0.1 * Math.cos((2 * Math.PI * i) / n))} ;
}
`,
    'nc4',
  );
}

describe('Repeated user data in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it.runIf(runNcgen)('analyses a netCDF-4 file whose two variables carry the same compound attribute', async () => {
    const { page } = app;
    await openView(page, 'compare');
    await page.getByTestId('user-file').setInputFiles({
      name: 'repeated.nc',
      mimeType: 'application/x-netcdf',
      buffer: Buffer.from(compoundAttributeFile()),
    });
    await page.getByTestId('user-result').waitFor({ timeout: 60_000 });
    await expect(page.getByTestId('user-result').innerText()).resolves.toMatch(/"meta" of "u"/);
    expect(app.problems).toEqual([]);
  });

  it('shows a journal that holds the same runs twice, each run once', async () => {
    const { page } = app;
    await openView(page, 'sweep');
    const spec = parseSweepSpec({
      base: { nx: 32, ny: 32, kf: 6, dkf: 1, beta: 10 },
      vary: [{ param: 'beta', values: [5, 20] }],
      length: { until: 2 },
      sampleEvery: 0.25,
    });
    const runs = expandSweep(spec).map((j) => runSweepJob(j, { seconds: () => 1, iso: () => '2026-01-01T00:00:00Z' }));
    const again = runs.map((r) => sealRecord({ ...r, wall_seconds: 2, finished_at: '2026-01-01T00:01:00Z' }));
    const jsonl = [...runs, ...again].map((r) => JSON.stringify(r)).join('\n') + '\n';
    await page
      .getByTestId('sweep-load')
      .setInputFiles({ name: 'runs.jsonl', mimeType: 'application/jsonl', buffer: Buffer.from(jsonl) });
    await expect.poll(() => page.getByTestId('sweep-table').locator('tbody tr').count()).toBe(2);
    // A table holds rows as they are, repeated ids included: each is shown.
    const table = JSON.stringify([...tableRows(runs), ...tableRows(runs)]);
    await page
      .getByTestId('sweep-load')
      .setInputFiles({ name: 'table.json', mimeType: 'application/json', buffer: Buffer.from(table) });
    await expect.poll(() => page.getByTestId('sweep-table').locator('tbody tr').count()).toBe(4);
    expect(app.problems).toEqual([]);
  });
});
