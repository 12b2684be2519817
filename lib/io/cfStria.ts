import { striaGlobalAttributes, type StriaFileKind, type StriaRunInfo } from './cfGlobalAttributes';
import {
  MODEL_UNITS,
  modelDimensionLabel,
  unitScale,
  unitsString,
  type Medium,
  type ModelDimension,
  type UnitSystem,
} from './cfUnits';
import {
  ncText,
  type NcAttribute,
  type NcDimension,
  type NcFile,
  type NcFormat,
  type NcVariable,
} from './netcdf3Types';

/**
 * The data contract of Stria's NetCDF files (CF Conventions 1.8), as tables: which variables a file
 * holds, their dimensions, long names, model dimensions and, where one truly exists, CF standard
 * names. docs/file-formats.md states the same contract for people; the tests hold the two together.
 *
 * Standard names. Stria's flow is idealised and medium-agnostic, so in model units no variable
 * carries a standard_name (nothing in the CF table means "nondimensional beta-plane velocity").
 * When the caller gives physical units and a medium, the fields that have a CF standard name get
 * it. The names below are recalled from the CF standard name table, not looked up at run time:
 * eastward_wind, northward_wind, atmosphere_relative_vorticity, atmosphere_horizontal_streamfunction
 * (atmosphere); eastward_sea_water_velocity, northward_sea_water_velocity (ocean). PV, eddy fluxes
 * and zonal means get none. The time coordinate gets neither standard_name nor axis: CF 4.4 requires
 * a reference time ("s since …") of a time coordinate, and a run has no calendar date.
 */
export interface FieldSpec {
  name: string;
  longName: string;
  dim: ModelDimension;
  standardName?: Partial<Record<Medium, string>>;
  /** In a file with a layer dimension: false for a field of the interface, which has none. */
  perLayer?: boolean;
}

/** Gridded fields of a snapshot file, each (time, y, x). */
export const SNAPSHOT_FIELDS: readonly FieldSpec[] = [
  {
    name: 'q',
    longName: 'potential vorticity anomaly q = laplacian(psi) - kd^2 psi (without beta y)',
    dim: { L: 0, T: -1 },
  },
  {
    name: 'zeta',
    longName: 'relative vorticity zeta = laplacian(psi)',
    dim: { L: 0, T: -1 },
    standardName: { atmosphere: 'atmosphere_relative_vorticity' },
  },
  {
    name: 'psi',
    longName: 'streamfunction psi (u = -dpsi/dy, v = dpsi/dx)',
    dim: { L: 2, T: -1 },
    standardName: { atmosphere: 'atmosphere_horizontal_streamfunction' },
  },
  {
    name: 'u',
    longName: 'zonal (eastward, +x) velocity u = -dpsi/dy',
    dim: { L: 1, T: -1 },
    standardName: { atmosphere: 'eastward_wind', ocean: 'eastward_sea_water_velocity' },
  },
  {
    name: 'v',
    longName: 'meridional (northward, +y) velocity v = dpsi/dx',
    dim: { L: 1, T: -1 },
    standardName: { atmosphere: 'northward_wind', ocean: 'northward_sea_water_velocity' },
  },
];

/** Zonal-mean profiles of a zonal-mean file, each (time, y); [.] is the mean over x, primes deviations from it. */
export const ZONAL_MEAN_FIELDS: readonly FieldSpec[] = [
  { name: 'ubar', longName: 'zonal-mean zonal velocity [u]', dim: { L: 1, T: -1 } },
  { name: 'qbar', longName: 'zonal-mean total potential vorticity [q] + beta y', dim: { L: 0, T: -1 } },
  { name: 'upvp', longName: "eddy momentum flux [u'v']", dim: { L: 2, T: -2 } },
  { name: 'vpqp', longName: "eddy potential vorticity flux [v'q']", dim: { L: 1, T: -2 } },
  { name: 'eke', longName: "eddy kinetic energy per unit mass [u'^2 + v'^2] / 2", dim: { L: 2, T: -2 } },
];

/** The dimensions of a field after time: the layer (two-layer files only), then y, then x. */
export type SpatialDimension = 'layer' | 'y' | 'x';

export interface StriaFileKindSpec {
  kind: StriaFileKind;
  title: string;
  fields: readonly FieldSpec[];
  /** Spatial dimensions of each field after time, slowest first ('layer' in two-layer files). */
  spatial: readonly SpatialDimension[];
}

/**
 * Two-layer snapshot fields, each (time, layer, y, x): the fields of each layer, layer 1 the upper
 * (docs/two-layer.md). The barotropic (depth-weighted) field is Σ_i layer_fraction_i · f_i.
 */
export const TWO_LAYER_SNAPSHOT_FIELDS: readonly FieldSpec[] = [
  {
    name: 'q',
    longName:
      'potential vorticity anomaly of each layer q_i = laplacian(psi_i) + F_i (psi_j - psi_i) (without beta y and the imposed shear)',
    dim: { L: 0, T: -1 },
  },
  { name: 'zeta', longName: 'relative vorticity of each layer zeta_i = laplacian(psi_i)', dim: { L: 0, T: -1 } },
  {
    name: 'psi',
    longName: 'streamfunction of each layer psi_i (u_i = -dpsi_i/dy, v_i = dpsi_i/dx), without the imposed flow',
    dim: { L: 2, T: -1 },
  },
  {
    name: 'u',
    longName: 'zonal (eastward, +x) velocity of each layer u_i = -dpsi_i/dy, without the imposed flow U_i',
    dim: { L: 1, T: -1 },
    standardName: { atmosphere: 'eastward_wind', ocean: 'eastward_sea_water_velocity' },
  },
  {
    name: 'v',
    longName: 'meridional (northward, +y) velocity of each layer v_i = dpsi_i/dx',
    dim: { L: 1, T: -1 },
    standardName: { atmosphere: 'northward_wind', ocean: 'northward_sea_water_velocity' },
  },
];

/** Two-layer zonal-mean profiles: (time, layer, y) of each layer, and the interface's heat flux (time, y). */
export const TWO_LAYER_ZONAL_MEAN_FIELDS: readonly FieldSpec[] = [
  {
    name: 'ubar',
    longName: 'zonal-mean zonal velocity of each layer [u_i], without the imposed flow',
    dim: { L: 1, T: -1 },
  },
  {
    name: 'qbar',
    longName: 'zonal-mean total potential vorticity of each layer [q_i] + Q_i y, Q_i = beta +- F_i (U_1 - U_2)',
    dim: { L: 0, T: -1 },
  },
  { name: 'upvp', longName: "eddy momentum flux of each layer [u_i'v_i']", dim: { L: 2, T: -2 } },
  { name: 'vpqp', longName: "eddy potential vorticity flux of each layer [v_i'q_i']", dim: { L: 1, T: -2 } },
  {
    name: 'eke',
    longName: "eddy kinetic energy per unit mass of each layer [u_i'^2 + v_i'^2] / 2",
    dim: { L: 2, T: -2 },
  },
  {
    name: 'heat_flux',
    longName: "eddy interface (heat) flux [v'tau'], tau = psi_1 - psi_2, v of either layer",
    dim: { L: 3, T: -2 },
    perLayer: false,
  },
];

export const SNAPSHOT_FILE: StriaFileKindSpec = {
  kind: 'snapshots',
  title: 'Stria snapshots: gridded fields of a beta-plane quasi-geostrophic run',
  fields: SNAPSHOT_FIELDS,
  spatial: ['y', 'x'],
};
export const ZONAL_MEAN_FILE: StriaFileKindSpec = {
  kind: 'zonal_means',
  title: 'Stria zonal means: jet and eddy-flux profiles of a beta-plane quasi-geostrophic run',
  fields: ZONAL_MEAN_FIELDS,
  spatial: ['y'],
};
export const TWO_LAYER_SNAPSHOT_FILE: StriaFileKindSpec = {
  kind: 'snapshots',
  title: 'Stria snapshots: gridded fields of the layers of a two-layer beta-plane quasi-geostrophic run',
  fields: TWO_LAYER_SNAPSHOT_FIELDS,
  spatial: ['layer', 'y', 'x'],
};
export const TWO_LAYER_ZONAL_MEAN_FILE: StriaFileKindSpec = {
  kind: 'zonal_means',
  title: 'Stria zonal means: jet, eddy-flux and heat-flux profiles of a two-layer beta-plane quasi-geostrophic run',
  fields: TWO_LAYER_ZONAL_MEAN_FIELDS,
  spatial: ['layer', 'y'],
};

/** The snapshot and zonal-mean file kinds of a run of `layers` layers. */
export function fileKindsOf(layers: number): { snapshots: StriaFileKindSpec; zonal: StriaFileKindSpec } {
  return layers === 2
    ? { snapshots: TWO_LAYER_SNAPSHOT_FILE, zonal: TWO_LAYER_ZONAL_MEAN_FILE }
    : { snapshots: SNAPSHOT_FILE, zonal: ZONAL_MEAN_FILE };
}

/** The dimensions of a field after time. */
export function fieldDimensions(spec: StriaFileKindSpec, f: FieldSpec): SpatialDimension[] {
  return spec.spatial.filter((d) => d !== 'layer' || f.perLayer !== false);
}

/** The number of values of a field in one record. */
export function fieldSize(spec: StriaFileKindSpec, f: FieldSpec, params: { nx: number; ny: number }): number {
  return fieldDimensions(spec, f).reduce((n, d) => n * (d === 'x' ? params.nx : d === 'y' ? params.ny : 2), 1);
}

export interface StriaFileOptions {
  /** Storage type of the fields (coordinates are always double). Default 'double'. */
  precision?: 'double' | 'float';
  /** Default 'cdf2' (64-bit offsets). */
  format?: NcFormat;
}

/**
 * The NetCDF description of a Stria file, with coordinate data and without record data. Point
 * (i, j) sits at x = i·Lx/nx, y = j·Ly/ny (lib/model/grid.ts); fields are (time, y, x), x fastest,
 * which is Stria's own index j·nx + i, so fields go out without reordering.
 */
export function striaFileSchema(spec: StriaFileKindSpec, run: StriaRunInfo, options: StriaFileOptions = {}): NcFile {
  const units = run.units ?? MODEL_UNITS;
  const { nx, ny, Lx, Ly } = run.params;
  const precision = options.precision ?? 'double';
  if (precision !== 'double' && precision !== 'float')
    throw new RangeError(`precision must be 'double' or 'float', got ${JSON.stringify(precision)}`);
  const attributes = striaGlobalAttributes(run, spec.kind, spec.title);
  const size = { x: nx, y: ny, layer: 2 };
  const length = { x: Lx, y: Ly };
  const dimensions: NcDimension[] = [
    { name: 'time', unlimited: true },
    ...spec.spatial.map((d) => ({ name: d, size: size[d] })),
  ];
  const horizontal = spec.spatial.filter((d): d is 'x' | 'y' => d !== 'layer');
  const coordinates: NcVariable[] = horizontal
    .slice()
    .reverse()
    .map((d) => ({
      name: d,
      type: 'double',
      dimensions: [d],
      attributes: [
        ncText(
          'long_name',
          d === 'x'
            ? 'zonal (eastward) position of grid points, periodic with period Lx'
            : 'meridional (northward) position of grid points, periodic with period Ly',
        ),
        ...quantityAttributes({ L: 1, T: 0 }, units),
        ncText('axis', d.toUpperCase()),
      ],
      data: gridPositions(size[d], length[d] * unitScale({ L: 1, T: 0 }, units)),
    }));
  const time: NcVariable = {
    name: 'time',
    type: 'double',
    dimensions: ['time'],
    attributes: [ncText('long_name', 'time since the start of the run'), ...quantityAttributes({ L: 0, T: 1 }, units)],
  };
  const step: NcVariable = {
    name: 'step',
    type: 'int',
    dimensions: ['time'],
    attributes: [ncText('long_name', 'number of time steps taken since the start of the run'), ncText('units', '1')],
  };
  const fields: NcVariable[] = spec.fields.map((f) => ({
    name: f.name,
    type: precision,
    dimensions: ['time', ...fieldDimensions(spec, f)],
    attributes: [ncText('long_name', f.longName), ...standardName(f, units), ...quantityAttributes(f.dim, units)],
  }));
  return {
    format: options.format ?? 'cdf2',
    dimensions,
    attributes,
    variables: [...coordinates, ...(spec.spatial.includes('layer') ? layerVariables(run) : []), time, step, ...fields],
  };
}

/**
 * The layer coordinate of a two-layer file, CF style (CF 1.8 section 4.3: `positive` makes it a
 * vertical coordinate; a dimensionless one names what it counts by its standard_name, here
 * model_level_number, recalled from the CF standard name table): layer numbers 1 (upper) and 2
 * (lower), counted downward; and `layer_fraction`, each layer's share H_i/H of the depth, the
 * weights of the barotropic (depth-weighted) mean.
 */
function layerVariables(run: StriaRunInfo): NcVariable[] {
  const d = run.params.depth_ratio;
  return [
    {
      name: 'layer',
      type: 'int',
      dimensions: ['layer'],
      attributes: [
        ncText('long_name', 'layer number, counted from the top: 1 the upper layer, 2 the lower'),
        ncText('standard_name', 'model_level_number'),
        ncText('units', '1'),
        ncText('axis', 'Z'),
        ncText('positive', 'down'),
      ],
      data: new Int32Array([1, 2]),
    },
    {
      name: 'layer_fraction',
      type: 'double',
      dimensions: ['layer'],
      attributes: [
        ncText('long_name', 'fraction of the total depth in each layer H_i/H (weights of the depth-weighted mean)'),
        ncText('units', '1'),
      ],
      data: new Float64Array([d / (1 + d), 1 / (1 + d)]),
    },
  ];
}

function quantityAttributes(dim: ModelDimension, units: UnitSystem): NcAttribute[] {
  return [ncText('units', unitsString(dim, units)), ncText('stria_model_units', modelDimensionLabel(dim))];
}

function standardName(f: FieldSpec, units: UnitSystem): NcAttribute[] {
  const name = units.kind === 'physical' && units.medium ? f.standardName?.[units.medium] : undefined;
  return name ? [ncText('standard_name', name)] : [];
}

/** n points from 0 with spacing length/n, computed as i·length/n like lib/model/grid.ts. */
function gridPositions(n: number, length: number): Float64Array {
  if (!(Number.isInteger(n) && n > 0 && Number.isFinite(length) && length > 0))
    throw new RangeError(`grid size ${n} and domain length ${length} must be a positive integer and a positive number`);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = (i * length) / n;
  return out;
}
