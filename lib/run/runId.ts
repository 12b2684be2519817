import { storedParams, type ModelParams } from '../model/params';
import type { RunPlan } from './runPlan';

/**
 * The id of a sweep run: a digest of everything that decides its result — every model parameter
 * (seed included) after validation, and the resolved RunPlan (stop rule, averaging window, sample
 * interval) — so two runs share an id exactly when they compute the same bits. Ids survive
 * interruption, sharding and reordering of a sweep, and a sweep extended with new values keeps the
 * ids (and so the results) of the runs it already had.
 *
 * The digest is 64-bit FNV-1a over the UTF-8 bytes of the canonical JSON (object keys sorted at every
 * level, numbers in JavaScript's shortest round-trip form) of the parameters as stored (`storedParams`:
 * a one-layer run without the two-layer keys, so it keeps the id it had before they existed). 64 bits make an accidental collision
 * among a million runs about a 1-in-10⁷ event; the id is a name, not a security measure.
 */
export function runId(params: ModelParams, plan: RunPlan): string {
  return `r${fnv1a64(canonicalJson({ params: storedParams(params), plan }))}`;
}

/** JSON with object keys sorted at every level; refuses values JSON cannot hold exactly. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value === 'boolean' || typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new RangeError(`canonicalJson: ${value} has no JSON form`);
    return JSON.stringify(value);
  }
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined);
    entries.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  throw new RangeError(`canonicalJson: a ${typeof value} has no JSON form`);
}

const FNV_OFFSET = 0xcbf29ce484222325n;
const FNV_PRIME = 0x100000001b3n;
const MASK = (1n << 64n) - 1n;

/** FNV-1a, 64-bit, of the UTF-8 encoding of `text`, as 16 lowercase hex digits. */
export function fnv1a64(text: string): string {
  let h = FNV_OFFSET;
  for (const byte of new TextEncoder().encode(text)) {
    h ^= BigInt(byte);
    h = (h * FNV_PRIME) & MASK;
  }
  return h.toString(16).padStart(16, '0');
}
