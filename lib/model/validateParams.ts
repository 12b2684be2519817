import * as v from 'valibot';
import { InputError, type InputIssue } from '../inputError';
import { DEFAULT_PARAMS, ONE_LAYER_VALUES, SIZE_MAX, SIZE_MIN, type ModelParams } from './params';

const isPow2 = (n: number) => Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;

function real(what: string, min: number, max: number, exclusiveMin = false) {
  const range = `${what}: a finite number ${exclusiveMin ? '>' : '≥'} ${min}${max < Infinity ? ` and ≤ ${max}` : ''}`;
  return v.pipe(
    v.number(`${range}`),
    v.check((x) => Number.isFinite(x), `must be finite (${range})`),
    v.check((x) => (exclusiveMin ? x > min : x >= min) && x <= max, `out of range (${range})`),
  );
}

const size = v.pipe(
  v.number('grid points: a power of two from 32 to 1024'),
  v.check((n) => isPow2(n) && n >= SIZE_MIN && n <= SIZE_MAX, `must be a power of two from ${SIZE_MIN} to ${SIZE_MAX}`),
);

/** The per-field schema; cross-field rules follow in `validateParams`. */
export const ModelParamsSchema = v.strictObject({
  Lx: real('domain length Lx', 0, 1e12, true),
  Ly: real('domain length Ly', 0, 1e12, true),
  nx: size,
  ny: size,
  beta: real('β', 0, 1e12),
  kd: real('deformation wavenumber k_d', 0, 1e12),
  mu: real('linear drag μ', 0, 1e6),
  nu: real('hyperviscosity ν', 0, 1e300),
  nu_order: v.pipe(
    v.number('hyperviscosity order p: an integer from 1 to 8'),
    v.check((p) => Number.isInteger(p) && p >= 1 && p <= 8, 'must be an integer from 1 to 8'),
  ),
  mu_ls: real('large-scale drag μ_ls', 0, 1e6),
  k_ls: real('large-scale drag cutoff k_ls', 0, 1e12),
  forcing: v.picklist(['stochastic', 'steady', 'none'], 'must be one of "stochastic", "steady", "none"'),
  kf: real('forcing wavenumber k_f', 0, 1e12, true),
  dkf: real('forcing half-width δk', 0, 1e12, true),
  eps: real('energy injection rate ε', 0, 1e12),
  force_zonal: v.boolean('must be true or false'),
  dt: real('time step dt', 0, 1e12, true),
  cfl: real('CFL number (0 keeps dt fixed)', 0, 1.2),
  seed: v.pipe(
    v.number('seed: an integer from 0 to 4294967295'),
    v.check((s) => Number.isInteger(s) && s >= 0 && s <= 0xffffffff, 'must be an integer from 0 to 4294967295'),
  ),
  init_energy: real('initial energy', 0, 1e12),
  scheme: v.picklist(['ifrk4'], 'must be "ifrk4"'),
  layers: v.pipe(
    v.number('number of layers: 1 or 2'),
    v.check((n) => n === 1 || n === 2, 'must be 1 or 2'),
  ),
  shear: real('vertical shear U₁ − U₂', -1e12, 1e12),
  depth_ratio: real('depth ratio δ = H₁/H₂', 1e-3, 1e3),
});

/** Largest wavenumber magnitude whose whole disc survives the 2/3 rule on this grid. */
export function keptRadius(p: Pick<ModelParams, 'nx' | 'ny' | 'Lx' | 'Ly'>): number {
  return Math.min(((2 * Math.PI) / p.Lx) * Math.floor(p.nx / 3), ((2 * Math.PI) / p.Ly) * Math.floor(p.ny / 3));
}

/**
 * Complete `input` with the defaults, check every field and the rules between fields, and return
 * parameters the model can trust. Throws an InputError of source 'parameters' naming each bad field,
 * its value and its range.
 */
export function validateParams(input: unknown, base: Readonly<ModelParams> = DEFAULT_PARAMS): ModelParams {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    throw new InputError('parameters', [
      { field: '(parameters)', value: input, message: 'must be an object of named parameters' },
    ]);
  }
  const merged = { ...base, ...(input as Record<string, unknown>) };
  const parsed = v.safeParse(ModelParamsSchema, merged);
  if (!parsed.success) {
    throw new InputError(
      'parameters',
      parsed.issues.map((issue) => {
        const key = issue.path?.map((p) => String(p.key)).join('.') ?? '(parameters)';
        const unknownKey = issue.kind === 'schema' && issue.type === 'strict_object';
        return {
          field: key,
          value: unknownKey ? key : issue.input,
          message: unknownKey ? `is not a parameter (known: ${Object.keys(DEFAULT_PARAMS).join(', ')})` : issue.message,
        };
      }),
    );
  }
  const p = parsed.output as ModelParams;
  const issues: InputIssue[] = [];
  const kMax = keptRadius(p);
  const dkMin = Math.min((2 * Math.PI) / p.Lx, (2 * Math.PI) / p.Ly);
  if (p.forcing !== 'none') {
    if (p.kf + p.dkf > kMax) {
      issues.push({
        field: 'kf',
        value: p.kf,
        message: `forcing annulus k_f + δk = ${fmt(p.kf + p.dkf)} lies beyond the dealiased range: needs k_f + δk ≤ ${fmt(kMax)} on this grid`,
      });
    }
    if (p.kf - p.dkf < dkMin) {
      issues.push({
        field: 'dkf',
        value: p.dkf,
        message: `forcing annulus reaches below the smallest wavenumber: needs k_f − δk ≥ ${fmt(dkMin)}`,
      });
    }
    if (issues.length === 0 && !annulusHoldsModes(p)) {
      issues.push({
        field: 'dkf',
        value: p.dkf,
        message: `the annulus |k − k_f| ≤ δk holds no grid wavenumber: widen δk or move k_f`,
      });
    }
  }
  if (p.cfl > 0 && p.cfl < 0.01) {
    issues.push({ field: 'cfl', value: p.cfl, message: 'a CFL target must be 0 (fixed dt) or from 0.01 to 1.2' });
  }
  if (p.forcing === 'steady' && !(p.mu > 0)) {
    issues.push({
      field: 'mu',
      value: p.mu,
      message: 'steady forcing needs linear drag μ > 0 (its strength is the energy it would inject against drag)',
    });
  }
  if (p.mu_ls > 0 && p.k_ls >= kMax) {
    issues.push({
      field: 'k_ls',
      value: p.k_ls,
      message: `large-scale drag cutoff must lie below the dealiased range, < ${fmt(kMax)}`,
    });
  }
  if (p.layers === 2 && !(p.kd > 0)) {
    issues.push({
      field: 'kd',
      value: p.kd,
      message: 'two layers need a deformation wavenumber k_d > 0 (the interface couples the layers through it)',
    });
  }
  if (p.layers === 1) {
    for (const key of ['shear', 'depth_ratio'] as const) {
      if (p[key] !== ONE_LAYER_VALUES[key])
        issues.push({
          field: key,
          value: p[key],
          message: `applies to two layers only: set layers = 2, or leave it at ${ONE_LAYER_VALUES[key]}`,
        });
    }
  }
  if (issues.length) throw new InputError('parameters', issues);
  return p;
}

/** True when some kept wavenumber (2πi/Lx, 2πj/Ly) lies on the forcing annulus. */
function annulusHoldsModes(p: ModelParams): boolean {
  const dkx = (2 * Math.PI) / p.Lx;
  const dky = (2 * Math.PI) / p.Ly;
  const Kx = Math.floor(p.nx / 3);
  const Ky = Math.floor(p.ny / 3);
  for (let i = 0; i <= Kx; i++) {
    for (let j = i === 0 ? 1 : -Ky; j <= Ky; j++) {
      if (i === 0 && !p.force_zonal) break;
      // As the forcing computes it (grid.ts k², forcing.ts): the same modes, and the same answer on
      // every engine (Math.hypot is implementation-approximated; √ of a sum of products is exact IEEE).
      const kx = dkx * i;
      const ky = dky * j;
      const k = Math.sqrt(kx * kx + ky * ky);
      if (Math.abs(k - p.kf) <= p.dkf) return true;
    }
  }
  return false;
}

function fmt(x: number): string {
  return Number(x.toPrecision(6)).toString();
}
