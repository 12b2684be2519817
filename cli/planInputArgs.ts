import { readFileSync } from 'node:fs';
import { DEFAULT_PARAMS, type ModelParams } from '../lib/model/params';
import { planInputFromModelParams, PLAN_MODEL_KEYS, type PlanModelKey } from '../lib/plan/modelPlanInput';
import { parsePlanFile } from '../lib/plan/planFile';
import { parseQuantity, PLAN_FIELD_QUANTITIES } from '../lib/plan/quantityInput';
import { findPlanPreset, PLAN_PRESETS } from '../lib/plan/planPresets';
import { isInputError } from '../lib/inputError';
import { parseNumber, UsageError } from './args';

/**
 * The plan input of `stria plan`: a plan file or a plan preset (or nothing), then each
 * `--set path=value` on a dotted path into it (e.g. drive.eps=0.02, grid.nx=512). Setting a `kind`
 * switches that part of the input to the new kind and clears its other fields, so
 * `--set drive.kind=velocity --set drive.U=10` replaces an injection rate by a target velocity.
 * Values: numbers (decimal, or a multiple of pi), true/false, otherwise text. The planner's own
 * validation then names any field that is missing or out of range.
 *
 * The model's own keys, as `stria run` takes them (`--set beta=3 --set eps=2e-4 --set mu=5e-3`), make
 * a model-unit plan from the model defaults (planInputFromModelParams); `defaulted` names the keys
 * that came from the defaults, for the command to say so. Dotted paths (runLength, rhines, …) still
 * apply on top.
 */
export function planInputFrom(
  file: string | undefined,
  preset: string | undefined,
  sets: readonly string[],
): { input: Record<string, unknown>; setPaths: string[]; defaulted: PlanModelKey[] | null } {
  if (file !== undefined && preset !== undefined) throw new UsageError('give a PLANFILE or --preset, not both');
  const { model, paths } = splitModelKeys(sets);
  if (model && (file !== undefined || preset !== undefined))
    throw new UsageError(
      `--set ${Object.keys(model).join(', ')}: model-unit keys make a plan of their own from the model defaults; give them without ${file !== undefined ? 'a PLANFILE' : '--preset'}, or set the plan's fields by path (e.g. --set rotation.beta=3)`,
    );
  let input: Record<string, unknown> = {};
  let defaulted: PlanModelKey[] | null = null;
  if (model) {
    const made = planInputFromModelParams(model);
    input = made.input as unknown as Record<string, unknown>;
    defaulted = made.defaulted;
  }
  if (file !== undefined) {
    let text: string;
    try {
      text = readFileSync(file, 'utf8');
    } catch (e) {
      throw new UsageError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
    try {
      input = structuredClone(parsePlanFile(text).input) as unknown as Record<string, unknown>;
    } catch (e) {
      if (isInputError(e, 'plan file')) throw new UsageError(`${file}: ${e.message}`);
      throw e;
    }
  } else if (preset !== undefined) {
    const p = findPlanPreset(preset);
    if (!p)
      throw new UsageError(
        `--preset ${preset}: no such plan preset (known: ${PLAN_PRESETS.map((x) => x.id).join(', ')})`,
      );
    input = structuredClone(p.input) as unknown as Record<string, unknown>;
  }
  const setPaths: string[] = Object.keys(model ?? {});
  const withUnits: string[] = [];
  for (const word of paths) {
    const eq = word.indexOf('=');
    if (eq <= 0) throw new UsageError(`--set ${word}: expected path=value, e.g. --set drive.eps=0.02`);
    const path = word.slice(0, eq).split('.');
    if (path.some((k) => k === '' || k === '__proto__' || k === 'constructor' || k === 'prototype'))
      throw new UsageError(`--set ${word}: "${word.slice(0, eq)}" is not a field path`);
    const dotted = path.join('.');
    const typed = typedValue(word.slice(eq + 1), dotted, word);
    if (typed.unit !== null) withUnits.push(word);
    setAt(input, path, typed.value, word);
    setPaths.push(dotted);
  }
  if (withUnits.length && input.units !== 'physical')
    throw new UsageError(
      `--set ${withUnits[0]}: a unit needs a physical plan (units = physical); a model-unit plan takes plain numbers`,
    );
  return { input, setPaths, defaulted };
}

/**
 * The `--set` words that name a model parameter (no dot, a key of the model's parameters other than
 * a top-level plan field), read as numbers; the rest are plan paths. A model key the planner does not
 * use (dt, seed, forcing, …) is refused by name.
 */
function splitModelKeys(sets: readonly string[]): {
  model: Partial<Pick<ModelParams, PlanModelKey>> | null;
  paths: string[];
} {
  const model: Record<string, number> = {};
  const paths: string[] = [];
  for (const word of sets) {
    const eq = word.indexOf('=');
    const key = eq > 0 ? word.slice(0, eq) : '';
    if (key === 'cfl' || !Object.hasOwn(DEFAULT_PARAMS, key)) {
      paths.push(word);
      continue;
    }
    if (!(PLAN_MODEL_KEYS as readonly string[]).includes(key))
      throw new UsageError(
        `--set ${word}: ${key} is a run parameter the planner does not use (it plans from ${PLAN_MODEL_KEYS.join(', ')})`,
      );
    const x = parseNumber(word.slice(eq + 1));
    if (!Number.isFinite(x)) throw new UsageError(`--set ${word}: ${key} needs a number, got "${word.slice(eq + 1)}"`);
    model[key] = x;
  }
  return { model: Object.keys(model).length ? (model as Partial<Pick<ModelParams, PlanModelKey>>) : null, paths };
}

/**
 * A value for `path`: a field of a physical quantity takes a plain number (SI) or a number with a unit
 * (`--set dragTime=30d`, `--set forcing.wavelength=500km`, `--set rotation.latitudeDeg=45°`).
 */
function typedValue(text: string, path: string, word: string): { value: unknown; unit: string | null } {
  const q = Object.hasOwn(PLAN_FIELD_QUANTITIES, path) ? PLAN_FIELD_QUANTITIES[path] : null;
  const plain = parseNumber(text);
  if (q === null || Number.isFinite(plain)) return { value: valueOf(text), unit: null };
  const r = parseQuantity(text, q);
  if ('error' in r) throw new UsageError(`--set ${word}: ${path}: ${r.error}`);
  return r;
}

function valueOf(text: string): unknown {
  if (text === 'true' || text === 'false') return text === 'true';
  const x = parseNumber(text);
  return Number.isFinite(x) ? x : text;
}

function setAt(root: Record<string, unknown>, path: string[], value: unknown, word: string): void {
  let node = root;
  for (const key of path.slice(0, -1)) {
    const next = node[key];
    if (next === undefined) node[key] = {};
    else if (typeof next !== 'object' || next === null)
      throw new UsageError(`--set ${word}: "${key}" holds a value, not fields`);
    node = node[key] as Record<string, unknown>;
  }
  const last = path[path.length - 1];
  if (last === 'kind' && path.length > 1 && node.kind !== value) {
    for (const k of Object.keys(node)) delete node[k];
  }
  node[last] = value;
}
