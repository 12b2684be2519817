import type { AddressInfo } from 'node:net';
import { resolve } from 'node:path';
import { build, preview } from 'vite';
import { DEFAULT_PARAMS } from '../lib/model/params';
import { encodeRunLink } from '../src/share/runLink';
import { launchChromium } from '../e2e/support/browser';

export interface DrawTiming {
  n: number;
  frames: number;
  median_ms: number;
  p95_ms: number;
  max_ms: number;
}

/**
 * The Field figure's draw time at n × n in Debian's Chromium: builds the app, serves it, opens the
 * default scenario at n² playing, and reads the figure's own draw times (colour lookup of every
 * point, putImageData, the scaled drawImage, axes and colour bar: src/components/FieldFigure.svelte)
 * through the test hooks, after the first few frames. The browser runs headless without a GPU, as in
 * the browser tests, so the canvas is rastered in software.
 */
export async function timeFieldDraw(n: number, frames = 60): Promise<DrawTiming> {
  const root = resolve(import.meta.dirname, '..');
  await build({ root, logLevel: 'warn' });
  const server = await preview({
    root,
    logLevel: 'warn',
    preview: { host: '127.0.0.1', port: 0, strictPort: true, open: false },
  });
  const session = await launchChromium({ width: 1300, height: 1000 });
  try {
    const { port } = server.httpServer.address() as AddressInfo;
    const page = await session.context.newPage();
    await page.goto(`http://127.0.0.1:${port}/?test-hooks#${encodeRunLink({ ...DEFAULT_PARAMS, nx: n, ny: n })}`);
    await page.getByTestId('model-steps').waitFor();
    if ((await page.getByTestId('status').textContent())?.trim() !== 'playing')
      await page.getByTestId('play-pause').click();
    const warm = 5;
    await page.waitForFunction((k) => (window.striaTest?.fieldDrawTimes().length ?? 0) >= k, warm + frames, {
      timeout: 600_000,
      polling: 500,
    });
    const times = (await page.evaluate(() => window.striaTest?.fieldDrawTimes() ?? []))
      .slice(warm)
      .sort((a, b) => a - b);
    const at = (q: number) => times[Math.min(times.length - 1, Math.floor(q * times.length))];
    return { n, frames: times.length, median_ms: at(0.5), p95_ms: at(0.95), max_ms: times[times.length - 1] };
  } finally {
    await session.close();
    await new Promise<void>((done) => server.httpServer.close(() => done()));
  }
}
