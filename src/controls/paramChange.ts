import type { ModelParams } from '../../lib/model/params';
import { validateParams } from '../../lib/model/validateParams';
import { isInputError, type InputIssue } from '../../lib/inputError';
import { appMemoryBudget, memoryRefusal, type MemoryBudget } from '../appMemory';

/** The refused fields of a change, as one sentence; the edited field's own issues need no name. */
export function describeIssues(issues: readonly InputIssue[], edited: string): string {
  return issues.map((i) => (i.field === edited ? i.message : `${i.field}: ${i.message}`)).join('; ');
}

/**
 * Why `changes` would be refused on top of `params` (validateParams is the judge), or null when
 * they are fine. Checked in the UI so that a bad entry is answered at the field at once; the worker
 * checks again before it applies anything.
 */
export function refusalOf(params: ModelParams, changes: Partial<ModelParams>): InputIssue[] | null {
  try {
    validateParams({ ...params, ...changes });
    return null;
  } catch (e) {
    if (isInputError(e, 'parameters')) return e.issues;
    throw e;
  }
}

/** Changes that build a new model (a new grid or domain) while the current one is still held. */
const NEW_MODEL_KEYS = ['nx', 'ny', 'Lx', 'Ly'] as const;

/**
 * Why a change that builds a new model would exceed the app's memory budget (src/appMemory.ts),
 * as an issue of the edited field, or null. Only grid and domain changes build a new model; the
 * current run is held until the new one stands, so it is counted too.
 */
export function memoryRefusalOf(
  params: ModelParams,
  changes: Partial<ModelParams>,
  budget: MemoryBudget = appMemoryBudget(),
): InputIssue[] | null {
  const field = NEW_MODEL_KEYS.find((k) => k in changes && changes[k] !== params[k]);
  if (!field) return null;
  const why = memoryRefusal({ ...params, ...changes }, params, budget);
  return why ? [{ field, value: changes[field] ?? null, message: why }] : null;
}

/**
 * Read a number typed into a field: plain or exponent notation, optionally a multiple of π
 * ("2π", "2pi", "π"), since domain sizes are mostly multiples of 2π. Nothing else.
 */
export function parseNumber(text: string): number | null {
  const t = text.trim();
  const pi = /^(.*?)\s*(π|pi)$/i.exec(t);
  const body = pi ? pi[1] : t;
  if (pi && body === '') return Math.PI;
  if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(body)) return null;
  const x = Number(body) * (pi ? Math.PI : 1);
  return Number.isFinite(x) ? x : null;
}

/** A parameter value for a field: exact multiples of π (to three decimals) as such, else the shortest exact form. */
export function formatNumber(x: number): string {
  const m = Math.round((x / Math.PI) * 1000) / 1000;
  if (m !== 0 && !Number.isInteger(x) && m * Math.PI === x) return m === 1 ? 'π' : `${m}π`;
  return String(x);
}
