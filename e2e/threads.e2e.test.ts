import type { AddressInfo } from 'node:net';
import { resolve } from 'node:path';
import type { Page } from 'playwright-core';
import { preview } from 'vite';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stateChecksum } from '../lib/io/digest';
import { Model } from '../lib/model/model';
import { validateParams } from '../lib/model/validateParams';
import { DEFAULT_SCENARIO_ID, scenarioById } from '../lib/plan/demoScenarios';
import { encodeRunLink } from '../src/share/runLink';
import { ISOLATION_HEADERS } from '../scripts/isolationHeaders';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, readText, resetAndStep } from './support/app';

// The page is cross-origin isolated under the preview server (vite.config.ts sends the two headers),
// so its simulation worker may share memory with helper workers; the state after the same steps is the
// same bits on one thread and on two (docs/threads.md), and the same as a Model stepped here in Node.

const STEPS = 20;
const params = validateParams({ ...scenarioById(DEFAULT_SCENARIO_ID)!.params });

async function useThreads(page: Page, n: number): Promise<void> {
  await page.getByTestId('threads-input').fill(String(n));
  await page.getByTestId('threads-input').dispatchEvent('change');
  await expect.poll(() => readText(page, 'threads'), { timeout: 20_000 }).toBe(String(n));
}

describe('Threads in the browser', () => {
  let session: BrowserSession;

  beforeAll(async () => {
    session = await launchChromium({ width: 1200, height: 900 });
  });

  afterAll(async () => {
    await session?.close();
  });

  it('is served cross-origin isolated, and 2 threads give the state of 1 thread and of Node', async () => {
    const app = await openApp(session, encodeRunLink(params));
    const page = app.page;
    const response = await page.request.get(page.url());
    for (const [name, value] of Object.entries(ISOLATION_HEADERS))
      expect(response.headers()[name.toLowerCase()]).toBe(value);
    expect(await page.evaluate(() => globalThis.crossOriginIsolated)).toBe(true);

    await useThreads(page, 1);
    await resetAndStep(page, STEPS);
    const one = await readText(page, 'checksum');

    await useThreads(page, 2);
    await resetAndStep(page, STEPS);
    expect(await readText(page, 'threads')).toBe('2');
    expect(await page.getByTestId('threads-note').count()).toBe(0);
    const two = await readText(page, 'checksum');

    const model = new Model(params);
    model.step(STEPS);
    expect(two).toBe(one);
    expect(one).toBe(stateChecksum(model.qHat));
    expect(app.problems).toEqual([]);
    await page.close();
  });

  // A static host that does not send the two headers: no shared memory, so one thread, said in the readouts.
  it('runs on one thread and says why when the host does not isolate the page', async () => {
    const server = await preview({
      root: resolve(import.meta.dirname, '..'),
      configFile: false,
      logLevel: 'warn',
      build: { outDir: 'dist' },
      preview: { host: '127.0.0.1', port: 0, strictPort: true, open: false },
    });
    try {
      const { port } = server.httpServer.address() as AddressInfo;
      const page = await session.context.newPage();
      await page.goto(`http://127.0.0.1:${port}/#${encodeRunLink(params)}`);
      await page.getByTestId('model-steps').waitFor();
      expect(await page.evaluate(() => globalThis.crossOriginIsolated)).toBe(false);
      await page.getByTestId('threads-input').fill('2');
      await page.getByTestId('threads-input').dispatchEvent('change');
      await expect.poll(() => readText(page, 'threads-note')).toMatch(/not cross-origin isolated/);
      expect(await readText(page, 'threads')).toMatch(/^1/);
      await page.close();
    } finally {
      await server.close();
    }
  });
});
