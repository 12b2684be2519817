import * as v from 'valibot';
import { RHINES_DEFINITIONS, type RhinesConvention } from '../analysis/scales';
import { InputError, type InputIssue } from '../inputError';
import { derivePlan } from './derivePlan';
import { PLAN_SIZE_MAX, PLAN_SIZE_MIN, pointsForSpacing } from './gridPoints';
import { predictPlan, type PredictionId } from './predictions';
import { THRESHOLDS } from './thresholds';

/**
 * The planned run's inputs, as a researcher states them: in physical units (SI: m, s, rad/s) or in
 * model units (any consistent length and time units, e.g. the model's own). Validated at the
 * boundary by `validatePlanInput`; everything else in lib/plan trusts a validated input.
 *
 * Per field, in the plan's units (L = length, T = time):
 *   rotation        a planet and latitude (physical only; f = 2Ω sin φ, β = 2Ω cos φ/R), or β [1/(L·T)]
 *                   directly, optionally with f [1/T]
 *   deformation     none (L_d = ∞), L_d [L], or layer depth H [L] and reduced gravity g′ [L/T²], giving
 *                   L_d = √(g′H)/|f|
 *   drive           energy injection rate ε [L²/T³], or a target rms velocity U [L/T] (then ε = μU²),
 *                   or baroclinic: an imposed vertical shear U₁ − U₂ [L/T] between two layers of depth
 *                   ratio δ = H₁/H₂ (default 1), no stirring (baroclinicPlan.ts); needs a deformation
 *   dragTime        1/μ [T], the damping time of the linear drag on vorticity
 *   forcing         wavelength λ_f [L] (k_f = 2π/λ_f) and the annulus half-width as a fraction δk/k_f
 *   domain          Lx, Ly [L] (doubly periodic; y is the jet-crossing direction)
 *   grid            points nx, ny (powers of two), or the largest acceptable spacing dx, dy [L]
 *   hyperviscosity  order p and damping time τ at the grid scale [T]: ν = 1/(τ k_max^{2p})
 *   runLength       the planned run length [T]
 *   cfl             CFL number for the time step (default the model's, DEFAULT_PARAMS.cfl)
 *   rhines          the Rhines convention used for the jet spacing (default k_R = (β/2U)^½)
 */
export type UnitSystem = 'physical' | 'model';

export type RotationInput =
  { kind: 'planet'; planet: 'earth' | 'jupiter'; latitudeDeg: number } | { kind: 'beta'; beta: number; f?: number };
export type DeformationInput =
  { kind: 'none' } | { kind: 'radius'; Ld: number } | { kind: 'layer'; H: number; gPrime: number };
export type DriveInput =
  | { kind: 'injection'; eps: number }
  | { kind: 'velocity'; U: number }
  | { kind: 'baroclinic'; shear: number; depthRatio?: number };
export type GridInput = { kind: 'points'; nx: number; ny: number } | { kind: 'spacing'; dx: number; dy: number };

export interface PlanInput {
  units: UnitSystem;
  /** A name for the plan (shown in reports; free text). */
  title?: string;
  rotation: RotationInput;
  deformation: DeformationInput;
  drive: DriveInput;
  dragTime: number;
  forcing: { wavelength: number; halfWidth: number };
  domain: { Lx: number; Ly: number };
  grid: GridInput;
  hyperviscosity: { order: number; gridDampingTime: number };
  runLength: number;
  cfl?: number;
  rhines?: RhinesConvention;
}

export { PLAN_SIZE_MAX, PLAN_SIZE_MIN, pointsForSpacing } from './gridPoints';

function positive(what: string) {
  const range = `${what}: a finite number > 0`;
  return v.pipe(
    v.number(range),
    v.check((x) => Number.isFinite(x) && x > 0, `out of range (${range})`),
  );
}

function between(what: string, lo: number, hi: number, open: boolean) {
  const range = `${what}: a finite number ${open ? '>' : '≥'} ${lo} and ${open ? '<' : '≤'} ${hi}`;
  return v.pipe(
    v.number(range),
    v.check((x) => Number.isFinite(x) && (open ? x > lo && x < hi : x >= lo && x <= hi), `out of range (${range})`),
  );
}

const isPow2 = (n: number) => Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;
const points = (what: string) =>
  v.pipe(
    v.number(`${what}: a power of two from ${PLAN_SIZE_MIN} to ${PLAN_SIZE_MAX}`),
    v.check(
      (n) => isPow2(n) && n >= PLAN_SIZE_MIN && n <= PLAN_SIZE_MAX,
      `must be a power of two from ${PLAN_SIZE_MIN} to ${PLAN_SIZE_MAX}`,
    ),
  );

const kindOf = (options: string) => `must be one of ${options}`;

/** The valibot schema of a plan input (per field; cross-field rules are in `validatePlanInput`). */
export const PlanInputSchema = v.strictObject({
  units: v.picklist(['physical', 'model'], kindOf('"physical", "model"')),
  title: v.optional(v.pipe(v.string('a text'), v.maxLength(200, 'at most 200 characters'))),
  rotation: v.variant(
    'kind',
    [
      v.strictObject({
        kind: v.literal('planet'),
        planet: v.picklist(['earth', 'jupiter'], kindOf('"earth", "jupiter"')),
        latitudeDeg: between('latitude (degrees, planetocentric)', -90, 90, true),
      }),
      v.strictObject({ kind: v.literal('beta'), beta: positive('β'), f: v.optional(between('f', -1e30, 1e30, true)) }),
    ],
    kindOf('{ kind: "planet", planet, latitudeDeg } or { kind: "beta", beta, f? }'),
  ),
  deformation: v.variant(
    'kind',
    [
      v.strictObject({ kind: v.literal('none') }),
      v.strictObject({ kind: v.literal('radius'), Ld: positive('deformation radius L_d') }),
      v.strictObject({
        kind: v.literal('layer'),
        H: positive('layer depth H'),
        gPrime: positive('reduced gravity g′'),
      }),
    ],
    kindOf('{ kind: "none" }, { kind: "radius", Ld } or { kind: "layer", H, gPrime }'),
  ),
  drive: v.variant(
    'kind',
    [
      v.strictObject({ kind: v.literal('injection'), eps: positive('energy injection rate ε') }),
      v.strictObject({ kind: v.literal('velocity'), U: positive('target rms velocity U') }),
      v.strictObject({
        kind: v.literal('baroclinic'),
        shear: positive('vertical shear U₁ − U₂'),
        depthRatio: v.optional(between('depth ratio δ = H₁/H₂', 1e-3, 1e3, false)),
      }),
    ],
    kindOf('{ kind: "injection", eps }, { kind: "velocity", U } or { kind: "baroclinic", shear, depthRatio? }'),
  ),
  dragTime: positive('drag damping time 1/μ'),
  forcing: v.strictObject({
    wavelength: positive('forcing wavelength λ_f'),
    halfWidth: between('annulus half-width δk/k_f', 0, 1, true),
  }),
  domain: v.strictObject({ Lx: positive('domain length Lx'), Ly: positive('domain length Ly') }),
  grid: v.variant(
    'kind',
    [
      v.strictObject({ kind: v.literal('points'), nx: points('nx'), ny: points('ny') }),
      v.strictObject({ kind: v.literal('spacing'), dx: positive('grid spacing dx'), dy: positive('grid spacing dy') }),
    ],
    kindOf('{ kind: "points", nx, ny } or { kind: "spacing", dx, dy }'),
  ),
  hyperviscosity: v.strictObject({
    order: v.pipe(
      v.number('hyperviscosity order p: an integer from 1 to 8'),
      v.check((p) => Number.isInteger(p) && p >= 1 && p <= 8, 'must be an integer from 1 to 8'),
    ),
    gridDampingTime: positive('damping time at the grid scale τ'),
  }),
  runLength: positive('run length'),
  cfl: v.optional(
    v.pipe(
      v.number('CFL number'),
      v.check((c) => Number.isFinite(c) && c > 0 && c <= 1.2, 'out of range (CFL number: > 0 and ≤ 1.2)'),
    ),
  ),
  rhines: v.optional(
    v.picklist(
      Object.keys(RHINES_DEFINITIONS) as RhinesConvention[],
      kindOf(
        Object.keys(RHINES_DEFINITIONS)
          .map((k) => `"${k}"`)
          .join(', '),
      ),
    ),
  ),
});

/** The message of a field the plan needs and does not have (see `missingFields`). */
export const MISSING = 'is missing';

/**
 * The fields an InputError of `validatePlanInput` says are missing, or [] when something else is
 * wrong: a caller can then say in one line what an incomplete plan lacks.
 */
export function missingFields(issues: readonly InputIssue[]): string[] {
  return issues.filter((i) => i.message === MISSING).map((i) => i.field);
}

/** The plan input with defaults filled (cfl, rhines), as every other planner module receives it. */
export type ValidPlanInput = PlanInput & { cfl: number; rhines: RhinesConvention };

/**
 * Check a plan input field by field and across fields; return it with defaults filled. Throws
 * an InputError of source 'plan input' naming each bad field, its value and the allowed range.
 */
export function validatePlanInput(input: unknown): ValidPlanInput {
  const parsed = v.safeParse(PlanInputSchema, input);
  if (!parsed.success) {
    throw new InputError(
      'plan input',
      parsed.issues.map((issue) => {
        const field = issue.path?.map((p) => String(p.key)).join('.') ?? '(plan)';
        const strict = issue.type === 'strict_object' && issue.kind === 'schema';
        const unknownKey = strict && issue.expected === 'never';
        const missing = strict && !unknownKey && issue.received === 'undefined';
        return {
          field,
          value: issue.input,
          message: unknownKey ? 'is not a plan field' : missing ? MISSING : issue.message,
        };
      }),
    );
  }
  const p = parsed.output as PlanInput;
  const issues: InputIssue[] = [];
  if (p.units === 'model' && p.rotation.kind === 'planet') {
    issues.push({
      field: 'rotation.kind',
      value: 'planet',
      message: 'a planet gives f and β in SI units: use units "physical", or give β in model units',
    });
  }
  if (p.deformation.kind === 'layer') {
    const f = p.rotation.kind === 'planet' ? NaN : p.rotation.f;
    const atEquator = p.rotation.kind === 'planet' && p.rotation.latitudeDeg === 0;
    if ((p.rotation.kind === 'beta' && (f === undefined || f === 0)) || atEquator) {
      issues.push({
        field: 'deformation.kind',
        value: 'layer',
        message:
          'L_d = √(g′H)/|f| needs f ≠ 0: give the rotation as a planet off the equator, give f, or give L_d directly',
      });
    }
  }
  if (p.drive.kind === 'baroclinic' && p.deformation.kind === 'none') {
    issues.push({
      field: 'deformation.kind',
      value: 'none',
      message:
        'a baroclinic drive needs a deformation radius (two layers): give L_d, or a layer depth H and reduced gravity g′',
    });
  }
  if (p.grid.kind === 'spacing') {
    for (const [axis, L, d] of [
      ['dx', p.domain.Lx, p.grid.dx],
      ['dy', p.domain.Ly, p.grid.dy],
    ] as const) {
      const n = pointsForSpacing(L, d);
      if (n > PLAN_SIZE_MAX) {
        issues.push({
          field: `grid.${axis}`,
          value: d,
          message: `needs ${n} points across the domain, more than ${PLAN_SIZE_MAX}: widen the spacing or shrink the domain`,
        });
      }
    }
  }
  if (issues.length) throw new InputError('plan input', issues);
  const valid: ValidPlanInput = { ...p, cfl: p.cfl ?? THRESHOLDS.defaultCfl, rhines: p.rhines ?? 'kR' };
  const overflow = nonFinitePredictions(valid);
  if (overflow.length) throw new InputError('plan input', overflow);
  return valid;
}

/**
 * The input fields each prediction is worked out from (dotted prefixes: every number under one
 * counts). Each field alone may be a fine double, yet products and powers of a few of them leave
 * the doubles (a drag time of 5e-324 makes μ infinite, β = 5e-324 with a long drag time makes R_β
 * 0·∞), and a plan with a NaN or infinite prediction tells nothing.
 */
const SOURCES: Record<PredictionId, readonly string[]> = (() => {
  const speed = ['drive', 'dragTime'];
  const rhines = ['rotation', ...speed];
  const step = ['cfl', 'grid', 'domain', ...speed];
  return {
    U: speed,
    kR: rhines,
    rhines_kR: rhines,
    rhines_sqrtUbeta: rhines,
    rhines_piOverKR: rhines,
    rhines_twoPiSqrtUbeta: rhines,
    kBeta: rhines,
    kFric: speed,
    eta: ['drive', 'dragTime', 'forcing.wavelength'],
    kNu: ['drive', 'dragTime', 'forcing.wavelength', 'hyperviscosity', 'grid', 'domain'],
    R_beta: rhines,
    regime: rhines,
    jetSpacingRhines: rhines,
    jetSpacingStaircase: rhines,
    jetsRhines: [...rhines, 'domain.Ly'],
    jetsStaircase: [...rhines, 'domain.Ly'],
    spinUpTime: ['dragTime'],
    steadyTime: ['dragTime'],
    turnoverForcing: ['drive', 'dragTime', 'forcing.wavelength'],
    peakSpeed: speed,
    dtCFL: step,
    stepsToSteady: step,
    stepsPlanned: [...step, 'runLength'],
  };
})();

/**
 * One issue per input field blamed for a non-finite prediction: among the numbers a prediction comes
 * from, the one farthest from 1 in order of magnitude (the subnormal or the huge one, as a rule).
 */
function nonFinitePredictions(p: ValidPlanInput): InputIssue[] {
  const predictions = predictPlan(derivePlan(p));
  const blamed = new Map<string, string[]>();
  for (const [id, pr] of Object.entries(predictions) as [PredictionId, (typeof predictions)[PredictionId]][]) {
    if (Number.isFinite(pr.value)) continue;
    const leaves = numberLeaves(p).filter(([path]) => SOURCES[id].some((s) => path === s || path.startsWith(`${s}.`)));
    const worst = leaves.reduce(
      (a, b) => (Math.abs(Math.log10(Math.abs(b[1]))) > Math.abs(Math.log10(Math.abs(a[1]))) ? b : a),
      leaves[0] ?? ['(plan)', NaN],
    );
    const list = blamed.get(worst[0]) ?? [];
    list.push(`${pr.symbol} = ${pr.value}`);
    blamed.set(worst[0], list);
  }
  return [...blamed].map(([field, what]) => ({
    field,
    value: field === '(plan)' ? null : numberLeaves(p).find(([path]) => path === field)?.[1],
    message: `out of range: with the other inputs it gives the non-finite prediction${what.length === 1 ? '' : 's'} ${what.join(', ')} (too small or too large for double precision)`,
  }));
}

/** Every number in the input, with its dotted path (hyperviscosity.order and the grid's points included). */
function numberLeaves(x: unknown, prefix = ''): [string, number][] {
  if (typeof x === 'number') return [[prefix, x]];
  if (typeof x !== 'object' || x === null) return [];
  return Object.entries(x).flatMap(([k, v]) => numberLeaves(v, prefix ? `${prefix}.${k}` : k));
}
