import { readdir, readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Page, Request } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { CONTENT_POLICY } from '../scripts/contentPolicy';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, pause, waitForTime, type AppPage } from './support/app';

// The built app under its Content Security Policy (scripts/contentPolicy.ts, CSP Level 3): no
// violation while every view is used, no request off the page's origin (the workers' included),
// and the policy tag as built.

/** An address nothing listens on, off the app's origin (127.0.0.0/8 is all loopback on Linux). */
const OFF_ORIGIN = 'http://127.0.0.2:9/stria-probe';

interface Violation {
  directive: string;
  blocked: string;
  source: string;
}

/** Collect `securitypolicyviolation` events from the first script on (CSP3: fired at the document). */
function listenForViolations(): void {
  const w = window as unknown as { __violations: Violation[] };
  w.__violations = [];
  document.addEventListener('securitypolicyviolation', (e) => {
    w.__violations.push({
      directive: e.effectiveDirective,
      blocked: e.blockedURI,
      source: `${e.sourceFile}:${e.lineNumber}`,
    });
  });
}

const violations = (page: Page): Promise<Violation[]> =>
  page.evaluate(() => (window as unknown as { __violations: Violation[] }).__violations);

/** Same origin as the app, or an in-page URL (data:, blob:) that fetches nothing. */
function isOwn(url: string, origin: string): boolean {
  if (url.startsWith('data:') || url.startsWith('blob:')) return true;
  return new URL(url).origin === origin;
}

describe('Security of the built app in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;
  const origin = new URL(inject('baseUrl')).origin;
  const requests: string[] = [];
  const cspMessages: string[] = [];
  const record = (r: Request) => requests.push(r.url());

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    await session.context.addInitScript(listenForViolations);
    // Every request of every page and worker of the context, from the start.
    session.context.on('request', record);
    session.context.on('page', (p) =>
      p.on('console', (m) => /Content Security Policy/i.test(m.text()) && cspMessages.push(m.text())),
    );
  });

  afterAll(async () => {
    await session?.close();
  });

  it('the checks can fail: an off-origin fetch is refused in the page and recorded from a worker', async () => {
    const probe = await openApp(session);
    const refused = await probe.page.evaluate(
      (url) =>
        fetch(url).then(
          () => 'fetched',
          () => 'refused',
        ),
      OFF_ORIGIN,
    );
    expect(refused).toBe('refused');
    await expect
      .poll(() => violations(probe.page))
      .toContainEqual(expect.objectContaining({ directive: 'connect-src', blocked: OFF_ORIGIN }));
    expect(cspMessages.some((m) => m.includes('connect-src'))).toBe(true);
    // And so is a style attribute written as markup (what 'unsafe-inline' would allow).
    await probe.page.evaluate(() => document.body.setAttribute('style', 'outline: 1px solid red'));
    await expect
      .poll(() => violations(probe.page))
      .toContainEqual(expect.objectContaining({ directive: 'style-src-attr' }));
    // A worker is not under the page's meta policy: its request goes out, and the recorder must see it.
    const worker = probe.page.workers().find((w) => w.url().includes('simulation.worker'));
    expect(worker, 'the simulation worker').toBeDefined();
    await worker!.evaluate((url) => fetch(url).catch(() => null), OFF_ORIGIN);
    await expect.poll(() => requests.includes(OFF_ORIGIN)).toBe(true);
    await probe.page.close();
    // Start the real check with clean records.
    requests.length = 0;
    cspMessages.length = 0;
  });

  it('uses every view with no policy violation', async () => {
    app = await openApp(session);
    const { page } = app;
    await waitForTime(page, 3);
    const tabs = await page
      .getByRole('tab')
      .evaluateAll((els) => els.map((e) => e.getAttribute('data-testid')?.replace(/^tab-/, '') ?? ''));
    expect(tabs).toHaveLength(11);
    for (const id of tabs) {
      await openView(page, id);
      // Let each view draw from a few snapshots while the run plays.
      await page.waitForTimeout(600);
    }
    // Compare: two runs in workers of their own.
    await openView(page, 'compare');
    await page.getByTestId('compare-start').click();
    await expect
      .poll(async () => Number(await page.getByTestId('compare-pane-a').getAttribute('data-steps')), {
        timeout: 30_000,
      })
      .toBeGreaterThan(20);
    await page.getByTestId('compare-stop').click();
    // A file through the exports and back in through the user-data worker.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-snapshot').click()]);
    await page.getByTestId('user-file').setInputFiles(await download.path());
    await page.getByTestId('user-result').waitFor({ timeout: 60_000 });
    // Plan and Sweep once more, now with the run paused.
    await pause(page);
    await openView(page, 'plan');
    await page.getByTestId('plan-view').waitFor();
    await openView(page, 'sweep');
    await page.getByTestId('sweep-view').waitFor();
    expect(await violations(page)).toEqual([]);
    expect(cspMessages).toEqual([]);
    expect(app.problems).toEqual([]);
  }, 120_000);

  it('made no request off its origin, the workers included', () => {
    // The recorder saw the page, its chunks and every worker script.
    expect(requests.some((u) => u.includes('simulation.worker'))).toBe(true);
    expect(requests.some((u) => u.includes('userData.worker'))).toBe(true);
    expect(requests.filter((u) => !isOwn(u, origin))).toEqual([]);
  });

  it('carries the policy in a meta tag ahead of every script and style', async () => {
    const { page } = app;
    const meta = await page.evaluate(() => {
      const tag = document.head.querySelector('meta[http-equiv="Content-Security-Policy"]');
      const all = [...document.head.children];
      const firstLoad = all.findIndex((e) => e.matches('script, link[rel=stylesheet], link[rel=modulepreload], style'));
      return tag ? { content: tag.getAttribute('content') ?? '', index: all.indexOf(tag), firstLoad } : null;
    });
    expect(meta).not.toBeNull();
    expect(meta!.index).toBeLessThan(meta!.firstLoad);
    const directives = Object.fromEntries(
      meta!.content
        .split(';')
        .map((d) => d.trim().split(/\s+/))
        .map(([name, ...sources]) => [name, sources]),
    );
    expect(directives).toEqual(CONTENT_POLICY);
    // Stated here as well, not only as the constant: what the policy must never allow.
    expect(directives['script-src']).toEqual(["'self'"]);
    expect(directives['object-src']).toEqual(["'none'"]);
    expect(directives['base-uri']).toEqual(["'none'"]);
    expect(meta!.content).not.toMatch(/unsafe-inline|unsafe-eval|wasm-unsafe-eval|\*|https?:/);
  });

  it('ships no eval or new Function in any script, the workers included (they are not under the meta policy)', async () => {
    const dir = resolve(import.meta.dirname, '../dist/assets');
    const scripts = (await readdir(dir)).filter((f) => f.endsWith('.js'));
    expect(scripts.some((f) => f.startsWith('simulation.worker'))).toBe(true);
    const found: string[] = [];
    for (const f of scripts) {
      const text = await readFile(resolve(dir, f), 'utf8');
      for (const m of text.matchAll(/\beval\s*\(|\bnew\s+Function\b|(?<![.\w$])Function\s*\(/g))
        found.push(`${f}: ${text.slice(m.index, m.index + 40)}`);
    }
    expect(found).toEqual([]);
  });
});
