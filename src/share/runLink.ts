import { DEFAULT_PARAMS, type ModelParams } from '../../lib/model/params';
import { validateParams } from '../../lib/model/validateParams';
import { isInputError } from '../../lib/inputError';
import { appMemoryBudget, memoryRefusal, type MemoryBudget } from '../appMemory';

/** Version of the link format; a link of another version is refused with a message. */
export const LINK_VERSION = 1;

/**
 * The URL hash of a run: `v=1` and every parameter that differs from the model defaults, as
 * `key=value` pairs (numbers in JavaScript's shortest round-trip form, so they read back to the same
 * bits). Same parameters and seed reproduce the same run, step for step, from t = 0.
 */
export function encodeRunLink(params: ModelParams): string {
  const q = new URLSearchParams({ v: String(LINK_VERSION) });
  for (const key of Object.keys(DEFAULT_PARAMS) as (keyof ModelParams)[]) {
    if (params[key] !== DEFAULT_PARAMS[key]) q.set(key, String(params[key]));
  }
  return q.toString();
}

/**
 * A number as `encodeRunLink` writes it (JavaScript's decimal form, e.g. 0.02, 3e-26, 1e+21, -5).
 * `Number()` alone would also read "0x20", "0b101", "Infinity" or "1_0"-free oddities as numbers;
 * a link that says nx=0x20 was not written by Stria, so it is refused rather than guessed at.
 */
const DECIMAL = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

export type LinkReading = { kind: 'none' } | { kind: 'run'; params: ModelParams } | { kind: 'bad'; message: string };

/**
 * Read a URL hash (with or without the leading '#'): no run in it, a run's parameters (validated by
 * validateParams, and within the app's memory budget, src/appMemory.ts), or why it cannot be used,
 * naming the bad entries.
 */
export function decodeRunLink(hash: string, budget: MemoryBudget = appMemoryBudget()): LinkReading {
  const text = hash.startsWith('#') ? hash.slice(1) : hash;
  if (text.trim() === '') return { kind: 'none' };
  const q = new URLSearchParams(text);
  const version = q.get('v');
  if (version !== String(LINK_VERSION)) {
    return {
      kind: 'bad',
      message:
        version === null
          ? 'the link has no version (v=…)'
          : `link version ${version} is not one this Stria reads (${LINK_VERSION})`,
    };
  }
  const input: Record<string, unknown> = {};
  const problems: string[] = [];
  for (const [key, raw] of q) {
    if (key === 'v') continue;
    // Own keys only: `in` also finds what every object inherits ("__proto__", "toString"), and an
    // assignment of "__proto__" would then be dropped without a word.
    if (!Object.hasOwn(DEFAULT_PARAMS, key)) {
      problems.push(`“${key}” is not a parameter`);
      continue;
    }
    const kind = typeof DEFAULT_PARAMS[key as keyof ModelParams];
    if (kind === 'number') {
      const text = raw.trim();
      if (!DECIMAL.test(text)) problems.push(`${key} = “${raw}” is not a number in decimal notation`);
      else input[key] = Number(text);
    } else if (kind === 'boolean') {
      if (raw !== 'true' && raw !== 'false') problems.push(`${key} = “${raw}” must be true or false`);
      else input[key] = raw === 'true';
    } else input[key] = raw;
  }
  if (problems.length) return { kind: 'bad', message: problems.join('; ') };
  let params: ModelParams;
  try {
    params = validateParams(input);
  } catch (e) {
    if (isInputError(e, 'parameters')) return { kind: 'bad', message: e.message };
    throw e;
  }
  const tooLarge = memoryRefusal(params, null, budget);
  return tooLarge ? { kind: 'bad', message: tooLarge } : { kind: 'run', params };
}
