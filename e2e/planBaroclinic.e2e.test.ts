import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysePlan } from '../lib/plan/analysePlan';
import { fmt, withUnit } from '../lib/plan/format';
import { planPreset } from '../lib/plan/planPresets';
import { launchChromium, type BrowserSession } from './support/browser';
import { modelTime, openApp, openView, screenshot, type AppPage } from './support/app';

describe('Plan view: the baroclinic drive in Chromium', () => {
  let session: BrowserSession;
  let app: AppPage;

  beforeAll(async () => {
    session = await launchChromium({ width: 1400, height: 1000 });
    app = await openApp(session);
    await openView(app.page, 'plan');
  });

  afterAll(async () => {
    await session?.close();
  });

  it('the ocean-like two-layer preset shows the planner’s ξ, regime and fastest-growing wavelength', async () => {
    const { page } = app;
    const presets = await page
      .getByTestId('plan-preset')
      .locator('option')
      .evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value));
    expect(presets).toEqual(expect.arrayContaining(['earth-ocean-two-layer', 'earth-atmosphere-two-layer']));
    await page.getByTestId('plan-preset').selectOption('earth-ocean-two-layer');
    const b = analysePlan(planPreset('earth-ocean-two-layer').input).baroclinic!;
    const want = Object.fromEntries(b.predictions.map((p) => [p.id, p]));
    // Every prediction the planner returns, with its value (the engines may differ in the last bits of Math.pow).
    const shown = await page
      .locator('[data-testid^=baroclinic-]')
      .evaluateAll((els) =>
        els
          .filter((e) => e.hasAttribute('data-value'))
          .map((e) => [
            e.getAttribute('data-testid')!.slice('baroclinic-'.length),
            Number(e.getAttribute('data-value')),
          ]),
      );
    expect(shown.map(([id]) => id)).toEqual(b.predictions.map((p) => p.id));
    for (const [id, value] of shown)
      expect(Math.abs(Number(value) - want[id].value), String(id)).toBeLessThanOrEqual(
        8 * Number.EPSILON * Math.abs(want[id].value),
      );
    // ξ = 2.75 for this preset: supercritical (ξ ≥ 2) [published: Held & Larichev 1996's ξ; the bound 2 practice].
    const headline = await page.getByTestId('plan-headline').innerText();
    expect(headline).toContain(`supercritical (ξ = ${fmt(want.xi.value, 3)})`);
    expect(headline).toContain(
      `fastest-growing wavelength is ${withUnit(want.unstableWavelength.value, 'length', 'physical')}`,
    );
    await expect(page.getByTestId('baroclinic-caveat').innerText()).resolves.toMatch(/order-one prefactors/);
    // Labels and symbols are set, not written as raw notation.
    const labels = await page.getByTestId('baroclinic-predictions').locator('th, td.symbol').allInnerTexts();
    for (const l of labels) expect(l).not.toMatch(/[_^{}]/);
    await expect(page.getByTestId('plan-checks').innerText()).resolves.not.toMatch(/[_^]/);
    await expect(page.getByTestId('baroclinic-unstableWavelength').locator('td.symbol sub').innerText()).resolves.toBe(
      'bc',
    );
    // The drive's fields: the shear and the depth ratio, with the subscripts of U₁ − U₂ set.
    await expect(page.getByTestId('plan-drive-kind').inputValue()).resolves.toBe('baroclinic');
    await expect(page.locator('#plan-drive-shear').inputValue()).resolves.toMatch(/^0\.05/);
    await expect(page.locator('label[for=plan-drive-shear] sub').first().innerText()).resolves.toBe('1');
    await expect(page.locator('#plan-drive-depthRatio').inputValue()).resolves.toMatch(/^0\.25/);
    await screenshot(page, 'plan-baroclinic.png');
  });

  it('choosing the baroclinic drive on a barotropic plan gives it a deformation radius', async () => {
    const { page } = app;
    await page.getByTestId('plan-preset').selectOption('earth-atmosphere');
    await expect(page.getByTestId('plan-deformation-kind').inputValue()).resolves.toBe('none');
    await page.getByTestId('plan-drive-kind').selectOption('baroclinic');
    await expect(page.getByTestId('plan-deformation-kind').inputValue()).resolves.toBe('radius');
    await page.getByTestId('baroclinic-predictions').waitFor();
    await expect(page.getByTestId('plan-headline').innerText()).resolves.toMatch(/^Baroclinic/);
  });

  it('runs the matched two-layer run here', async () => {
    const { page } = app;
    await page.getByTestId('plan-preset').selectOption('earth-ocean-two-layer');
    const m = analysePlan(planPreset('earth-ocean-two-layer').input, { targetWallSeconds: 120 }).baroclinic!.matched!;
    await expect(page.getByTestId('baroclinic-matched').getAttribute('data-nx')).resolves.toBe(String(m.params.nx));
    await page.getByTestId('run-matched').click();
    await expect
      .poll(() => page.getByTestId('matched-trial').getAttribute('data-phase'), { timeout: 30_000 })
      .toBe('running');
    expect(await page.locator('#param-layers').inputValue()).toBe('2');
    expect(Number(await page.locator('#param-nx').inputValue())).toBe(m.params.nx);
    await expect.poll(() => modelTime(page), { timeout: 60_000 }).toBeGreaterThan(0);
    expect(app.problems).toEqual([]);
  }, 120_000);

  it('a small matched two-layer run goes to its end and puts the measured means beside the predictions', async () => {
    const { page } = app;
    // Another run replaces the ocean-like trial, so that a new one can start.
    await page.getByTestId('scenario').selectOption('atmosphere-two-layer');
    await expect
      .poll(() => page.getByTestId('matched-trial').getAttribute('data-phase'), { timeout: 30_000 })
      .toBe('replaced');
    await page.getByTestId('plan-preset').selectOption('earth-atmosphere-two-layer');
    await page.getByTestId('plan-grid-nx').selectOption('128');
    await page.getByTestId('plan-grid-ny').selectOption('64');
    const input = structuredClone(planPreset('earth-atmosphere-two-layer').input);
    input.grid = { kind: 'points', nx: 128, ny: 64 };
    const m = analysePlan(input, { targetWallSeconds: 120 }).baroclinic!.matched!;
    await expect(page.getByTestId('baroclinic-matched').getAttribute('data-ny')).resolves.toBe('64');
    await page.getByTestId('run-matched').click();
    await page.getByTestId('baroclinic-comparison').waitFor({ timeout: 240_000 });
    // The measured ξ is the run's own, from its parameters (summary.ts), so it is the predicted one [derived].
    const xi = Number(await page.getByTestId('measured-supercriticality').getAttribute('data-measured'));
    expect(Math.abs(xi / m.predicted.supercriticality - 1)).toBeLessThanOrEqual(1e-12);
    // Eddies grew out of the noise: a positive eddy velocity and a heat flux down the gradient [practice].
    expect(Number(await page.getByTestId('measured-eddy_velocity').getAttribute('data-measured'))).toBeGreaterThan(0);
    expect(Number(await page.getByTestId('measured-heat_flux').getAttribute('data-measured'))).toBeGreaterThan(0);
    await screenshot(page, 'plan-baroclinic-matched.png');
    expect(app.problems).toEqual([]);
  }, 300_000);
});
