import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import { mixSeed } from '../../lib/model/randomStream';

/** A seeded uniform [−1, 1) source for test inputs, so every test input is reproducible. */
export function seededSigned(seed: number): () => number {
  const rng = xoroshiro128plus(mixSeed(seed));
  return () => 2 * uniformFloat64(rng) - 1;
}

/** A Float64Array of n seeded values in [−1, 1). */
export function randomArray(n: number, seed: number): Float64Array {
  const next = seededSigned(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = next();
  return out;
}

/** Largest absolute difference between two arrays of equal length. */
export function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new Error(`length ${a.length} != ${b.length}`);
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

/** Largest absolute value in an array. */
export function maxAbs(a: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  return m;
}
