import { describe, expect, it } from 'vitest';
import { InputError, isInputError } from '../../lib/inputError';
import { PLAN_SIZE_MAX, pointsForSpacing, validatePlanInput } from '../../lib/plan/planInput';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { goodModelPlan } from './quoted';

function refusal(input: unknown): InputError {
  try {
    validatePlanInput(input);
  } catch (e) {
    if (isInputError(e, 'plan input')) return e;
    throw e;
  }
  throw new Error('expected an InputError of source "plan input"');
}

const physical = {
  units: 'physical',
  rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 45 },
  deformation: { kind: 'layer', H: 1e4, gPrime: 1 },
  drive: { kind: 'velocity', U: 10 },
  dragTime: 1e6,
  forcing: { wavelength: 5e5, halfWidth: 0.1 },
  domain: { Lx: 2e7, Ly: 2e7 },
  grid: { kind: 'spacing', dx: 5e4, dy: 5e4 },
  hyperviscosity: { order: 4, gridDampingTime: 3600 },
  runLength: 1e8,
};

describe('plan input validation', () => {
  it('accepts a physical and a model-unit plan and fills the defaults', () => {
    const p = validatePlanInput(physical);
    expect(p.cfl).toBe(DEFAULT_PARAMS.cfl); // the model's own default
    expect(p.rhines).toBe('kR');
    expect(validatePlanInput(goodModelPlan({ cfl: 0.3, rhines: 'twoPiSqrtUbeta' })).rhines).toBe('twoPiSqrtUbeta');
  });

  // Each refusal names the field, the value and the allowed range.
  const bad: Array<[string, Record<string, unknown>, RegExp]> = [
    [
      'a negative drag time',
      { dragTime: -1 },
      /^dragTime = -1: out of range \(drag damping time 1\/μ: a finite number > 0\)$/,
    ],
    ['an infinite run length', { runLength: Infinity }, /runLength = Infinity: out of range/],
    [
      'NaN injection',
      { drive: { kind: 'injection', eps: NaN } },
      /drive\.eps = NaN: energy injection rate ε: a finite number > 0/,
    ],
    [
      'a latitude at the pole',
      { rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 90 } },
      /rotation\.latitudeDeg = 90: .*> -90 and < 90/,
    ],
    [
      'an unknown planet',
      { rotation: { kind: 'planet', planet: 'mars', latitudeDeg: 10 } },
      /rotation\.planet = "mars": must be one of "earth", "jupiter"/,
    ],
    ['an unknown rotation kind', { rotation: { kind: 'spin' } }, /rotation\.kind = "spin": must be one of/],
    [
      'a grid size not a power of two',
      { grid: { kind: 'points', nx: 100, ny: 64 } },
      /grid\.nx = 100: must be a power of two from 32 to 65536/,
    ],
    ['a grid size too large', { grid: { kind: 'points', nx: 131072, ny: 64 } }, /grid\.nx = 131072/],
    [
      'a spacing needing too many points',
      { grid: { kind: 'spacing', dx: 100, dy: 5e4 } },
      /grid\.dx = 100: needs 262144 points .* more than 65536/,
    ],
    [
      'an annulus half-width of 1',
      { forcing: { wavelength: 5e5, halfWidth: 1 } },
      /forcing\.halfWidth = 1: .*> 0 and < 1/,
    ],
    [
      'a fractional hyperviscosity order',
      { hyperviscosity: { order: 2.5, gridDampingTime: 1 } },
      /hyperviscosity\.order = 2\.5: must be an integer from 1 to 8/,
    ],
    ['a CFL number too large', { cfl: 2 }, /cfl = 2: out of range \(CFL number: 0\.01 to 1\.2\)/],
    [
      'a CFL number too small for the model',
      { cfl: 1e-5 },
      /cfl = 0\.00001: out of range \(CFL number: 0\.01 to 1\.2\)/,
    ],
    ['an unknown Rhines convention', { rhines: 'L' }, /rhines = "L": must be one of "kR", "sqrtUbeta"/],
    ['a string for a number', { dragTime: '1e6' }, /dragTime = "1e6"/],
    ['an unknown field', { gamma: 3 }, /gamma = "gamma": is not a plan field/],
    ['an unknown nested field', { domain: { Lx: 1, Ly: 1, Lz: 1 } }, /domain\.Lz.*is not a plan field/],
  ];
  it.each(bad)('refuses %s', (_, change, message) => {
    expect(refusal({ ...physical, ...change }).message).toMatch(message);
  });

  it('lists every refused field', () => {
    const e = refusal({ ...physical, dragTime: 0, runLength: -5 });
    expect(e.issues.map((i) => i.field).sort()).toEqual(['dragTime', 'runLength']);
    expect(e.issues.find((i) => i.field === 'runLength')?.value).toBe(-5);
  });

  it('refuses a planet in model units and a layer without f', () => {
    expect(
      refusal({ ...goodModelPlan(), rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 30 } }).message,
    ).toMatch(/rotation\.kind = "planet": a planet gives f and β in SI units/);
    expect(refusal(goodModelPlan({ deformation: { kind: 'layer', H: 1, gPrime: 1 } })).message).toMatch(
      /deformation\.kind = "layer": L_d = √\(g′H\)\/\|f\| needs f ≠ 0/,
    );
    expect(refusal({ ...physical, rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 0 } }).message).toMatch(
      /needs f ≠ 0/,
    );
    expect(() =>
      validatePlanInput(
        goodModelPlan({ rotation: { kind: 'beta', beta: 50, f: 2 }, deformation: { kind: 'layer', H: 1, gPrime: 1 } }),
      ),
    ).not.toThrow();
  });

  // Every field a fine double, but predictions that leave the doubles: refused at the field that
  // makes them so, never passed on as NaN or ∞ (found by test/reliability/boundaries/planInput.ts).
  it.each([
    [
      'a subnormal drag time',
      { dragTime: 5e-324 },
      'dragTime',
      /^dragTime = 5e-324: out of range: .*non-finite predictions k_R = Infinity, k_fric = Infinity/,
    ],
    [
      'a subnormal β',
      { rotation: { kind: 'beta', beta: 5e-324 } },
      'rotation.beta',
      /rotation\.beta = 5e-324: .*L_R = Infinity/,
    ],
    [
      'a subnormal β with a huge drag time (R_β = 0·∞)',
      { rotation: { kind: 'beta', beta: 5e-324 }, dragTime: 2.6e117 },
      'rotation.beta',
      /R_β = NaN/,
    ],
    [
      'a huge injection rate',
      { drive: { kind: 'injection', eps: 1e300 } },
      'drive.eps',
      /drive\.eps = 1e\+300: .*R_β = Infinity/,
    ],
    ['a subnormal target velocity', { drive: { kind: 'velocity', U: 1e-300 } }, 'drive.U', /k_β = Infinity/],
    [
      'a tiny forcing wavelength',
      { forcing: { wavelength: 1e-300, halfWidth: 0.05 } },
      'forcing.wavelength',
      /η = Infinity/,
    ],
  ])('refuses %s, whose predictions would not be finite', (_, change, field, message) => {
    const e = refusal(goodModelPlan(change));
    expect(e.issues.map((i) => i.field)).toEqual([field]);
    expect(e.message).toMatch(message);
  });

  it('keeps accepting extreme values whose predictions stay finite', () => {
    expect(() => validatePlanInput(goodModelPlan({ runLength: 1e300 }))).not.toThrow();
    expect(() => validatePlanInput(goodModelPlan({ dragTime: 1e-6 }))).not.toThrow();
    expect(() => validatePlanInput(physical)).not.toThrow();
  });

  it('refuses what is not an object', () => {
    expect(refusal(null).issues[0].field).toBe('(plan)');
    expect(refusal([1, 2]).issues.length).toBeGreaterThan(0);
  });
});

describe('points for a spacing', () => {
  it('takes the smallest power of two (≥ 32) whose spacing is at most the one asked for', () => {
    expect(pointsForSpacing(2e7, 5e4)).toBe(512); // 400 needed
    expect(pointsForSpacing(1024, 1)).toBe(1024); // exact fit
    expect(pointsForSpacing(1, 1)).toBe(32); // never below the smallest size
    expect(pointsForSpacing(3 * 0.1, 0.1 / 100)).toBe(512); // 300 needed, with round-off in L/d
    expect(pointsForSpacing(PLAN_SIZE_MAX, 1)).toBe(PLAN_SIZE_MAX);
  });
});
