import { InputError } from '../inputError';
import type { UnitSystem } from './cfUnits';

/**
 * A parameter file: the parameters of a run to make, with the physical size of its model units when
 * it comes from a physical plan (the matched run of `stria plan --matched-params FILE`), so that the
 * run's NetCDF files can be written in physical units.
 *
 *   { "format": "stria-params", "version": 1, "title"?: text,
 *     "params": { model parameters, as stria run takes them },
 *     "physical_units"?: { "metres_per_length": ℓ, "seconds_per_time": t } }
 *
 * ℓ and t are the metres and seconds of one model length and time unit (lib/plan/units.ts). The
 * parameters themselves are checked by validateParams where they are used; this reads the envelope.
 */
export const PARAMS_FILE_FORMAT = 'stria-params';
export const PARAMS_FILE_VERSION = 1;

export interface ParamsFile {
  title?: string;
  params: Record<string, unknown>;
  /** Physical units of the run, or model units when the file gives none. */
  units: UnitSystem;
}

/** The file's JSON text. */
export function encodeParamsFile(f: ParamsFile): string {
  const physical =
    f.units.kind === 'physical'
      ? { physical_units: { metres_per_length: f.units.metresPerLength, seconds_per_time: f.units.secondsPerTime } }
      : {};
  return `${JSON.stringify(
    {
      format: PARAMS_FILE_FORMAT,
      version: PARAMS_FILE_VERSION,
      ...(f.title === undefined ? {} : { title: f.title }),
      params: f.params,
      ...physical,
    },
    null,
    2,
  )}\n`;
}

/** Read a parsed parameter file; an InputError of source 'parameter file' names a bad field. */
export function decodeParamsFile(json: Record<string, unknown>): ParamsFile {
  const bad = (field: string, why: string) => new InputError('parameter file', field, why);
  if (json.format !== PARAMS_FILE_FORMAT) throw bad('format', `expected "${PARAMS_FILE_FORMAT}"`);
  if (json.version !== PARAMS_FILE_VERSION)
    throw bad(
      'version',
      `this Stria reads version ${PARAMS_FILE_VERSION}, the file is version ${String(json.version)}`,
    );
  const params = json.params;
  if (typeof params !== 'object' || params === null || Array.isArray(params))
    throw bad('params', 'expected an object of model parameters');
  if (json.title !== undefined && typeof json.title !== 'string') throw bad('title', 'expected a text');
  const pu = json.physical_units;
  let units: UnitSystem = { kind: 'model' };
  if (pu !== undefined) {
    if (typeof pu !== 'object' || pu === null)
      throw bad('physical_units', 'expected { metres_per_length, seconds_per_time }');
    const { metres_per_length: m, seconds_per_time: s } = pu as Record<string, unknown>;
    for (const [k, x] of [
      ['metres_per_length', m],
      ['seconds_per_time', s],
    ] as const)
      if (!(typeof x === 'number' && Number.isFinite(x) && x > 0))
        throw bad(`physical_units.${k}`, `expected a finite number > 0, got ${JSON.stringify(x)}`);
    units = { kind: 'physical', metresPerLength: m as number, secondsPerTime: s as number };
  }
  const extra = Object.keys(json).filter(
    (k) => !['format', 'version', 'title', 'params', 'physical_units'].includes(k),
  );
  if (extra.length) throw bad(extra[0], 'is not a field of a parameter file');
  return {
    ...(json.title === undefined ? {} : { title: json.title as string }),
    params: params as Record<string, unknown>,
    units,
  };
}
