import { SIZE_MAX, SIZE_MIN, type ModelParams } from '../../lib/model/params';
import { keptRadius } from '../../lib/model/validateParams';

/** Parameters entered as numbers (the rest are choices: forcing kind, zonal forcing, scheme). */
export type NumericParam = { [K in keyof ModelParams]: ModelParams[K] extends number ? K : never }[keyof ModelParams];

/**
 * How one parameter is shown: its symbol, a plain name, its unit in model units (L length, T time)
 * and the range it may take. The ranges restate lib/model/validateParams.ts, which remains the judge:
 * every entry is checked there before it is sent.
 */
export interface ParamFieldSpec {
  key: NumericParam;
  symbol: string;
  name: string;
  unit: string;
  /** The allowed values, in words; some depend on the other parameters (the grid, mostly). */
  range: (p: ModelParams) => string;
  /** Offered as a list of values instead of free entry. */
  choices?: readonly number[];
  /** When the change takes effect, if not at once. */
  note?: string;
}

export interface ParamGroup {
  title: string;
  fields: readonly (ParamFieldSpec | ChoiceFieldSpec)[];
}

/** A parameter chosen from named options. */
export interface ChoiceFieldSpec {
  key: 'forcing' | 'force_zonal';
  symbol: string;
  name: string;
  options: readonly { value: string | boolean; label: string }[];
}

const SIZES = Array.from({ length: Math.log2(SIZE_MAX / SIZE_MIN) + 1 }, (_, i) => SIZE_MIN << i);
const fmt = (x: number) => Number(x.toPrecision(4)).toString();
const kMaxText = (p: ModelParams) => fmt(keptRadius(p));

export const PARAM_GROUPS: readonly ParamGroup[] = [
  {
    title: 'Domain and grid',
    fields: [
      {
        key: 'Lx',
        symbol: 'Lx',
        name: 'domain length',
        unit: 'L',
        range: () => '> 0',
        note: 'a new domain starts the run afresh',
      },
      {
        key: 'Ly',
        symbol: 'Ly',
        name: 'domain width',
        unit: 'L',
        range: () => '> 0',
        note: 'a new domain starts the run afresh',
      },
      {
        key: 'nx',
        symbol: 'nx',
        name: 'grid points in x',
        unit: '',
        range: () => `power of two, ${SIZE_MIN}–${SIZE_MAX}`,
        choices: SIZES,
        note: 'the state is carried over, truncated or padded',
      },
      {
        key: 'ny',
        symbol: 'ny',
        name: 'grid points in y',
        unit: '',
        range: () => `power of two, ${SIZE_MIN}–${SIZE_MAX}`,
        choices: SIZES,
        note: 'the state is carried over, truncated or padded',
      },
    ],
  },
  {
    title: 'β-plane',
    fields: [
      { key: 'beta', symbol: 'β', name: 'planetary vorticity gradient', unit: 'L⁻¹T⁻¹', range: () => '≥ 0' },
      {
        key: 'kd',
        symbol: 'k_d',
        name: 'deformation wavenumber 1/L_d',
        unit: 'L⁻¹',
        range: (p) => (p.layers === 2 ? '> 0 (two layers need it)' : '≥ 0 (0: no deformation radius)'),
      },
    ],
  },
  {
    title: 'Layers',
    fields: [
      {
        key: 'layers',
        symbol: 'layers',
        name: 'number of layers (2: eddies from an imposed shear, docs/two-layer.md)',
        unit: '',
        range: () => '1 or 2 (2 needs k_d > 0)',
        choices: [1, 2],
        note: 'a new number of layers starts the run afresh',
      },
      {
        key: 'shear',
        symbol: 'U₁ − U₂',
        name: 'vertical shear of the imposed zonal flow',
        unit: 'LT⁻¹',
        range: (p) => (p.layers === 2 ? 'any' : '0 with one layer'),
      },
      {
        key: 'depth_ratio',
        symbol: 'δ',
        name: 'depth ratio H₁/H₂ of the upper to the lower layer',
        unit: '',
        range: (p) => (p.layers === 2 ? '0.001–1000' : '1 with one layer'),
      },
    ],
  },
  {
    title: 'Forcing',
    fields: [
      {
        key: 'forcing',
        symbol: 'F',
        name: 'kind',
        options: [
          { value: 'stochastic', label: 'stochastic (white in time)' },
          { value: 'steady', label: 'steady pattern' },
          { value: 'none', label: 'none (decaying)' },
        ],
      },
      {
        key: 'kf',
        symbol: 'k_f',
        name: 'forcing wavenumber',
        unit: 'L⁻¹',
        range: (p) => `> 0, k_f + δk ≤ ${kMaxText(p)} on this grid`,
      },
      {
        key: 'dkf',
        symbol: 'δk',
        name: 'forcing half-width',
        unit: 'L⁻¹',
        range: (p) => `> 0, k_f − δk ≥ ${fmt((2 * Math.PI) / Math.max(p.Lx, p.Ly))}`,
      },
      { key: 'eps', symbol: 'ε', name: 'energy injection rate', unit: 'L²T⁻³', range: () => '≥ 0' },
      {
        key: 'force_zonal',
        symbol: 'kx = 0',
        name: 'zonal modes',
        options: [
          { value: true, label: 'forced' },
          { value: false, label: 'left unforced' },
        ],
      },
    ],
  },
  {
    title: 'Dissipation',
    fields: [
      {
        key: 'mu',
        symbol: 'μ',
        name: 'linear drag',
        unit: 'T⁻¹',
        range: (p) =>
          (p.forcing === 'steady' ? '> 0 (steady forcing needs drag)' : '≥ 0') +
          (p.layers === 2 ? '; with two layers on the lower layer only' : ''),
      },
      { key: 'nu', symbol: 'ν', name: 'hyperviscosity', unit: 'L²ᵖT⁻¹', range: () => '≥ 0' },
      {
        key: 'nu_order',
        symbol: 'p',
        name: 'hyperviscosity order, ν(−∇²)ᵖ',
        unit: '',
        range: () => 'integer, 1–8',
        choices: [1, 2, 3, 4, 5, 6, 7, 8],
      },
      { key: 'mu_ls', symbol: 'μ_ls', name: 'large-scale drag', unit: 'T⁻¹', range: () => '≥ 0 (0: off)' },
      {
        key: 'k_ls',
        symbol: 'k_ls',
        name: 'large-scale drag cutoff',
        unit: 'L⁻¹',
        range: (p) => `≥ 0, below ${kMaxText(p)} when μ_ls > 0`,
      },
    ],
  },
  {
    title: 'Numerics',
    fields: [
      { key: 'dt', symbol: 'dt', name: 'time step (the largest, when adaptive)', unit: 'T', range: () => '> 0' },
      { key: 'cfl', symbol: 'CFL', name: 'target CFL number', unit: '', range: () => '0–1.2 (0: fixed dt)' },
      {
        key: 'seed',
        symbol: 'seed',
        name: 'random seed',
        unit: '',
        range: () => 'integer, 0–4294967295',
        note: 'a new seed starts a new random stream',
      },
      {
        key: 'init_energy',
        symbol: 'E₀',
        name: 'initial energy',
        unit: 'L²T⁻²',
        range: () => '≥ 0',
        note: 'used when the run starts (reset)',
      },
    ],
  },
];

export function isChoice(f: ParamFieldSpec | ChoiceFieldSpec): f is ChoiceFieldSpec {
  return 'options' in f;
}
