import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { scenarioParams } from '../src/openingRun';
import { encodeRunLink } from '../src/share/runLink';
import { launchChromium, type BrowserSession } from './support/browser';
import { modelTime, pause, readText, screenshot, status, steps, waitForSteps } from './support/app';

// The default scenario with its adaptive step replaced by a fixed dt = 0.03: it holds while the flow
// spins up and fails at step 204 (t = 6.12, CFL 1.51, probed in Node); halved it runs on (3000 steps
// checked in Node). The worker keeps a checkpoint at every 200th step, so the restart is from step 200.
const BLOWS_UP = encodeRunLink({ ...scenarioParams('jets'), cfl: 0, dt: 0.03 });

const checksum = (page: Page) => readText(page, 'checksum');
const attr = async (page: Page, testid: string, name: string) =>
  Number(await page.getByTestId(testid).getAttribute(name));

/** Open the built app at `?search#hash` with its test hooks, collecting the page's problems. */
async function openAt(session: BrowserSession, hash: string, problems: string[], search = 'test-hooks'): Promise<Page> {
  const page = await session.context.newPage();
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error' || m.type() === 'warning') problems.push(`console ${m.type()}: ${m.text()}`);
  });
  page.on('requestfailed', (r) => problems.push(`request failed: ${r.url()}`));
  await page.goto(`${inject('baseUrl')}?${search}${hash ? `#${hash}` : ''}`);
  return page;
}

describe('A run that survives blow-ups, a dead worker and a reload', () => {
  let session: BrowserSession;
  const problems: string[] = [];

  beforeAll(async () => {
    session = await launchChromium({ width: 1300, height: 1000 });
  });

  afterAll(async () => {
    await session?.close();
  });

  it('on a blow-up shows the report and restarts from the last checkpoint with dt halved, on without NaN', async () => {
    const page = await openAt(session, BLOWS_UP, problems);
    const offer = page.getByTestId('blowup');
    await offer.waitFor({ timeout: 60_000 });
    expect(await status(page)).toBe('stopped');
    expect(await readText(page, 'stopped')).toMatch(
      /blew up at t = 6\.12000, step 204: CFL number above 1\.5 \(dt = 0\.03000, CFL = 1\.51/,
    );
    const button = page.getByTestId('restart-halved');
    await expect(button.innerText()).resolves.toBe('Restart from t = 6.000 with dt halved');
    expect(await attr(page, 'restart-halved', 'data-dt')).toBe(0.015);
    await screenshot(page, 'blowup-offer.png');

    await button.click();
    await expect.poll(() => status(page)).toBe('playing');
    expect(await offer.count()).toBe(0);
    // It went back to step 200 and goes well past where it blew up, at the halved step.
    await waitForSteps(page, 204 + 400);
    expect(await readText(page, 'model-dt')).toBe('0.0150');
    const t = await modelTime(page);
    expect(t).toBeGreaterThan(6.12);
    for (const id of ['model-energy', 'model-cfl'])
      expect(Number.isFinite(Number(await readText(page, id)))).toBe(true);
    expect(Number.isFinite(Number(await page.getByTestId('model-urms').getAttribute('data-value')))).toBe(true);
    expect(await page.locator('#param-dt').inputValue()).toBe('0.015');
    await page.close();
  });

  it('when the worker dies, resumes the run in a new one from the state last kept, and says so', async () => {
    const page = await openAt(session, '', problems);
    await expect.poll(() => status(page)).toBe('playing');
    // Past the first timed save (15 s of play), so the page has kept more than its start.
    await page.waitForFunction(
      () => document.querySelector('[data-testid=autosave-status]')?.getAttribute('data-reason') === 'timer',
      null,
      { timeout: 60_000 },
    );
    const before = await steps(page);
    const tKill = await modelTime(page);
    await page.evaluate(() => window.striaTest?.killWorker());
    const notice = page.getByTestId('worker-notice');
    await notice.waitFor({ timeout: 30_000 });
    const keptTime = await attr(page, 'worker-notice', 'data-time');
    const keptSteps = await attr(page, 'worker-notice', 'data-steps');
    expect(await notice.innerText()).toMatch(
      /The simulation worker stopped \(it stopped answering\)\. The run was resumed from t = \d+\.\d{3} \(step \d+\)/,
    );
    // A state kept after the start and before the kill (the page keeps one every 10 s).
    expect(keptTime).toBeGreaterThan(0);
    expect(keptTime).toBeLessThanOrEqual(tKill);
    expect(keptSteps).toBeLessThanOrEqual(before);
    await screenshot(page, 'worker-notice.png');
    // And it plays on from there in the new worker.
    await waitForSteps(page, keptSteps + 50);
    expect(await status(page)).toBe('playing');
    expect(await modelTime(page)).toBeGreaterThan(keptTime);
    expect(await page.getByTestId('error').count()).toBe(0);

    // Paused, the run is saved at once; a reload offers exactly that state back and starts nothing meanwhile.
    await pause(page);
    const savedSteps = await steps(page);
    const savedSum = await checksum(page);
    await page.waitForFunction(
      (n) => Number(document.querySelector('[data-testid=autosave-status]')?.getAttribute('data-steps')) === n,
      savedSteps,
      { timeout: 10_000 },
    );
    await page.reload();
    const offer = page.getByTestId('resume-offer');
    await offer.waitFor();
    expect(await attr(page, 'resume-offer', 'data-steps')).toBe(savedSteps);
    await expect(page.getByTestId('resume-saved').innerText()).resolves.toMatch(
      /^Resume the run saved at t = \d+\.\d{3} \(.+\)$/,
    );
    await expect(page.getByTestId('start-fresh').innerText()).resolves.toBe('Start the default scenario');
    expect(await page.getByTestId('model-steps').count()).toBe(0);
    await screenshot(page, 'resume-offer.png');

    await page.getByTestId('resume-saved').click();
    await expect.poll(() => steps(page)).toBe(savedSteps);
    expect(await status(page)).toBe('paused');
    expect(await checksum(page)).toBe(savedSum);
    await page.getByTestId('play-pause').click();
    await waitForSteps(page, savedSteps + 20);

    // A link from outside wins over the offer: a full navigation to one starts it.
    await page.goto(`${inject('baseUrl')}?test-hooks&from=outside#${BLOWS_UP}`);
    await page.getByTestId('model-steps').waitFor();
    expect(await page.getByTestId('resume-offer').count()).toBe(0);
    await expect(page.locator('#param-dt').inputValue()).resolves.toBe('0.03');
    await page.close();
  });

  it('ran without page errors or console warnings', () => {
    expect(problems).toEqual([]);
  });
});
