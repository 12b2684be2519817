import { Filters } from 'jsfive';
import type { AllocationMeter } from './allocationMeter';
import { firstChunkAtOrAfter, type ChunkEntry } from './hdf5ChunkIndex';
import { isLowLevel, meaning } from './fileErrors';
import { FILTER_NAMES, UNDEFINED_ADDRESS, type Layout } from './hdf5Format';

/**
 * One record (one index of the first dimension) of an HDF5 dataset, decoded into float64: from the
 * file's bytes for contiguous and compact storage, and chunk by chunk for chunked storage, decoding
 * only the chunks that hold the record, through jsfive's filter decoders (deflate, shuffle,
 * fletcher32). Values never written (no chunk, or no storage yet) come out as NaN: missing data.
 */
export interface SlabPlan {
  variable: string;
  shape: number[];
  layout: Layout;
  /** Chunks (chunked layout only), sorted by offset. */
  chunks: readonly ChunkEntry[];
  /** Filter pipeline in the order of application when writing: ids and client data. */
  filters: readonly { id: number; clientData: unknown }[];
  elementSize: number;
  read: (view: DataView, offset: number) => number;
}

/** Refuses a pipeline with a filter jsfive cannot decode, naming it. */
export function checkFilters(variable: string, filters: readonly { id: number }[]): void {
  for (const f of filters) {
    if (!Filters.has(f.id)) {
      const name = FILTER_NAMES[f.id]
        ? `the ${FILTER_NAMES[f.id]} filter (id ${f.id})`
        : `filter id ${f.id} (a registered plug-in filter)`;
      throw new RangeError(
        `"${variable}" is compressed with ${name}, which the HDF5 reader (jsfive) cannot decode; it decodes deflate, shuffle and fletcher32 only`,
      );
    }
  }
}

/**
 * Values [first, first + out.length) of record `r` of the dataset into out (a record holds the
 * product of shape[1..] values, 1 for rank ≤ 1; the range is all of it by default). Chunks that hold
 * none of the range are not decoded. `onValues(done, total)` reports values produced so far.
 */
export function readSlab(
  view: DataView,
  plan: SlabPlan,
  r: number,
  out: Float64Array,
  meter?: AllocationMeter,
  onValues?: (done: number, total: number) => void,
  first = 0,
): void {
  const { shape, layout, elementSize, read } = plan;
  const n = out.length;
  if (layout.kind !== 'chunked') {
    const base = layout.kind === 'compact' ? layout.offset : layout.address;
    if (base === UNDEFINED_ADDRESS) {
      out.fill(NaN);
    } else {
      const perRecord = shape.slice(1).reduce((a, b) => a * b, 1);
      const start = base + (r * perRecord + first) * elementSize;
      if (start + n * elementSize > view.byteLength)
        throw new RangeError(`truncated HDF5 file: record ${r} of "${plan.variable}" lies past the end of the file`);
      for (let k = 0; k < n; k++) out[k] = read(view, start + k * elementSize);
    }
    onValues?.(n, n);
    return;
  }
  out.fill(NaN);
  const chunk = layout.chunk;
  const rank = shape.length;
  const t0 = rank ? Math.floor(r / chunk[0]) * chunk[0] : 0;
  const tc = r - t0;
  const chunkValues = chunk.reduce((a, b) => a * b, 1);
  const perRecordInChunk = chunkValues / (chunk[0] || 1);
  let done = 0;
  for (let c = firstChunkAtOrAfter(plan.chunks, t0); c < plan.chunks.length && plan.chunks[c].offset[0] === t0; c++) {
    const entry = plan.chunks[c];
    if (!chunkMeetsRange(plan, entry.offset, first, first + n)) continue;
    const data = chunkBytes(view, plan, entry, chunkValues * elementSize, meter);
    done += copyRecordPart(data.view, data.start + tc * perRecordInChunk * elementSize, plan, entry.offset, out, first);
    onValues?.(Math.min(done, n), n);
  }
  if (done < n) onValues?.(n, n);
}

/**
 * Whether a chunk holds any value of [a, b) of a record: the record indices of its values lie
 * between those of its first corner and its last (clipped to the dataset), in row-major order.
 */
function chunkMeetsRange(plan: SlabPlan, offset: number[], a: number, b: number): boolean {
  const { shape } = plan;
  const chunk = (plan.layout as { chunk: number[] }).chunk;
  let lo = 0;
  let hi = 0;
  for (let d = 1; d < shape.length; d++) {
    lo = lo * shape[d] + offset[d];
    hi = hi * shape[d] + Math.min(offset[d] + chunk[d], shape[d]) - 1;
  }
  return hi >= a && lo < b;
}

/** The decoded bytes of one chunk: a view of the file itself when unfiltered, else the decoded copy. */
function chunkBytes(
  view: DataView,
  plan: SlabPlan,
  entry: ChunkEntry,
  decodedSize: number,
  meter?: AllocationMeter,
): { view: DataView; start: number } {
  if (
    entry.address + entry.size > view.byteLength ||
    (plan.filters.length === 0 && entry.address + decodedSize > view.byteLength)
  ) {
    throw new RangeError(`truncated HDF5 file: a chunk of "${plan.variable}" lies past the end of the file`);
  }
  if (plan.filters.length === 0) return { view, start: entry.address };
  let buf: ArrayBuffer = (view.buffer as ArrayBuffer).slice(
    view.byteOffset + entry.address,
    view.byteOffset + entry.address + entry.size,
  );
  meter?.temporary(buf.byteLength);
  for (let i = plan.filters.length - 1; i >= 0; i--) {
    if (entry.filterMask & (1 << i)) continue;
    const f = plan.filters[i];
    try {
      buf = (Filters.get(f.id) as (b: ArrayBuffer, size: number, data: unknown) => ArrayBuffer)(
        buf,
        plan.elementSize,
        f.clientData,
      );
    } catch (e) {
      throw new RangeError(
        `corrupt HDF5 data: the ${FILTER_NAMES[f.id] ?? `id ${f.id}`} filter failed on a chunk of "${plan.variable}" (${describe(e)})`,
        { cause: e },
      );
    }
    meter?.temporary(buf.byteLength);
  }
  if (buf.byteLength < decodedSize)
    throw new RangeError(
      `corrupt HDF5 data: a chunk of "${plan.variable}" decodes to ${buf.byteLength} bytes, expected ${decodedSize}`,
    );
  return { view: new DataView(buf), start: 0 };
}

/**
 * Copies the part of one chunk's time slice (row-major over dims 1..rank−1, starting at byte `start`)
 * that lies inside the dataset and within record values [first, first + out.length) into out (at
 * their index less `first`); returns the number of values copied.
 */
function copyRecordPart(
  src: DataView,
  start: number,
  plan: SlabPlan,
  offset: number[],
  out: Float64Array,
  first: number,
): number {
  const { shape, elementSize, read } = plan;
  const chunk = (plan.layout as { chunk: number[] }).chunk;
  const rank = shape.length;
  const end = first + out.length;
  if (rank <= 1) {
    out[0] = read(src, start);
    return 1;
  }
  // Odometer over dims 1..rank−2; runs along the last dimension.
  const last = rank - 1;
  const run = Math.min(chunk[last], shape[last] - offset[last]);
  const idx = new Array<number>(rank).fill(0);
  let copied = 0;
  for (;;) {
    let inside = true;
    let src0 = 0;
    let dst0 = 0;
    for (let d = 1; d < last; d++) {
      const g = offset[d] + idx[d];
      if (g >= shape[d]) inside = false;
      src0 = src0 * chunk[d] + idx[d];
      dst0 = dst0 * shape[d] + g;
    }
    if (inside) {
      const s = start + src0 * chunk[last] * elementSize;
      const o = dst0 * shape[last] + offset[last];
      // The part of this run of values within [first, end).
      const k0 = Math.max(0, first - o);
      const k1 = Math.min(run, end - o);
      for (let k = k0; k < k1; k++) out[o + k - first] = read(src, s + k * elementSize);
      if (k1 > k0) copied += k1 - k0;
    }
    let d = last - 1;
    while (d >= 1 && ++idx[d] === chunk[d]) idx[d--] = 0;
    if (d < 1) break;
  }
  return copied;
}

/** An error's message for a user: plain words for jsfive's and the engine's own (fileErrors.ts). */
export function describe(e: unknown): string {
  return isLowLevel(e) ? meaning(e) : (e as Error).message;
}
