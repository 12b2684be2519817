import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parsePlanFile, PLAN_FILE_VERSION, serializePlanFile } from '../../lib/plan/planFile';
import type { PlanInput } from '../../lib/plan/planInput';
import { PLAN_PRESETS } from '../../lib/plan/planPresets';
import { goodModelPlan } from './quoted';

const good = goodModelPlan() as unknown as PlanInput;

describe('plan file', () => {
  it('round-trips every preset and a model-unit plan', () => {
    for (const input of [...PLAN_PRESETS.map((p) => p.input), good]) {
      const text = serializePlanFile(input, '2026-12-01T12:00:00.000Z');
      const back = parsePlanFile(text);
      expect(back.input).toEqual(input);
      expect(back.version).toBe(PLAN_FILE_VERSION);
      expect(back.savedAt).toBe('2026-12-01T12:00:00.000Z');
      expect(serializePlanFile(back.input, back.savedAt)).toBe(text);
    }
  });

  it('round-trips plans with arbitrary valid numbers (seeded property)', () => {
    const positive = fc.double({ min: 1e-12, max: 1e12, noNaN: true });
    fc.assert(
      fc.property(
        positive,
        positive,
        positive,
        fc.double({ min: 1e-6, max: 0.999, noNaN: true }),
        fc.integer({ min: 1, max: 8 }),
        (beta, drag, lambda, hw, order) => {
          const input = {
            ...good,
            rotation: { kind: 'beta' as const, beta },
            dragTime: drag,
            forcing: { wavelength: lambda, halfWidth: hw },
            hyperviscosity: { order, gridDampingTime: drag },
          };
          expect(parsePlanFile(serializePlanFile(input)).input).toEqual(input);
        },
      ),
      { seed: 7, numRuns: 200 },
    );
  });

  it('refuses unknown versions with a clear message', () => {
    const file = JSON.parse(serializePlanFile(good));
    for (const version of [2, 0, '1', null]) {
      expect(() => parsePlanFile({ ...file, version })).toThrow(expect.objectContaining({ source: 'plan file' }));
      expect(() => parsePlanFile({ ...file, version })).toThrow(
        `plan file version ${JSON.stringify(version)} is not known to this Stria, which reads version 1 only`,
      );
    }
  });

  it('refuses what is not a plan file, naming the reason or the field', () => {
    expect(() => parsePlanFile('{ not json')).toThrow(/not JSON/);
    expect(() => parsePlanFile('[1]')).toThrow(/expected a JSON object/);
    expect(() => parsePlanFile({ format: 'other', version: 1 })).toThrow(/not a Stria plan file: format is "other"/);
    const file = JSON.parse(serializePlanFile(good));
    expect(() => parsePlanFile({ ...file, input: { ...file.input, dragTime: -2 } })).toThrow(
      /input\.dragTime: out of range \(drag damping time/,
    );
    expect(() => parsePlanFile({ ...file, savedAt: 'yesterday' })).toThrow(/savedAt/);
    expect(() => parsePlanFile({ ...file, extra: true })).toThrow(/plan file refused: extra/);
  });

  it('refuses to write an invalid input', () => {
    expect(() => serializePlanFile({ ...good, runLength: 0 })).toThrow(/runLength/);
  });
});
