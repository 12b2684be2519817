import { readFileSync } from 'node:fs';
import { parsePlanFile } from '../lib/plan/planFile';
import { PLAN_PRESETS } from '../lib/plan/planPresets';
import { isInputError } from '../lib/inputError';
import { parseNumber, UsageError } from './args';

/**
 * The plan input of `stria plan`: a plan file or a plan preset (or nothing), then each
 * `--set path=value` on a dotted path into it (e.g. drive.eps=0.02, grid.nx=512). Setting a `kind`
 * switches that part of the input to the new kind and clears its other fields, so
 * `--set drive.kind=velocity --set drive.U=10` replaces an injection rate by a target velocity.
 * Values: numbers (decimal, or a multiple of pi), true/false, otherwise text. The planner's own
 * validation then names any field that is missing or out of range.
 */
export function planInputFrom(
  file: string | undefined,
  preset: string | undefined,
  sets: readonly string[],
): { input: Record<string, unknown>; setPaths: string[] } {
  if (file !== undefined && preset !== undefined) throw new UsageError('give a PLANFILE or --preset, not both');
  let input: Record<string, unknown> = {};
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
    const p = PLAN_PRESETS.find((x) => x.id === preset);
    if (!p)
      throw new UsageError(
        `--preset ${preset}: no such plan preset (known: ${PLAN_PRESETS.map((x) => x.id).join(', ')})`,
      );
    input = structuredClone(p.input) as unknown as Record<string, unknown>;
  }
  const setPaths: string[] = [];
  for (const word of sets) {
    const eq = word.indexOf('=');
    if (eq <= 0) throw new UsageError(`--set ${word}: expected path=value, e.g. --set drive.eps=0.02`);
    const path = word.slice(0, eq).split('.');
    if (path.some((k) => k === '' || k === '__proto__' || k === 'constructor' || k === 'prototype'))
      throw new UsageError(`--set ${word}: "${word.slice(0, eq)}" is not a field path`);
    setAt(input, path, valueOf(word.slice(eq + 1)), word);
    setPaths.push(path.join('.'));
  }
  return { input, setPaths };
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
