/**
 * Counts the bytes that a code path allocates, so that the memory bound of reading and analysing a
 * large file is a tested number rather than a hope (process RSS would mix in the runtime, the file
 * cache and other work). Two kinds:
 * - retained: buffers kept for the whole pass (read scratch, fields of one record, plans,
 *   accumulators), allocated through the meter once;
 * - transient: buffers made and dropped while one record is read (e.g. an inflated HDF5 chunk),
 *   reported with `temporary`; their peak per record is what matters.
 * Library plan objects that allocate on their own (transforms) are added with `external`, as the
 * byte count of the arrays their constructors make.
 */
export class AllocationMeter {
  retained = 0;
  transient = 0;
  peakTransient = 0;
  records = 0;
  /** Retained bytes by label, for reports. */
  readonly byLabel = new Map<string, number>();

  f64(n: number, label = 'buffers'): Float64Array {
    this.add(8 * n, label);
    return new Float64Array(n);
  }

  u8(n: number, label = 'buffers'): Uint8Array {
    this.add(n, label);
    return new Uint8Array(n);
  }

  i32(n: number, label = 'buffers'): Int32Array {
    this.add(4 * n, label);
    return new Int32Array(n);
  }

  /** Bytes allocated by a library constructor on our behalf (kept). */
  external(bytes: number, label: string): void {
    this.add(bytes, label);
  }

  /** Bytes allocated and dropped within the current record. */
  temporary(bytes: number): void {
    this.transient += bytes;
  }

  /** Closes a record: its transient bytes count toward the peak and start again from zero. */
  endRecord(): void {
    this.peakTransient = Math.max(this.peakTransient, this.transient);
    this.transient = 0;
    this.records++;
  }

  private add(bytes: number, label: string): void {
    this.retained += bytes;
    this.byLabel.set(label, (this.byLabel.get(label) ?? 0) + bytes);
  }
}

/** A meter that is not read: for callers who do not account. */
export function unmetered(): AllocationMeter {
  return new AllocationMeter();
}

/**
 * Bytes of the typed arrays an object holds (its own properties and theirs, a few levels down), each
 * buffer once: the measured size of a library plan object such as a transform, for `external`.
 */
export function typedArrayBytes(root: unknown, depth = 4): number {
  const seen = new Set<ArrayBufferLike>();
  const visited = new Set<object>();
  let total = 0;
  const walk = (x: unknown, d: number) => {
    if (x === null || typeof x !== 'object' || visited.has(x)) return;
    visited.add(x);
    if (ArrayBuffer.isView(x)) {
      if (!seen.has(x.buffer)) {
        seen.add(x.buffer);
        total += x.buffer.byteLength;
      }
      return;
    }
    if (d === 0) return;
    for (const v of Object.values(x)) walk(v, d - 1);
  };
  walk(root, depth);
  return total;
}
