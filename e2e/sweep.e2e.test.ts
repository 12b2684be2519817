import { readFile } from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseCsv } from '../lib/io/csv';
import { parseSweepRecord } from '../lib/sweep/sweepRecord';
import { expandSweep } from '../lib/sweep/sweepRuns';
import { parseSweepSpec } from '../lib/sweep/sweepSpec';
import { RHINES_EXAMPLE } from '../lib/sweep/rhinesExample';
import { runSweepJob } from '../lib/sweep/runSweepJob';
import { launchChromium, type BrowserSession } from './support/browser';
import { inkPixels, openApp, openView, screenshot, type AppPage } from './support/app';

// Two runs at 32², short: the tiny sweep of the tests.
const SPEC = {
  format: 'stria-sweep',
  version: 1,
  base: { nx: 32, ny: 32, kf: 6, dkf: 1, beta: 10 },
  vary: [{ param: 'beta', values: [5, 20] }],
  length: { until: 10 },
  sampleEvery: 0.25,
  fits: { resamples: 200 },
};

describe('Sweep view in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
    await openView(app.page, 'sweep');
  });

  afterAll(async () => {
    await session?.close();
  });

  it('opens with the sweep that recovers the Rhines scaling, on every core the browser offers', async () => {
    const { page } = app;
    // lib/sweep/rhinesExample.ts: five β from 10 to 160 at 128², to t = 250 (the README's sweep).
    const shown = JSON.parse(await page.getByTestId('sweep-spec').inputValue()) as Record<string, unknown>;
    expect({ ...shown, title: undefined }).toEqual({ ...RHINES_EXAMPLE, title: undefined });
    await expect(page.getByTestId('sweep-spec-check').innerText()).resolves.toMatch(
      /^5 runs: beta = 10; beta = 20; beta = 40; beta = 80; beta = 160$/,
    );
    const cores = await page.evaluate(() => navigator.hardwareConcurrency);
    expect(Number(await page.getByTestId('sweep-workers').getAttribute('data-count'))).toBe(cores);
  });

  it('checks the spec as the command line does, naming the bad field', async () => {
    const { page } = app;
    await page.getByTestId('sweep-spec').fill(JSON.stringify({ ...SPEC, vary: [{ param: 'betta', values: [1] }] }));
    await expect(page.getByTestId('sweep-spec-check').innerText()).resolves.toMatch(
      /vary\.0\.param: "betta" is not a parameter/,
    );
    await expect(page.getByTestId('sweep-run').isDisabled()).resolves.toBe(true);
  });

  it("runs a tiny sweep in a pool of workers with a progress bar, plots it, and its records are the command line's to round-off", async () => {
    const { page } = app;
    await page.getByTestId('sweep-spec').fill(JSON.stringify(SPEC, null, 2));
    await expect(page.getByTestId('sweep-spec-check').innerText()).resolves.toMatch(/^2 runs: beta = 5; beta = 20/);
    await page.getByTestId('sweep-run').click();
    await expect(page.getByTestId('sweep-progress').getAttribute('max')).resolves.toBe('2');
    await expect
      .poll(
        () =>
          page
            .getByTestId('sweep-message')
            .innerText()
            .catch(() => ''),
        { timeout: 120_000 },
      )
      .toMatch(/Finished 2 runs/);
    await expect(page.getByTestId('sweep-progress').getAttribute('value')).resolves.toBe('2');
    for (const id of ['chart-jet-spacing', 'chart-u-rms'])
      await expect.poll(() => inkPixels(page, `[data-testid=${id}] canvas`)).toBeGreaterThan(1000);
    await expect(page.getByTestId('sweep-table').locator('tbody tr').count()).resolves.toBe(2);
    // Two runs are too few for a scaling fit, and the page says so.
    await expect(page.getByTestId('chart-jet-spacing-fit').innerText()).resolves.toMatch(/need at least 3/);
    await screenshot(page, 'sweep.png');
    const [d] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Save runs.jsonl' }).click(),
    ]);
    const lines = (await readFile(await d.path(), 'utf8')).trim().split('\n').map(parseSweepRecord);
    const direct = expandSweep(parseSweepSpec(SPEC)).map((j) => runSweepJob(j, { seconds: () => 0, iso: () => '' }));
    // The same runs, ids, parameters, plans and outcomes; summary numbers agree to round-off. (Node's
    // and Chromium's engines differ in the last bit of some budget terms, e.g. hyper_loss, so bit
    // equality of the records holds within one engine, not across the two.)
    expect(lines.map((r) => r.id)).toEqual(direct.map((r) => r.id));
    for (const [i, r] of lines.entries()) {
      const d = direct[i];
      expect([r.params, r.plan, r.status, r.stopped, r.summary.steps, r.summary.jet_count]).toEqual([
        d.params,
        d.plan,
        d.status,
        d.stopped,
        d.summary.steps,
        d.summary.jet_count,
      ]);
      for (const [k, v] of Object.entries(d.summary)) {
        const got = (r.summary as unknown as Record<string, unknown>)[k];
        if (typeof v === 'number') expect(Math.abs((got as number) - v), k).toBeLessThanOrEqual(1e-12 * Math.abs(v));
        else expect(got, k).toEqual(v);
      }
    }
  }, 150_000);

  it("loads a command-line sweep's results and fits them", async () => {
    const { page } = app;
    const spec = parseSweepSpec({ ...SPEC, vary: [{ param: 'beta', values: [5, 10, 20] }], length: { until: 2 } });
    const jsonl =
      expandSweep(spec)
        .map((j) => JSON.stringify(runSweepJob(j, { seconds: () => 1, iso: () => '2026-01-01T00:00:00Z' })))
        .join('\n') + '\n';
    await page
      .getByTestId('sweep-load')
      .setInputFiles({ name: 'runs.jsonl', mimeType: 'application/jsonl', buffer: Buffer.from(jsonl) });
    await expect(page.getByTestId('sweep-table').locator('tbody tr').count()).resolves.toBe(3);
    // Each headline number with its standard error, and the detector's verdict beside the jet count.
    const head = await page.getByTestId('sweep-table').locator('thead').innerText();
    for (const c of ['jet_verdict', 'jet_spacing ± std. error', 'u_rms ± std. error', 'staircase_index ± std. error'])
      expect(head).toContain(c);
    await expect(page.getByTestId('sweep-table').locator('tbody tr').first().innerText()).resolves.toMatch(/\d ± \d/);
    await page.getByTestId('sweep-load').setInputFiles({
      name: 'runs.jsonl',
      mimeType: 'application/jsonl',
      buffer: Buffer.from('{"not":"a record"}\n'),
    });
    await expect(page.getByTestId('sweep-load-error').innerText()).resolves.toMatch(/line 1/);
  });

  it('exports the scaling charts as PNG and the table behind them as CSV', async () => {
    const { page } = app;
    const get = async (testid: string) => {
      const [d] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testid).click()]);
      return { name: d.suggestedFilename(), bytes: await readFile(await d.path()) };
    };
    const image = await get('export-view-png');
    expect(image.name).toBe('stria-sweep.png');
    expect(Array.from(image.bytes.subarray(1, 4))).toEqual([0x50, 0x4e, 0x47]);
    expect(image.bytes.readUInt32BE(20)).toBeGreaterThan(300);
    const csv = parseCsv((await get('export-sweep-csv')).bytes);
    expect(csv.header).toContain('jet_spacing');
    expect(csv.header).toContain('rhines_length');
    // The results shown: the three loaded runs (the refused file left them in place).
    expect(csv.rows.length).toBe(3);
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
