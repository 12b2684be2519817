import type fc from 'fast-check';

/**
 * One boundary under property test: how inputs are generated, and what must hold for each. `check`
 * returns how the boundary answered ('rejected' with its own error, 'accepted', or a finer label)
 * and throws a PropertyFailure (or anything) when the answer is not a clean one.
 */
export interface Boundary<T> {
  arbitrary: fc.Arbitrary<T>;
  check(input: T): string;
  /** A short printable form of an input, for hang and failure reports. */
  preview?(input: T): string;
}

export class PropertyFailure extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PropertyFailure';
  }
}

/** Run `f`; a throw is a clean rejection only when `isClean` says so, otherwise a property failure. */
export function expectClean<R>(
  f: () => R,
  isClean: (e: unknown) => string | null,
): { ok: true; value: R } | { ok: false } {
  try {
    return { ok: true, value: f() };
  } catch (e) {
    const problem = isClean(e);
    if (problem !== null)
      throw new PropertyFailure(`${problem}: ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`);
    return { ok: false };
  }
}

/** Printable, bounded form of any value (typed arrays and long texts cut). */
export function previewValue(x: unknown, max = 400): string {
  let s: string;
  try {
    s = JSON.stringify(x, (_k, v) => {
      if (typeof v === 'bigint') return `${v}n`;
      if (typeof v === 'number' && !Number.isFinite(v)) return String(v);
      if (v instanceof Uint8Array)
        return `Uint8Array(${v.length}) ${Array.from(v.subarray(0, 24), (b) => b.toString(16).padStart(2, '0')).join('')}…`;
      if (ArrayBuffer.isView(v)) return `${v.constructor.name}(${(v as unknown as { length: number }).length})`;
      if (typeof v === 'string' && v.length > 200) return `${v.slice(0, 200)}… (${v.length} chars)`;
      if (typeof v === 'symbol' || typeof v === 'function') return String(v);
      return v;
    });
  } catch {
    s = String(x);
  }
  if (s === undefined) s = String(x);
  return s.length > max ? `${s.slice(0, max)}…` : s;
}
