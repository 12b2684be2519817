import type { PlanInput, UnitSystem } from '../../lib/plan/planInput';

/** What a plan field measures, for its unit. */
export type FieldDimension =
  'length' | 'time' | 'velocity' | 'injection' | 'beta' | 'rate' | 'acceleration' | 'degrees' | 'fraction' | 'none';

const PHYSICAL: Record<FieldDimension, string> = {
  length: 'm',
  time: 's',
  velocity: 'm/s',
  injection: 'W/kg = m²/s³',
  beta: '1/(m·s)',
  rate: '1/s',
  acceleration: 'm/s²',
  degrees: '°',
  fraction: 'of k_f',
  none: '',
};
const MODEL: Record<FieldDimension, string> = {
  length: 'L',
  time: 'T',
  velocity: 'L/T',
  injection: 'L²/T³',
  beta: '1/(L·T)',
  rate: '1/T',
  acceleration: 'L/T²',
  degrees: '°',
  fraction: 'of k_f',
  none: '',
};

export function fieldUnit(d: FieldDimension, units: UnitSystem): string {
  return (units === 'physical' ? PHYSICAL : MODEL)[d];
}

/** One numeric entry of the plan: its dotted path in PlanInput (as a refused input's issues name it), label and dimension. */
export interface PlanFieldSpec {
  path: string;
  label: string;
  dim: FieldDimension;
  hint?: string;
  /** May be left empty. */
  optional?: boolean;
}

/** The numeric fields of each choice, by the part of the input they belong to. */
export const CHOICE_FIELDS: Record<string, Record<string, PlanFieldSpec[]>> = {
  rotation: {
    planet: [
      {
        path: 'rotation.latitudeDeg',
        label: 'latitude φ',
        dim: 'degrees',
        hint: 'planetocentric, on a spherical planet; f = 2Ω sin φ, β = 2Ω cos φ/R',
      },
    ],
    beta: [
      { path: 'rotation.beta', label: 'β', dim: 'beta' },
      {
        path: 'rotation.f',
        label: 'f (optional)',
        dim: 'rate',
        hint: 'needed only for a layer deformation radius',
        optional: true,
      },
    ],
  },
  deformation: {
    none: [],
    radius: [{ path: 'deformation.Ld', label: 'deformation radius L_d', dim: 'length' }],
    layer: [
      { path: 'deformation.H', label: 'layer depth H', dim: 'length' },
      { path: 'deformation.gPrime', label: 'reduced gravity g′', dim: 'acceleration', hint: 'L_d = √(g′H)/|f|' },
    ],
  },
  drive: {
    injection: [{ path: 'drive.eps', label: 'energy injection rate ε', dim: 'injection' }],
    velocity: [{ path: 'drive.U', label: 'target rms velocity U', dim: 'velocity', hint: 'then ε = μU²' }],
    baroclinic: [
      {
        path: 'drive.shear',
        label: 'imposed shear U_1 − U_2',
        dim: 'velocity',
        hint: 'two layers, no stirring; needs a deformation radius',
      },
      {
        path: 'drive.depthRatio',
        label: 'depth ratio δ = H_1/H_2 (optional)',
        dim: 'none',
        hint: 'empty: equal layers, δ = 1',
        optional: true,
      },
    ],
  },
  grid: {
    points: [],
    spacing: [
      { path: 'grid.dx', label: 'largest spacing dx', dim: 'length' },
      { path: 'grid.dy', label: 'largest spacing dy', dim: 'length' },
    ],
  },
};

/** Fields every plan has. */
export const COMMON_FIELDS: PlanFieldSpec[] = [
  { path: 'dragTime', label: 'drag damping time 1/μ', dim: 'time' },
  { path: 'forcing.wavelength', label: 'forcing wavelength λ_f', dim: 'length', hint: 'k_f = 2π/λ_f' },
  { path: 'forcing.halfWidth', label: 'annulus half-width δk/k_f', dim: 'fraction' },
  { path: 'domain.Lx', label: 'domain length Lx', dim: 'length' },
  { path: 'domain.Ly', label: 'domain width Ly (across the jets)', dim: 'length' },
  {
    path: 'hyperviscosity.gridDampingTime',
    label: 'damping time at the grid scale τ',
    dim: 'time',
    hint: 'ν = 1/(τ k_max^{2p})',
  },
  { path: 'runLength', label: 'run length', dim: 'time' },
];

/** The kinds of each choice, with their labels, and the values a newly chosen kind starts from. */
export const KINDS = {
  rotation: [
    { kind: 'planet', label: 'a planet and latitude' },
    { kind: 'beta', label: 'β directly' },
  ],
  deformation: [
    { kind: 'none', label: 'none (barotropic)' },
    { kind: 'radius', label: 'a deformation radius' },
    { kind: 'layer', label: 'a layer: depth and reduced gravity' },
  ],
  drive: [
    { kind: 'injection', label: 'energy injection rate ε' },
    { kind: 'velocity', label: 'target rms velocity U' },
    { kind: 'baroclinic', label: 'baroclinic (imposed shear)' },
  ],
  grid: [
    { kind: 'points', label: 'grid points' },
    { kind: 'spacing', label: 'largest grid spacing' },
  ],
} as const;

export type ChoiceKey = keyof typeof KINDS;

/** A starting value for a newly chosen kind: the numbers it needs, sized from the rest of the plan. */
export function freshChoice(key: ChoiceKey, kind: string, input: PlanInput): unknown {
  const L = input.domain.Ly;
  switch (`${key}.${kind}`) {
    case 'rotation.planet':
      return { kind, planet: 'earth', latitudeDeg: 45 };
    case 'rotation.beta':
      return { kind, beta: input.units === 'physical' ? 1.6e-11 : 10 };
    case 'deformation.radius':
      return { kind, Ld: L / 20 };
    case 'deformation.layer':
      return { kind, H: input.units === 'physical' ? 1000 : 1, gPrime: input.units === 'physical' ? 0.02 : 1 };
    case 'drive.injection':
      return { kind, eps: input.units === 'physical' ? 1e-5 : 0.01 };
    case 'drive.velocity':
      return { kind, U: input.units === 'physical' ? 10 : 1 };
    case 'drive.baroclinic':
      return { kind, shear: input.units === 'physical' ? 10 : 2 };
    case 'grid.points':
      return { kind, nx: 256, ny: 256 };
    case 'grid.spacing':
      return { kind, dx: input.domain.Lx / 256, dy: L / 256 };
    default:
      return { kind };
  }
}

/**
 * The input with `key` switched to a fresh `kind`. A baroclinic drive needs a deformation radius
 * (the layers' coupling), so choosing it on a barotropic plan also gives the plan one.
 */
export function chooseKind(input: PlanInput, key: ChoiceKey, kind: string): PlanInput {
  const next = setPath(input, key, freshChoice(key, kind, input));
  if (key === 'drive' && kind === 'baroclinic' && next.deformation.kind === 'none')
    return setPath(next, 'deformation', freshChoice('deformation', 'radius', next));
  return next;
}

/** The value at a dotted path. */
export function getPath(input: unknown, path: string): unknown {
  return path
    .split('.')
    .reduce<unknown>((o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined), input);
}

/** A copy of the input with the value at `path` replaced (the objects on the way copied, the rest shared). */
export function setPath<T>(input: T, path: string, value: unknown): T {
  const [head, ...rest] = path.split('.');
  const obj = { ...(input as Record<string, unknown>) };
  obj[head] = rest.length ? setPath(obj[head], rest.join('.'), value) : value;
  return obj as T;
}
