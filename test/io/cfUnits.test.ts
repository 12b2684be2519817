import { describe, expect, it } from 'vitest';
import { checkUnitSystem, modelDimensionLabel, unitScale, unitsString, type UnitSystem } from '../../lib/io/cfUnits';

// UDUNITS product syntax for the CF units attribute (CF Conventions 1.8, section 3.1).
describe('cfUnits', () => {
  const phys: UnitSystem = { kind: 'physical', metresPerLength: 1e5, secondsPerTime: 86400 };

  it('writes "1" in model units and SI strings in physical units', () => {
    expect(unitsString({ L: 2, T: -1 }, { kind: 'model' })).toBe('1');
    expect(unitsString({ L: 2, T: -1 }, phys)).toBe('m2 s-1');
    expect(unitsString({ L: 1, T: -2 }, phys)).toBe('m s-2');
    expect(unitsString({ L: 0, T: -1 }, phys)).toBe('s-1');
    expect(unitsString({ L: 0, T: 1 }, phys)).toBe('s');
    expect(unitsString({ L: 0, T: 0 }, phys)).toBe('1');
  });

  it('labels model dimensions and scales values by metres^a seconds^b', () => {
    expect(modelDimensionLabel({ L: 2, T: -2 })).toBe('L2 T-2');
    expect(modelDimensionLabel({ L: 1, T: 0 })).toBe('L');
    expect(unitScale({ L: 2, T: -1 }, { kind: 'model' })).toBe(1);
    expect(unitScale({ L: 1, T: -1 }, phys)).toBe(1e5 / 86400);
    expect(unitScale({ L: 2, T: -2 }, phys)).toBe(1e10 / 86400 ** 2);
  });

  it('refuses unit systems that cannot convert', () => {
    expect(() => checkUnitSystem({ kind: 'physical', metresPerLength: 0, secondsPerTime: 1 })).toThrow(
      /units.metresPerLength must be a finite number > 0/,
    );
    expect(() => checkUnitSystem({ kind: 'physical', metresPerLength: 1, secondsPerTime: Infinity })).toThrow(
      /units.secondsPerTime/,
    );
    expect(() => checkUnitSystem({ ...phys, medium: 'mantle' as never })).toThrow(
      /units.medium must be 'atmosphere' or 'ocean'/,
    );
    expect(() => checkUnitSystem({ kind: 'si' } as never)).toThrow(/units.kind must be 'model' or 'physical'/);
  });
});
