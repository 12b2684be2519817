import { readFileSync } from 'node:fs';
import type { Checkpoint } from '../lib/model/checkpoint';
import { DEFAULT_PARAMS, type ModelParams } from '../lib/model/params';
import { validateParams } from '../lib/model/validateParams';
import type { UnitSystem } from '../lib/io/cfUnits';
import { decodeParamsFile, PARAMS_FILE_FORMAT } from '../lib/io/paramsFile';
import { decodeRunFile, RUN_FILE_FORMAT } from '../lib/io/runFile';
import { DEMO_SCENARIOS, scenarioById } from '../lib/plan/demoScenarios';
import { scaledHyperviscosity } from '../lib/plan/gridHyperviscosity';
import { isInputError } from '../lib/inputError';
import { parseNumber, UsageError } from './args';

/**
 * Where a run starts: parameters, and the saved state when the file given was a run file. Layers,
 * each over the one before: the model defaults, `--preset`, the file's parameters, then `--set`.
 */
export interface RunStart {
  params: ModelParams;
  checkpoint: Checkpoint | null;
  /** The `--set` changes alone (a saved run applies them with Model.reconfigure), ν rescaled included. */
  changes: Partial<ModelParams>;
  /** ν rescaled to a new grid (`scaledHyperviscosity`), or null when ν stayed as it was. */
  rescaledNu: { from: number; to: number } | null;
  /** The physical size of the model units, from a parameter file of a physical plan; else model units. */
  units: UnitSystem;
}

export interface RunStartRequest {
  file?: string;
  preset?: string;
  sets?: readonly string[];
}

export function resolveRunStart(req: RunStartRequest): RunStart {
  const changes = parseSets(req.sets ?? []);
  let preset: Partial<ModelParams> = {};
  if (req.preset !== undefined) {
    const s = scenarioById(req.preset);
    if (!s)
      throw new UsageError(
        `--preset ${req.preset}: no such preset (known: ${DEMO_SCENARIOS.map((d) => d.id).join(', ')})`,
      );
    preset = s.params;
  }
  const file = req.file === undefined ? null : readParamFile(req.file);
  if (file?.checkpoint) {
    if (req.preset !== undefined)
      throw new UsageError(`--preset cannot be used with a saved run (${req.file}): the run file holds its parameters`);
    const cp = file.checkpoint;
    const nu = followGrid([cp.params as unknown as Record<string, unknown>], changes);
    return { params: checked({ ...cp.params, ...nu.changes }, changes), checkpoint: cp, ...nu, units: MODEL };
  }
  const nu = followGrid([{ ...DEFAULT_PARAMS }, preset, file?.params ?? {}], changes);
  return {
    params: checked({ ...preset, ...(file?.params ?? {}), ...nu.changes }, changes),
    checkpoint: null,
    ...nu,
    units: file?.units ?? MODEL,
  };
}

const MODEL: UnitSystem = { kind: 'model' };

/**
 * Hyperviscosity follows the grid: ν is tuned for the grid of the layer that set it (the defaults'
 * 128², a preset's, a file's); when a later layer changes the grid and `--set` does not give ν, ν is
 * rescaled so that its damping rate at k_max stays the same (lib/plan/gridHyperviscosity.ts). A ν
 * given with `--set` is kept as given. Values that do not validate are left for validateParams to name.
 */
function followGrid(
  layers: readonly Record<string, unknown>[],
  changes: Partial<ModelParams>,
): { changes: Partial<ModelParams>; rescaledNu: RunStart['rescaledNu'] } {
  if ('nu' in changes) return { changes, rescaledNu: null };
  const merged: Record<string, unknown> = {};
  let tuned: Record<string, unknown> = {};
  for (const layer of layers) {
    Object.assign(merged, layer);
    if ('nu' in layer || 'nu_order' in layer) tuned = { ...merged };
  }
  const final = { ...merged, ...changes };
  const keys = ['nu', 'nu_order', 'nx', 'ny', 'Lx', 'Ly'] as const;
  const numbers = (r: Record<string, unknown>) => keys.every((k) => typeof r[k] === 'number' && Number.isFinite(r[k]));
  const tunedFor = { ...tuned, nu: final.nu, nu_order: final.nu_order };
  if (!numbers(tunedFor) || !numbers(final)) return { changes, rescaledNu: null };
  const grid = final as unknown as ModelParams;
  const nu = scaledHyperviscosity(tunedFor as unknown as ModelParams, {
    nx: grid.nx,
    ny: grid.ny,
    Lx: grid.Lx,
    Ly: grid.Ly,
  });
  if (nu === grid.nu || !(Number.isFinite(nu) && nu > 0)) return { changes, rescaledNu: null };
  return { changes: { ...changes, nu }, rescaledNu: { from: grid.nu, to: nu } };
}

/** Validate, saying which `--set` a refused field came from. */
function checked(input: Record<string, unknown>, changes: Record<string, unknown>): ModelParams {
  try {
    return validateParams(input);
  } catch (e) {
    if (!isInputError(e, 'parameters')) throw e;
    throw new UsageError(
      e.issues
        .map(
          (i) =>
            `parameter ${i.field} = ${JSON.stringify(i.value)}: ${i.message}${i.field in changes ? ` (from --set ${i.field})` : ''}`,
        )
        .join('; '),
    );
  }
}

/**
 * A file of parameters: a JSON object of parameters, a parameter file (lib/io/paramsFile.ts, with
 * the physical units of a planned run), or a Stria run file (parameters and state).
 */
function readParamFile(path: string): {
  params: Record<string, unknown>;
  checkpoint: Checkpoint | null;
  units?: UnitSystem;
} {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new UsageError(`cannot read ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (e) {
    throw new UsageError(`${path} is not JSON (${(e as Error).message})`);
  }
  if (typeof json !== 'object' || json === null || Array.isArray(json))
    throw new UsageError(`${path}: expected a JSON object of parameters or a run file`);
  if ((json as Record<string, unknown>).format === RUN_FILE_FORMAT) {
    try {
      const cp = decodeRunFile(text);
      return { params: cp.params as unknown as Record<string, unknown>, checkpoint: cp };
    } catch (e) {
      if (isInputError(e, 'run file')) throw new UsageError(`${path}: ${e.field}: ${e.reason}`);
      throw e;
    }
  }
  if ((json as Record<string, unknown>).format === PARAMS_FILE_FORMAT) {
    try {
      const f = decodeParamsFile(json as Record<string, unknown>);
      return { params: f.params, checkpoint: null, units: f.units };
    } catch (e) {
      if (isInputError(e, 'parameter file')) throw new UsageError(`${path}: ${e.field}: ${e.reason}`);
      throw e;
    }
  }
  return { params: json as Record<string, unknown>, checkpoint: null };
}

/**
 * `--set key=value` words as parameter changes, each value read as the parameter's type in
 * DEFAULT_PARAMS: numbers (decimal, or a multiple of pi such as 2pi), true/false, or text. A key
 * set twice takes the later value, so a script can append overrides to a fixed list.
 */
export function parseSets(words: readonly string[]): Partial<ModelParams> {
  const out: Record<string, unknown> = {};
  for (const word of words) {
    const eq = word.indexOf('=');
    if (eq <= 0) throw new UsageError(`--set ${word}: expected key=value, e.g. --set beta=20`);
    const key = word.slice(0, eq);
    const text = word.slice(eq + 1);
    // Own keys only: `in` would let "__proto__" or "toString" through (the first then silently vanishes).
    if (!Object.hasOwn(DEFAULT_PARAMS, key))
      throw new UsageError(
        `--set ${word}: "${key}" is not a parameter (known: ${Object.keys(DEFAULT_PARAMS).join(', ')})`,
      );
    const kind = typeof DEFAULT_PARAMS[key as keyof ModelParams];
    if (kind === 'number') {
      const x = parseNumber(text);
      if (!Number.isFinite(x)) throw new UsageError(`--set ${word}: ${key} needs a number, got "${text}"`);
      out[key] = x;
    } else if (kind === 'boolean') {
      if (text !== 'true' && text !== 'false')
        throw new UsageError(`--set ${word}: ${key} needs true or false, got "${text}"`);
      out[key] = text === 'true';
    } else out[key] = text;
  }
  return out as Partial<ModelParams>;
}
