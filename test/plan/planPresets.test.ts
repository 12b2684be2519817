import { describe, expect, it } from 'vitest';
import { analysePlan } from '../../lib/plan/analysePlan';
import { PLANETS } from '../../lib/plan/planets';
import { PLAN_PRESETS, planPreset } from '../../lib/plan/planPresets';
import { validatePlanInput } from '../../lib/plan/planInput';

describe('plan presets', () => {
  it('are valid plans built on the real planets, with the made-up numbers named', () => {
    expect(PLAN_PRESETS.map((p) => p.id)).toEqual([
      'earth-atmosphere',
      'earth-ocean',
      'jupiter',
      'earth-ocean-two-layer',
      'earth-atmosphere-two-layer',
    ]);
    for (const p of PLAN_PRESETS) {
      expect(() => validatePlanInput(p.input)).not.toThrow();
      expect(p.input.rotation.kind).toBe('planet');
      expect(p.title).toMatch(/\(demo\)/);
      expect(p.description).toMatch(/made up/);
      const planet = p.input.rotation.kind === 'planet' ? PLANETS[p.input.rotation.planet] : null;
      expect(p.real.join(' ')).toContain(planet?.id === 'earth' ? '7.292115e-5' : '7.1492e7');
      // Everything but the rotation is invented for the demo, and says so.
      for (const k of Object.keys(p.input))
        if (!['units', 'title', 'rotation'].includes(k)) expect(p.madeUp, `${p.id}.${k}`).toContain(k);
    }
  });

  it('give plans worth looking at: no errors, a zonostrophic regime and a matched run', () => {
    for (const p of PLAN_PRESETS.filter((q) => q.input.drive.kind !== 'baroclinic')) {
      const a = analysePlan(p.input);
      expect(
        a.checks.filter((c) => c.severity === 'error'),
        p.id,
      ).toEqual([]);
      expect(a.predictions.R_beta.value, p.id).toBeGreaterThanOrEqual(1.5);
      expect(a.predictions.jetsRhines.value, p.id).toBeGreaterThanOrEqual(3);
      expect(a.matched, p.id).not.toBeNull();
    }
  });

  it('include an ocean-like and an atmosphere-like two-layer case: supercritical, no errors, a matched two-layer run', () => {
    const two = PLAN_PRESETS.filter((q) => q.input.drive.kind === 'baroclinic');
    expect(two.map((q) => q.id)).toEqual(['earth-ocean-two-layer', 'earth-atmosphere-two-layer']);
    for (const p of two) {
      const a = analysePlan(p.input);
      expect(a.checks.map((c) => [c.id, c.severity])).toEqual([
        ['supercritical', 'ok'],
        ['resolvesDeformation', 'ok'],
        ['baroclinicJets', 'ok'],
        ['baroclinicRunLength', 'ok'],
      ]);
      expect(a.baroclinic!.predictions.find((q) => q.id === 'xi')!.value, p.id).toBeGreaterThan(1);
      expect(a.baroclinic!.matched!.params.layers, p.id).toBe(2);
      expect(a.baroclinic!.matched!.withinTarget, p.id).toBe(true);
      expect(p.description).toMatch(/idealisation/);
    }
  });

  it('looks presets up by id', () => {
    expect(planPreset('jupiter').input.rotation).toMatchObject({ planet: 'jupiter' });
    expect(() => planPreset('mars' as never)).toThrow(/no plan preset "mars"/);
  });
});
