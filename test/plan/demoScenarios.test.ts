import { describe, expect, it } from 'vitest';
import {
  rhinesWavenumber,
  steadyZonostrophyIndex,
  transitionalWavenumber,
  balanceVelocity,
} from '../../lib/analysis/scales';
import { keptRadius, validateParams } from '../../lib/model/validateParams';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { DEFAULT_SCENARIO_ID, DEMO_SCENARIOS, scenarioById } from '../../lib/plan/demoScenarios';
import { scaledHyperviscosity } from '../../lib/plan/gridHyperviscosity';
import { benchParams } from '../../bench/stepBench';

const params = (id: string) => validateParams(scenarioById(id)?.params ?? {});
/** Jets across the domain if they sit 2π/k_R apart, with U = (ε/μ)^½ [derived, docs/scales.md]. */
const predictedJets = (id: string) => {
  const p = params(id);
  return (p.Ly * rhinesWavenumber(p.beta, balanceVelocity(p.eps, p.mu))) / (2 * Math.PI);
};

describe('demo scenarios', () => {
  it('are valid model parameters, with distinct ids and one-line descriptions', () => {
    expect(new Set(DEMO_SCENARIOS.map((s) => s.id)).size).toBe(DEMO_SCENARIOS.length);
    for (const s of DEMO_SCENARIOS) {
      expect(() => validateParams(s.params), s.id).not.toThrow();
      expect(s.description, s.id).not.toMatch(/\n/);
      expect(s.description.length, s.id).toBeLessThan(140);
    }
    expect(scenarioById(DEFAULT_SCENARIO_ID)).toBeDefined();
  });

  it('keep the forcing annulus inside the dealiased range with hyperviscosity damping at the grid scale', () => {
    for (const s of DEMO_SCENARIOS) {
      const p = params(s.id);
      const kMax = keptRadius(p);
      expect(p.kf + p.dkf, s.id).toBeLessThanOrEqual(kMax);
      // Damping rate at k_max well above the drag; at k_f well below the drag rate times 10.
      expect(p.nu * Math.pow(kMax, 2 * p.nu_order), s.id).toBeGreaterThan(10 * p.mu);
      expect(p.nu * Math.pow(p.kf, 2 * p.nu_order), s.id).toBeLessThan(p.mu);
    }
  });

  it('take the default ν rescaled to their grid, as the benchmark does: the same damping rate at k_max', () => {
    for (const s of DEMO_SCENARIOS) {
      const p = params(s.id);
      expect(p.nu, s.id).toBe(scaledHyperviscosity(DEFAULT_PARAMS, p));
    }
    expect(params('many-jets').nu).not.toBe(DEFAULT_PARAMS.nu); // 256²
    for (const n of [128, 256, 512])
      expect(benchParams(n).nu, `bench ${n}`).toBe(scaledHyperviscosity(DEFAULT_PARAMS, { nx: n, ny: n }));
  });

  it('are what they say: no β, a few jets, many zonostrophic jets, a deformation radius', () => {
    expect(params('isotropic').beta).toBe(0);
    expect(predictedJets('few-jets')).toBeGreaterThan(2);
    expect(predictedJets('few-jets')).toBeLessThan(predictedJets(DEFAULT_SCENARIO_ID));
    expect(predictedJets('many-jets')).toBeGreaterThan(predictedJets(DEFAULT_SCENARIO_ID));
    const many = params('many-jets');
    expect(steadyZonostrophyIndex(many.beta, many.eps, many.mu)).toBeGreaterThanOrEqual(2.5);
    // k_f ≫ k_β: the forcing lies well inside the isotropic range.
    expect(many.kf / transitionalWavenumber(many.beta, many.eps)).toBeGreaterThan(1.5);
    expect(params('deformation').kd).toBeGreaterThan(0);
  });
});

describe('the default parameters', () => {
  it('are the default scenario, so "the default" means one thing everywhere', () => {
    const s = scenarioById(DEFAULT_SCENARIO_ID)!;
    expect(validateParams(s.params)).toEqual(DEFAULT_PARAMS);
  });
});
