import { describe, expect, it } from 'vitest';
import { analysePlan } from '../../lib/plan/analysePlan';
import { annulusModeCount } from '../../lib/plan/cost';
import { PLAN_PRESETS } from '../../lib/plan/planPresets';
import { goodModelPlan } from './quoted';

describe('analysePlan', () => {
  it('ties validation, predictions, checks, cost and the matched run together', () => {
    const a = analysePlan(PLAN_PRESETS[0].input, { targetWallSeconds: 600 });
    expect(a.plan.units).toBe('physical');
    expect(a.scaling.length).toBe(4e7 / (2 * Math.PI));
    expect(a.checks).toHaveLength(8);
    expect(a.cost.steps).toBe(a.predictions.stepsPlanned.value);
    expect(a.cost.memory.arrays.find((x) => x.name === 'annulus modes and mirrors')?.elements).toBe(
      2 *
        annulusModeCount({
          nx: a.plan.nx,
          ny: a.plan.ny,
          Lx: a.plan.Lx,
          Ly: a.plan.Ly,
          kf: a.plan.kf,
          dkf: a.plan.dkf,
        }),
    );
    expect(a.matched?.withinTarget).toBe(true);
    expect(a.matchedChecks).toHaveLength(8);
    expect(a.matchedError).toBeNull();
  });

  it('passes the machine speed to the cost', () => {
    const slow = analysePlan(goodModelPlan());
    const fast = analysePlan(goodModelPlan(), { speed: 4 });
    expect(fast.cost.wallSeconds).toBeCloseTo(slow.cost.wallSeconds / 4, 6);
  });

  it('throws only for an invalid input', () => {
    expect(() => analysePlan({ ...goodModelPlan(), dragTime: 0 })).toThrow(
      expect.objectContaining({ source: 'plan input' }),
    );
  });
});
