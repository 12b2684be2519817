import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, readText, screenshot, status, steps, waitForSteps, type AppPage } from './support/app';

/** Choose a grid size and wait until the run has moved to it. */
async function selectGrid(page: Page, axis: 'nx' | 'ny', n: number): Promise<void> {
  await page.locator(`#param-${axis}`).selectOption(String(n));
  await expect
    .poll(async () => {
      const m = /New grid (\d+) × (\d+)/.exec(await readText(page, 'param-notice'));
      return m ? Number(m[axis === 'nx' ? 1 : 2]) : null;
    })
    .toBe(n);
}

describe('Parameter controls in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1300, height: 1000 });
    app = await openApp(session);
  });

  afterAll(async () => {
    await session?.close();
  });

  it('names every parameter without raw sub- or superscript notation (k_d, μ_ls, 1/L_d set as subscripts)', async () => {
    const panel = app.page.locator('section.params');
    expect(await panel.innerText()).not.toMatch(/[\p{L}\d)]_[\p{L}{]|\^\{/u);
    expect(await panel.locator('.symbol sub').count()).toBeGreaterThan(3);
  });

  it('refuses an out-of-range entry at the field with the reason, and the run goes on unchanged', async () => {
    const { page } = app;
    await waitForSteps(page, 20);
    const mu = page.locator('#param-mu');
    await mu.fill('-1');
    await mu.press('Enter');
    const error = page.getByTestId('error-mu');
    await expect(error.innerText()).resolves.toMatch(/linear drag μ.*≥ 0/);
    await expect(error.innerText()).resolves.toMatch(/the run goes on with μ = 0\.02/);
    await expect(mu.getAttribute('aria-invalid')).resolves.toBe('true');
    const n = await steps(page);
    await waitForSteps(page, n + 20);
    expect(await status(page)).toBe('playing');
    await screenshot(page, 'invalid-input.png');
    // Esc takes the entry back to the value in force.
    await mu.press('Escape');
    await expect(mu.inputValue()).resolves.toBe('0.02');
    await expect.poll(() => error.count()).toBe(0);
  });

  it('refuses text that is not a number, and a grid too coarse for the forcing, naming the reason', async () => {
    const { page } = app;
    const beta = page.locator('#param-beta');
    await beta.fill('strong');
    await beta.press('Enter');
    await expect(page.getByTestId('error-beta').innerText()).resolves.toMatch(/“strong” is not a number/);
    await beta.press('Escape');
    await page.locator('#param-nx').selectOption('32');
    await expect(page.getByTestId('error-nx').innerText()).resolves.toMatch(/kf: forcing annulus .* dealiased range/);
    const n = await steps(page);
    await waitForSteps(page, n + 20);
    await page.locator('#param-nx').selectOption('128');
    await expect.poll(() => page.getByTestId('error-nx').count()).toBe(0);
  });

  it('changes β mid-run without a restart, and the link follows; the diagnostics keep their history and mark the change', async () => {
    const { page } = app;
    await openView(page, 'hovmoller');
    await page.getByTestId('hovmoller-caption').waitFor();
    await waitForSteps(page, (await steps(page)) + 200);
    const columnsBefore = Number(await page.getByTestId('hovmoller-caption').getAttribute('data-columns'));
    expect(columnsBefore).toBeGreaterThan(2);
    const before = await steps(page);
    const beta = page.locator('#param-beta');
    await beta.fill('30');
    await beta.press('Enter');
    await expect.poll(() => page.evaluate(() => location.hash)).toMatch(/beta=30/);
    await expect(beta.inputValue()).resolves.toBe('30');
    await expect(page.getByTestId('error-beta').count()).resolves.toBe(0);
    // The step count goes on from where it was: the state was kept.
    expect(await steps(page)).toBeGreaterThanOrEqual(before);
    await expect(page.getByTestId('scenario').inputValue()).resolves.toBe('');
    await expect(readText(page, 'scenario-description')).resolves.toMatch(/changed from a scenario/);
    await expect(readText(page, 'param-notice')).resolves.toMatch(/beta changed at t = [\d.]+: the diagnostics go on/);
    // The Hovmöller record goes on from where it was (no restart) and marks the change on its time axis.
    await expect
      .poll(async () => Number(await page.getByTestId('hovmoller-caption').getAttribute('data-columns')))
      .toBeGreaterThan(columnsBefore);
    await expect(page.getByTestId('hovmoller-caption').getAttribute('data-changes')).resolves.toBe('1');
    // The time means span the change until asked to restart.
    await expect(readText(page, 'means-span-change')).resolves.toMatch(/span the change of beta at t = /);
    await page.getByTestId('restart-means').click();
    await expect.poll(() => page.getByTestId('means-span-change').count()).toBe(0);
    await screenshot(page, 'change-marked.png');
    await openView(page, 'field');
  });

  it('rescales ν when the grid changes, unless ν was set by hand, and says so beside ν', async () => {
    const { page } = app;
    const nu = page.locator('#param-nu');
    const nu0 = Number(await nu.inputValue());
    await selectGrid(page, 'ny', 256);
    await selectGrid(page, 'nx', 256);
    // On 256² the kept radius doubles (42 → 85): ν falls by about (42/85)^16 at order 8 [derived: gridHyperviscosity.ts].
    await expect.poll(async () => Number(await nu.inputValue())).toBeLessThan(nu0 * 1e-4);
    await expect(readText(page, 'note-nu')).resolves.toMatch(/ν follows the grid/);
    await expect(readText(page, 'param-notice')).resolves.toMatch(/start again there\. ν follows the grid/);
    // Set by hand, it stays at the next change of grid.
    await nu.fill('1e-30');
    await nu.press('Enter');
    await expect.poll(() => page.evaluate(() => location.hash)).toMatch(/nu=1e-30/);
    await selectGrid(page, 'ny', 128);
    await expect(readText(page, 'note-nu')).resolves.toMatch(/as you set it by hand/);
    expect(await nu.inputValue()).toBe('1e-30');
    await selectGrid(page, 'nx', 128);
  });

  it('moves the run to a finer grid, carrying the state over', async () => {
    const { page } = app;
    const before = await steps(page);
    await page.locator('#param-nx').selectOption('256');
    await expect
      .poll(() => readText(page, 'param-notice'))
      .toMatch(/New grid 256 × 128 at t = [\d.]+: the run goes on/);
    expect(await steps(page)).toBeGreaterThanOrEqual(before);
    await waitForSteps(page, before + 10);
    await expect(page.locator('[data-testid=field-canvas]').getAttribute('aria-label')).resolves.toMatch(
      /zonal velocity/,
    );
  });

  it('starts another scenario from its picker', async () => {
    const { page } = app;
    await page.getByTestId('scenario').selectOption('few-jets');
    await expect.poll(() => page.locator('#param-beta').inputValue()).toBe('18');
    await expect(readText(page, 'scenario-description')).resolves.toMatch(/fewer, broader/);
    await expect.poll(() => page.evaluate(() => location.hash)).toMatch(/beta=18/);
    const n = await steps(page);
    await waitForSteps(page, n + 10);
    expect(await status(page)).toBe('playing');
  });

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
