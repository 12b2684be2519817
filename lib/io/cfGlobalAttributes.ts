import type { RunSummary } from '../analysis/summary';
import type { ModelParams } from '../model/params';
import { checkUnitSystem, MODEL_UNITS, type UnitSystem } from './cfUnits';
import { ncDouble, ncInt, ncText, type NcAttribute } from './netcdf3Types';

/**
 * Global attributes of Stria's NetCDF files: the CF Conventions 1.8 description attributes
 * (section 2.6: Conventions, title, institution, source, history, comment) and Stria's own,
 * prefixed `stria_`, which carry the run: its parameters, seed, version and unit system.
 *
 * Parameters are written twice, on purpose: `stria_params` is the whole record as JSON (lossless,
 * what Stria reads back to rerun or compare), and `stria_<name>` gives each one to tools that list
 * attributes (numbers as double, so that a seed up to 2³²−1 fits exactly; booleans as int 0/1,
 * because the string "false" is truthy in most scripting languages; text as text).
 */

/** Version of the data contract in docs/file-formats.md; raised when a name or meaning changes. */
export const STRIA_FILE_FORMAT_VERSION = 1;

/** What the caller knows about the run and the act of writing; lib/ reads no clock. */
export interface StriaRunInfo {
  /** The run's parameters (model units). */
  params: ModelParams;
  /** Stria's version, e.g. "0.1.0". */
  striaVersion: string;
  /** When the file is written, ISO 8601 with a time zone, e.g. new Date().toISOString(). */
  createdAt: string;
  /** What produced the file, for history: a command line or the app's action. */
  command?: string;
  /** Earlier history lines to keep, oldest first (e.g. when files are merged). */
  history?: readonly string[];
  title?: string;
  institution?: string;
  /** Model units unless the caller knows the physical scales. */
  units?: UnitSystem;
  /**
   * The run summary over the file's window, when the file is written whole at the end (the app's
   * exports): its numbers, standard errors and verdicts as `stria_summary_<key>` attributes, model
   * units (docs/significance.md).
   */
  summary?: RunSummary;
}

export type StriaFileKind = 'snapshots' | 'zonal_means';

/** Names Stria uses itself; a parameter may not take one of them. */
const OWN = [
  'format_version',
  'file_kind',
  'version',
  'units',
  'length_unit_m',
  'time_unit_s',
  'medium',
  'equation',
  'params',
];

const ISO_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:\d{2})$/;

const EQUATION =
  'dq/dt + J(psi, q) + beta dpsi/dx = F - mu zeta - nu (-laplacian)^p q - mu_ls q_<, ' +
  'q = laplacian(psi) - kd^2 psi, zeta = laplacian(psi), u = -dpsi/dy, v = dpsi/dx, ' +
  'on a doubly periodic domain Lx x Ly';

const EQUATION_TWO_LAYER =
  'for layers i = 1 (upper), 2 (lower): dq_i/dt + U_i dq_i/dx + Q_i dpsi_i/dx + J(psi_i, q_i) = ' +
  'F - delta_i2 mu zeta_2 - nu (-laplacian)^p q_i - mu_ls q_i_<, ' +
  'q_1 = laplacian(psi_1) + F_1 (psi_2 - psi_1), q_2 = laplacian(psi_2) + F_2 (psi_1 - psi_2), ' +
  'F_1 = kd^2/(1 + depth_ratio), F_2 = depth_ratio kd^2/(1 + depth_ratio), depth_ratio = H_1/H_2, ' +
  'imposed flows U_1 - U_2 = shear with H_1 U_1 + H_2 U_2 = 0, Q_1 = beta + F_1 shear, Q_2 = beta - F_2 shear, ' +
  'zeta_i = laplacian(psi_i), u_i = -dpsi_i/dy, v_i = dpsi_i/dx, on a doubly periodic domain Lx x Ly';

export function striaGlobalAttributes(run: StriaRunInfo, kind: StriaFileKind, defaultTitle: string): NcAttribute[] {
  if (typeof run.striaVersion !== 'string' || run.striaVersion.trim() === '')
    throw new RangeError('striaVersion must be a non-empty string such as "0.1.0"');
  if (typeof run.createdAt !== 'string' || !ISO_TIME.test(run.createdAt)) {
    throw new RangeError(
      `createdAt must be an ISO 8601 time with a zone, such as "2025-01-31T12:00:00Z"; got ${JSON.stringify(run.createdAt)}`,
    );
  }
  const units = run.units ?? MODEL_UNITS;
  checkUnitSystem(units);
  const source = `Stria ${run.striaVersion}`;
  const history = [...(run.history ?? []), `${run.createdAt} ${run.command ?? source}: wrote ${kind}`].join('\n');

  const attrs: NcAttribute[] = [
    ncText('Conventions', 'CF-1.8'),
    ncText('title', run.title ?? defaultTitle),
    ...(run.institution ? [ncText('institution', run.institution)] : []),
    ncText('source', source),
    ncText('history', history),
    ncText(
      'comment',
      `Output of an idealised model run (${run.params.layers === 2 ? 'two-layer' : 'one-layer'} quasi-geostrophic flow on a doubly periodic beta-plane), ` +
        'not a forecast and not an observation of any real flow. ' +
        (units.kind === 'model'
          ? 'Values are in model units (see stria_model_units on each variable). '
          : 'Values are converted to SI units from the model units. ') +
        "Variables, units and attributes are described in Stria's docs/file-formats.md.",
    ),
    ncInt('stria_format_version', STRIA_FILE_FORMAT_VERSION),
    ncText('stria_file_kind', kind),
    ncText('stria_version', run.striaVersion),
    ncText('stria_units', units.kind),
  ];
  if (units.kind === 'physical') {
    attrs.push(
      ncDouble('stria_length_unit_m', units.metresPerLength),
      ncDouble('stria_time_unit_s', units.secondsPerTime),
    );
    if (units.medium) attrs.push(ncText('stria_medium', units.medium));
  }
  attrs.push(
    ncText('stria_equation', run.params.layers === 2 ? EQUATION_TWO_LAYER : EQUATION),
    ncText('stria_params', JSON.stringify(run.params)),
  );
  for (const [key, value] of Object.entries(run.params)) {
    if (OWN.includes(key)) throw new RangeError(`parameter "${key}" collides with Stria's own attribute stria_${key}`);
    const name = `stria_${key}`;
    if (typeof value === 'number') {
      if (!Number.isFinite(value))
        throw new RangeError(`parameter "${key}" = ${value} is not finite and cannot be recorded in stria_params`);
      attrs.push(ncDouble(name, value));
    } else if (typeof value === 'boolean') attrs.push(ncInt(name, value ? 1 : 0));
    else if (typeof value === 'string') attrs.push(ncText(name, value));
    else
      throw new RangeError(
        `parameter "${key}" has a value of type ${typeof value}; only numbers, booleans and strings go into a file`,
      );
  }
  for (const [key, value] of Object.entries(run.summary ?? {})) {
    const name = `stria_summary_${key}`;
    if (typeof value === 'number' && Number.isFinite(value)) attrs.push(ncDouble(name, value));
    else if (typeof value === 'boolean') attrs.push(ncInt(name, value ? 1 : 0));
    else if (typeof value === 'string') attrs.push(ncText(name, value));
  }
  return attrs;
}
