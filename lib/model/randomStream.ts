import { xoroshiro128plus, xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { logPortable } from './portableMath';
import { cisTurnsPortable } from './portableTrig';

/** The generator's full state: four 32-bit integers (xoroshiro128+ from pure-rand). */
export type RandomState = readonly [number, number, number, number];

type Generator = ReturnType<typeof xoroshiro128plus>;

/**
 * Spread a user's seed over all 32 bits before it becomes the generator's state: xoroshiro128+ seeded
 * directly with 1000 and 1001 starts on nearly equal draws, which would correlate the members of an
 * ensemble run with consecutive seeds. The mix is the 32-bit finaliser of MurmurHash3 (a bijection,
 * so distinct seeds stay distinct).
 */
export function mixSeed(seed: number): number {
  let h = seed >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h | 0;
}

/**
 * A seeded, reproducible stream of uniform and Gaussian numbers whose whole state can be saved and
 * restored, so a checkpointed run resumes on the very same draws. Gaussians come in pairs from the
 * Box–Muller transform with nothing cached between calls, so the state is the generator's alone.
 */
export class RandomStream {
  private gen: Generator;

  constructor(seed: number) {
    this.gen = xoroshiro128plus(mixSeed(seed));
  }

  /** Uniform in [0, 1) with 53 random bits. */
  uniform(): number {
    return uniformFloat64(this.gen);
  }

  /**
   * A complex Gaussian with E|z|² = variance, written to out[0] (re) and out[1] (im); re and im are
   * independent normals of variance `variance`/2. The logarithm and the phase come from
   * portableMath.ts and portableTrig.ts, so the draws have the same bits on every engine.
   */
  complexGaussian(variance: number, out: Float64Array): void {
    const u1 = 1 - this.uniform(); // (0, 1]: log is finite
    const u2 = this.uniform();
    const r = Math.sqrt(-variance * logPortable(u1));
    cisTurnsPortable(u2, out, r);
  }

  /** A uniformly random unit phase: out[0] = cos 2πu, out[1] = sin 2πu with u uniform in [0, 1). */
  phase(out: Float64Array): void {
    cisTurnsPortable(this.uniform(), out);
  }

  getState(): RandomState {
    const s = this.gen.getState();
    return [s[0], s[1], s[2], s[3]];
  }

  setState(state: RandomState): void {
    this.gen = xoroshiro128plusFromState([state[0], state[1], state[2], state[3]]);
  }
}
