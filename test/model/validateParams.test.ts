import { describe, expect, it } from 'vitest';
import { InputError, isInputError } from '../../lib/inputError';
import { Model } from '../../lib/model/model';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { validateParams } from '../../lib/model/validateParams';

function issuesOf(input: unknown): InputError {
  try {
    validateParams(input);
  } catch (e) {
    if (isInputError(e, 'parameters')) return e;
    throw e;
  }
  throw new Error('expected an InputError of source "parameters"');
}

// Validation at the boundary (DESIGN): each refusal names the field, the value and the allowed range.
describe('validateParams', () => {
  it('accepts the defaults and fills missing keys from them', () => {
    expect(validateParams({})).toEqual(DEFAULT_PARAMS);
    expect(validateParams({ mu: 0.2 }).mu).toBe(0.2);
  });

  const bad: Array<[string, Record<string, unknown>, RegExp]> = [
    ['NaN drag', { mu: NaN }, /mu = NaN: .*finite/],
    ['negative drag', { mu: -0.1 }, /mu = -0\.1: .*≥ 0/],
    ['infinite β', { beta: Infinity }, /beta = Infinity/],
    ['a size that is not a power of two', { nx: 100 }, /nx = 100: must be a power of two from 32 to 1024/],
    ['a size too large', { ny: 2048 }, /ny = 2048: must be a power of two/],
    ['a size too small', { nx: 16 }, /nx = 16/],
    [
      'k_f beyond the dealiased range',
      { nx: 64, ny: 64, kf: 22, dkf: 1 },
      /kf = 22: .*beyond the dealiased range: needs k_f \+ δk ≤ 21/,
    ],
    ['an annulus below the smallest wavenumber', { kf: 1, dkf: 1 }, /dkf = 1: .*k_f − δk ≥ 1/],
    ['a zero time step', { dt: 0 }, /dt = 0: .*> 0/],
    ['a fractional hyperviscosity order', { nu_order: 2.5 }, /nu_order = 2\.5: must be an integer from 1 to 8/],
    ['an unknown forcing kind', { forcing: 'random' }, /forcing = "random": must be one of/],
    ['a string for a number', { eps: '0.1' }, /eps = "0\.1"/],
    ['a negative seed', { seed: -1 }, /seed = -1/],
    ['an unknown key', { gamma: 1 }, /gamma.*is not a parameter/],
    ['steady forcing without drag', { forcing: 'steady', mu: 0 }, /mu = 0: steady forcing needs/],
    ['a CFL number above the stable range', { cfl: 2 }, /cfl = 2/],
  ];
  for (const [what, input, message] of bad) {
    it(`refuses ${what}, naming the field and the range`, () => {
      const err = issuesOf(input);
      expect(err.message).toMatch(message);
      expect(err.issues.length).toBeGreaterThan(0);
      expect(() => new Model(input)).toThrow(expect.objectContaining({ source: 'parameters' }));
    });
  }

  it('lists every bad field at once', () => {
    const err = issuesOf({ mu: -1, nu: -1, nx: 3 });
    expect(err.issues.map((i) => i.field).sort()).toEqual(['mu', 'nu', 'nx']);
  });

  it('refuses what is not an object', () => {
    expect(issuesOf(null).message).toMatch(/must be an object/);
    expect(issuesOf([1, 2]).message).toMatch(/must be an object/);
  });
});
