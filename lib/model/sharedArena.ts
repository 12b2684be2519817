/**
 * Where the arrays of a step live. A step shared by threads (threadTeam.ts) keeps every array that
 * more than one thread writes, or that one writes and another reads, in SharedArrayBuffers: the
 * calling thread builds its step with a `SharedArena`, which records the buffers in the order they
 * are made, and each helper thread builds the same objects in the same order with `replayArena`
 * over those buffers, so that both see the same memory under the same names. Arrays that every
 * thread can compute for itself (wavenumbers, twiddles, rates) stay ordinary.
 */

/** Makes a Float64Array of the given length, zero-filled. */
export type Float64Alloc = (length: number) => Float64Array;

/** Ordinary memory: a step on one thread. */
export const plainFloat64: Float64Alloc = (length) => new Float64Array(length);

/** Shared memory, each array its own buffer, recorded in order. */
export class SharedArena {
  readonly buffers: SharedArrayBuffer[] = [];
  readonly alloc: Float64Alloc = (length) => {
    const buffer = new SharedArrayBuffer(8 * length);
    this.buffers.push(buffer);
    return new Float64Array(buffer);
  };
}

/**
 * The arrays of a SharedArena again, in the order they were made: the helper thread's side. Throws
 * when a length differs or the buffers run out (the two sides did not build the same step).
 */
export function replayArena(buffers: readonly SharedArrayBuffer[]): Float64Alloc {
  let next = 0;
  return (length) => {
    const buffer = buffers[next++];
    if (!buffer || buffer.byteLength !== 8 * length)
      throw new RangeError(
        `replayArena: array ${next - 1} of ${buffers.length} does not match (${length} values asked)`,
      );
    return new Float64Array(buffer);
  };
}
