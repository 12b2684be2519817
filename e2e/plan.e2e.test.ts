import { readFile } from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysePlan } from '../lib/plan/analysePlan';
import { parsePlanFile } from '../lib/plan/planFile';
import { planPreset } from '../lib/plan/planPresets';
import { mathPieces } from '../src/components/mathText';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, openView, screenshot, type AppPage } from './support/app';

describe('Plan view in Chromium', () => {
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

  it('shows for a preset exactly the predictions of lib/plan, each with its formula and source', async () => {
    const { page } = app;
    await page.getByTestId('plan-preset').selectOption('earth-ocean');
    const expected = analysePlan(planPreset('earth-ocean').input).predictions;
    const rows = page.locator('[data-testid^=prediction-]');
    const shown = await rows.evaluateAll((els) =>
      els.map(
        (e) =>
          [e.getAttribute('data-testid')!.slice('prediction-'.length), Number(e.getAttribute('data-value'))] as const,
      ),
    );
    expect(shown.length).toBeGreaterThan(15);
    // Chromium's and Node's engines may differ in the last bit of Math.pow: a few units of round-off apart at most.
    for (const [id, value] of shown) {
      const want = expected[id as keyof typeof expected].value;
      expect(Math.abs(value - want), id).toBeLessThanOrEqual(8 * Number.EPSILON * Math.abs(want));
    }
    // Hovering a prediction shows its formula (sub- and superscripts set as such: mathText.ts) and source.
    const kR = page.getByTestId('prediction-kR').getByRole('button');
    await kR.hover();
    const tip = page.getByTestId('prediction-kR').getByRole('tooltip');
    await expect(tip.innerText()).resolves.toContain(
      mathPieces(expected.kR.formula)
        .map((p) => p.text)
        .join(''),
    );
    await expect(tip.locator('sub').first().innerText()).resolves.toBe('R');
    // The preset says which constants are real and which are made up.
    await expect(
      page
        .getByText(/made up/)
        .first()
        .isVisible(),
    ).resolves.toBe(true);
    await screenshot(page, 'plan.png');
  });

  it('converts the plan on screen between units: Jupiter → model → physical keeps every number', async () => {
    const { page } = app;
    const shownPredictions = () =>
      page
        .locator('[data-testid^=prediction-]')
        .evaluateAll((els) =>
          Object.fromEntries(
            els.map((e) => [
              e.getAttribute('data-testid')!.slice('prediction-'.length),
              Number(e.getAttribute('data-value')),
            ]),
          ),
        );
    await page.getByTestId('plan-preset').selectOption('jupiter');
    const before = await shownPredictions();
    await page.getByTestId('plan-units-model').check();
    // In model units: the plan's own scaling makes the rms velocity 1 [derived: units.ts].
    await expect.poll(async () => (await shownPredictions()).U).toBeCloseTo(1, 10);
    // A switch is not an edit: the preset stays named.
    await expect(page.getByTestId('plan-preset').inputValue()).resolves.toBe('jupiter');
    await page.getByTestId('plan-units-physical').check();
    await expect.poll(async () => (await shownPredictions()).U).toBeCloseTo(before.U, 10);
    const after = await shownPredictions();
    for (const [id, value] of Object.entries(before))
      if (Number.isFinite(value)) expect(Math.abs(after[id] - value), id).toBeLessThanOrEqual(1e-12 * Math.abs(value));
  });

  it('refuses a bad entry at its field, and the machine speed changes the cost', async () => {
    const { page } = app;
    const wall = Number(await page.getByTestId('plan-cost').getAttribute('data-wall'));
    await page.getByTestId('plan-speed').fill('2');
    await page.getByTestId('plan-speed').press('Enter');
    await expect
      .poll(async () => Number(await page.getByTestId('plan-cost').getAttribute('data-wall')))
      .toBeCloseTo(wall / 2, 6);
    await page.getByTestId('plan-domain-Lx').fill('-3');
    await page.getByTestId('plan-domain-Lx').press('Enter');
    await expect(page.getByTestId('plan-domain-Lx-error').innerText()).resolves.toMatch(
      /domain length Lx: a finite number > 0/,
    );
    await expect(page.getByTestId('plan-refused').innerText()).resolves.toMatch(/domain\.Lx/);
    // A length with its unit word: 4000 km is 4e6 m; a unit of the wrong kind is refused by name.
    await page.getByTestId('plan-domain-Lx').fill('4000 km');
    await page.getByTestId('plan-domain-Lx').press('Enter');
    await page.getByTestId('plan-predictions').waitFor();
    expect(Number(await page.getByTestId('plan-domain-Lx').inputValue())).toBe(4e6);
    await page.getByTestId('plan-dragTime').fill('20 km');
    await page.getByTestId('plan-dragTime').press('Enter');
    await expect(page.getByTestId('plan-dragTime-error').innerText()).resolves.toMatch(/unknown unit "km"/);
    await page.getByTestId('plan-dragTime').fill('20 d');
    await page.getByTestId('plan-dragTime').press('Enter');
    await expect.poll(async () => Number(await page.getByTestId('plan-dragTime').inputValue())).toBe(1_728_000);
  });

  it('saves the plan as a plan file and the printable report', async () => {
    const { page } = app;
    const [json] = await Promise.all([page.waitForEvent('download'), page.getByTestId('plan-save-json').click()]);
    const plan = parsePlanFile(await readFile(await json.path(), 'utf8'));
    expect(plan.input.domain.Lx).toBe(4e6);
    const [html] = await Promise.all([page.waitForEvent('download'), page.getByTestId('plan-report-html').click()]);
    const text = await readFile(await html.path(), 'utf8');
    expect(text).toMatch(/^<!doctype html>/i);
    expect(text).toContain('Matched cheap run');
  });

  it('runs the matched run here and puts its measured summary beside the predictions', async () => {
    const { page } = app;
    await page.getByTestId('plan-preset').selectOption('earth-ocean');
    // A small wall-time target keeps the matched run to a 128 × 128 grid.
    await page.getByTestId('plan-target').fill('20');
    await page.getByTestId('plan-target').press('Enter');
    const matched = analysePlan(planPreset('earth-ocean').input, { targetWallSeconds: 20 }).matched!;
    await page.getByTestId('run-matched').click();
    await expect.poll(() => page.getByTestId('matched-trial').getAttribute('data-phase')).toBe('running');
    expect(Number(await page.locator('#param-nx').inputValue())).toBe(matched.params.nx);
    await page.getByTestId('matched-comparison').waitFor({ timeout: 150_000 });
    const jets = await page.getByTestId('measured-jet_count').getAttribute('data-measured');
    expect(Number(jets)).toBeGreaterThanOrEqual(0);
    const u = Number(await page.getByTestId('measured-u_rms').getAttribute('data-measured'));
    // The matched run is in units where the planned U is 1.
    expect(u).toBeGreaterThan(0.2);
    expect(u).toBeLessThan(2);
    // Every row carries the verdict `stria plan --matched` prints (lib/plan/verdict.ts) and its reason.
    for (const key of ['regime', 'jet_count', 'jet_spacing', 'u_rms', 'k_rhines', 'k_beta', 'zonostrophy_index']) {
      const row = page.getByTestId(`measured-${key}`);
      expect(['agrees', 'does not agree', 'cannot tell']).toContain(await row.getAttribute('data-verdict'));
      expect((await row.locator('td.why').innerText()).length).toBeGreaterThan(5);
    }
    await screenshot(page, 'plan-matched.png');
  }, 200_000);

  it('ran without page errors or console warnings', () => {
    expect(app.problems).toEqual([]);
  });
});
