import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Model } from '../lib/model/model';
import type { ModelParams } from '../lib/model/params';
import { validateParams } from '../lib/model/validateParams';
import { DEFAULT_SCENARIO_ID, scenarioById } from '../lib/plan/demoScenarios';
import { encodeRunLink } from '../src/share/runLink';
import { stateChecksum } from '../lib/io/digest';
import { launchChromium, type BrowserSession } from './support/browser';
import { openApp, readText, resetAndStep } from './support/app';

// Same parameters, seed and step count give the same bits in Chromium and in Node: the state
// checksum (stateChecksum, lib/io/digest.ts) the page shows against the one of a Model stepped here.

const STEPS = 50;
const base = scenarioById(DEFAULT_SCENARIO_ID)!.params;

/**
 * The default scenario as it is (128²; its CFL target does not bind in the first steps), at 64² with
 * the forcing moved in to k_f = 12 (inside the 64² dealiased range) on a fixed step, with a largest
 * step (dt = 0.2, 0.1) long enough that the adaptive step walks down its ladder, rebuilding the
 * propagators at each rung, with very fast Rossby waves, with steady forcing, and with two layers.
 */
const CASES: { name: string; params: ModelParams; adaptive: boolean }[] = [
  { name: '128², the default scenario', params: validateParams({ ...base }), adaptive: false },
  { name: '64², fixed dt', params: validateParams({ ...base, nx: 64, ny: 64, kf: 12, cfl: 0 }), adaptive: false },
  { name: '64², adaptive dt', params: validateParams({ ...base, nx: 64, ny: 64, kf: 12, dt: 0.2 }), adaptive: true },
  {
    name: '128², adaptive dt, k_d = 4, another seed',
    params: validateParams({ ...base, dt: 0.1, kd: 4, seed: 987654321 }),
    adaptive: true,
  },
  // Wave phases ω·dt up to β·dt·Lx/2π = 2·10⁸ rad: past 2²⁵, where lib/model/hugeArgument.ts reduces them.
  {
    name: '64², β = 10¹⁰',
    params: validateParams({ ...base, nx: 64, ny: 64, kf: 12, cfl: 0, beta: 1e10 }),
    adaptive: false,
  },
  // The two-layer model (docs/two-layer.md): 2 × 2 propagators rebuilt at each rung, the coupled Jacobian.
  {
    name: '64², two layers, adaptive dt',
    params: validateParams({
      ...base,
      nx: 64,
      ny: 64,
      kf: 12,
      layers: 2,
      kd: 8,
      shear: 1.5,
      depth_ratio: 0.5,
      dt: 0.2,
    }),
    adaptive: true,
  },
  {
    name: '64², steady forcing',
    params: validateParams({ ...base, nx: 64, ny: 64, kf: 12, cfl: 0, forcing: 'steady' }),
    adaptive: false,
  },
];

/** The checksum after STEPS steps in Node, and how many different steps the run took. */
function nodeRun(params: ModelParams): { checksum: string; steps: number } {
  const model = new Model(params);
  const dts = new Set<number>();
  for (let i = 0; i < STEPS; i++) dts.add(model.step(1).dt);
  return { checksum: stateChecksum(model.qHat), steps: dts.size };
}

describe('State checksums in Chromium and in Node', () => {
  let session: BrowserSession;
  const problems: string[][] = [];

  beforeAll(async () => {
    session = await launchChromium({ width: 1200, height: 900 });
  });

  afterAll(async () => {
    await session?.close();
  });

  it('the cases are what they say: stochastic forcing but one, adaptive steps that change, phases past 2²⁵', () => {
    const runs = CASES.map((c) => nodeRun(c.params));
    CASES.forEach((c, i) => {
      expect(c.params.forcing, c.name).toBe(c.name.includes('steady') ? 'steady' : 'stochastic');
      if (c.adaptive) expect(runs[i].steps, c.name).toBeGreaterThan(5);
      else expect(runs[i].steps, c.name).toBe(1);
    });
    const fast = CASES.find((c) => c.params.beta === 1e10)!.params;
    expect((fast.beta * fast.dt * fast.Lx) / (2 * Math.PI)).toBeGreaterThan(2 ** 25);
    // Each is a run of its own.
    expect(new Set(runs.map((r) => r.checksum)).size).toBe(CASES.length);
  });

  for (const c of CASES) {
    it(`${c.name}: the same checksum after ${STEPS} steps`, async () => {
      const expected = nodeRun(c.params).checksum;
      const app = await openApp(session, encodeRunLink(c.params));
      problems.push(app.problems);
      await resetAndStep(app.page, STEPS);
      expect(await readText(app.page, 'checksum')).toBe(expected);
      await app.page.close();
    });
  }

  it('ran without page errors or console warnings', () => {
    expect(problems.flat()).toEqual([]);
  });
});
