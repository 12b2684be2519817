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
import { ATMOSPHERE_SETTING, BETA_45, OCEAN_SETTING, scaledTwoLayer } from '../../lib/plan/twoLayerScenarios';
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
      // Unforced two-layer runs: the annulus is only their seed and the drag acts on one layer.
      if (p.forcing === 'none') continue;
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

describe('two-layer scenarios', () => {
  const twoLayer = DEMO_SCENARIOS.filter((s) => s.params.layers === 2);

  it('are an ocean-like and an atmosphere-like case, unforced and seeded inside the unstable band', () => {
    expect(twoLayer.map((s) => s.id)).toEqual(['ocean-two-layer', 'atmosphere-two-layer']);
    for (const s of twoLayer) {
      const p = params(s.id);
      expect(p.eps, s.id).toBe(0);
      expect(p.init_energy, s.id).toBeGreaterThan(0);
      // The seed's annulus lies inside K < k_d, where the Phillips problem has its growing modes
      // [published: Pedlosky 1987 §7.11; the short-wave cutoff at β = 0, δ = 1].
      expect(p.kf + p.dkf, s.id).toBeLessThan(p.kd);
    }
  });

  it('are supercritical: the shear exceeds β(1 + δ)/(δ k_d²) [published: Phillips 1954; Pedlosky 1987 §7.11; docs/two-layer.md section 4]', () => {
    for (const s of twoLayer) {
      const p = params(s.id);
      const critical = (p.beta * (1 + p.depth_ratio)) / (p.depth_ratio * p.kd * p.kd);
      const xi = p.shear / critical;
      expect(xi, s.id).toBeGreaterThan(1.2);
      expect(xi, s.id).toBeLessThan(3);
    }
  });

  it('take β at 45° from the Earth rotation and radius: 1.619e-11 m⁻¹ s⁻¹ [published: IERS Ω = 7.2921e-5 s⁻¹, mean radius 6371 km; derived 2Ω cos φ/a]', () => {
    expect(BETA_45).toBeCloseTo(1.6187e-11, 14);
    // Model β = β L²/ΔU: the ocean case 1.619e-11 × (300 km)² / 0.108 m/s = 13.49 [derived].
    expect(scaledTwoLayer(OCEAN_SETTING)).toEqual({ kd: 10, beta: 13.49, mu: 1, shear: 1, depth_ratio: 0.25 });
    expect(scaledTwoLayer(ATMOSPHERE_SETTING).kd).toBe(6.436);
  });
});

describe('the default parameters', () => {
  it('are the default scenario, so "the default" means one thing everywhere', () => {
    const s = scenarioById(DEFAULT_SCENARIO_ID)!;
    expect(validateParams(s.params)).toEqual(DEFAULT_PARAMS);
  });
});
