import { describe, expect, it } from 'vitest';
import { analysePlan } from '../../lib/plan/analysePlan';
import { planToModelUnits, planToPhysicalUnits } from '../../lib/plan/convertUnits';
import { PLAN_PRESETS } from '../../lib/plan/planPresets';

/** Dimension of each prediction's quantity: L^a T^b. */
const QUANTITY_DIM: Record<string, [number, number]> = {
  velocity: [1, -1],
  length: [1, 0],
  wavenumber: [-1, 0],
  time: [0, 1],
  rate: [0, -1],
  enstrophyRate: [0, -3],
  count: [0, 0],
  ratio: [0, 0],
};

function relative(a: number, b: number): number {
  return a === b ? 0 : Math.abs(a - b) / Math.max(Math.abs(a), Math.abs(b));
}

describe('a plan carried between physical and model units', () => {
  for (const preset of PLAN_PRESETS) {
    it(`${preset.id}: physical → model → physical predicts the same numbers to 1e-12, and the model plan the same numbers in its units`, () => {
      const original = analysePlan(preset.input).predictions;
      const { input: model, scaling } = planToModelUnits(preset.input);
      expect(model.units).toBe('model');
      // The model plan: the domain 2π long in x and the rms velocity 1 (Stria's scaling, units.ts).
      expect(relative(model.domain.Lx, 2 * Math.PI)).toBeLessThan(1e-12);
      const inModel = analysePlan(model).predictions;
      expect(relative(inModel.U.value, 1)).toBeLessThan(1e-12);
      const back = planToPhysicalUnits(model, scaling);
      expect(back.units).toBe('physical');
      const again = analysePlan(back).predictions;
      for (const [id, p] of Object.entries(original)) {
        if (typeof p.value !== 'number' || !Number.isFinite(p.value)) continue;
        // Back in physical units: the same number [derived: the scaling is undone exactly, to round-off].
        expect(relative(again[id as keyof typeof again].value, p.value), id).toBeLessThan(1e-12);
        // In model units: the number divided by ℓ^a t^b of its dimension [derived].
        const [a, b] = QUANTITY_DIM[p.quantity];
        const expected = p.value / (scaling.length ** a * scaling.time ** b);
        expect(relative(inModel[id as keyof typeof inModel].value, expected), `${id} in model units`).toBeLessThan(
          1e-12,
        );
      }
      expect(again.regime.text).toBe(original.regime.text);
    });
  }

  it('keeps the pure numbers (grid points, half-width, order, CFL number) and the title', () => {
    const input = PLAN_PRESETS[0].input;
    const { input: model } = planToModelUnits(input);
    expect(model.grid).toEqual(input.grid);
    expect(model.forcing.halfWidth).toBe(input.forcing.halfWidth);
    expect(model.hyperviscosity.order).toBe(input.hyperviscosity.order);
    expect(model.title).toBe(input.title);
  });
});
