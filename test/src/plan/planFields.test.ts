import { describe, expect, it } from 'vitest';
import { InputError } from '../../../lib/inputError';
import { validatePlanInput } from '../../../lib/plan/planInput';
import { planPreset } from '../../../lib/plan/planPresets';
import { CHOICE_FIELDS, chooseKind, COMMON_FIELDS, getPath, KINDS, setPath } from '../../../src/plan/planFields';

describe('plan fields', () => {
  const base = planPreset('earth-atmosphere').input;

  it('name the paths that a refused plan input names, so a refusal lands at its field', () => {
    const bad = setPath(setPath(base, 'domain.Lx', -1), 'forcing.halfWidth', 2);
    try {
      validatePlanInput(bad);
      expect.unreachable();
    } catch (e) {
      const fields = (e as InputError).issues.map((i) => i.field);
      const known = [...COMMON_FIELDS, ...Object.values(CHOICE_FIELDS).flatMap((c) => Object.values(c).flat())].map(
        (f) => f.path,
      );
      expect(fields.sort()).toEqual(['domain.Lx', 'forcing.halfWidth']);
      for (const f of fields) expect(known).toContain(f);
    }
  });

  it('set a path without touching the original, and read it back', () => {
    const next = setPath(base, 'rotation.latitudeDeg', 30);
    expect(getPath(next, 'rotation.latitudeDeg')).toBe(30);
    expect(getPath(base, 'rotation.latitudeDeg')).toBe(45);
    expect(next.domain).toBe(base.domain);
  });

  it('start every kind of every choice from a valid value, in both unit systems', () => {
    for (const units of ['physical', 'model'] as const) {
      const start =
        units === 'physical'
          ? base
          : {
              ...base,
              units,
              rotation: { kind: 'beta' as const, beta: 10 },
              domain: { Lx: 6.28, Ly: 6.28 },
              forcing: { wavelength: 0.3, halfWidth: 0.1 },
            };
      for (const [key, kinds] of Object.entries(KINDS)) {
        for (const { kind } of kinds) {
          if (units === 'model' && key === 'rotation' && kind === 'planet') continue;
          const input = chooseKind(start, key as keyof typeof KINDS, kind);
          const withF =
            key === 'deformation' && kind === 'layer' && units === 'model' ? setPath(input, 'rotation.f', 1) : input;
          expect(() => validatePlanInput(withF), `${units} ${key}.${kind}`).not.toThrow();
        }
      }
    }
  });

  it('give a barotropic plan a deformation radius when its drive turns baroclinic, and keep one it has', () => {
    expect(base.deformation.kind).toBe('none');
    const next = chooseKind(base, 'drive', 'baroclinic');
    expect(next.drive.kind).toBe('baroclinic');
    expect(next.deformation).toEqual({ kind: 'radius', Ld: base.domain.Ly / 20 });
    const layered = setPath(base, 'deformation', { kind: 'radius', Ld: 1e5 });
    expect(chooseKind(layered, 'drive', 'baroclinic').deformation).toBe(layered.deformation);
  });
});
