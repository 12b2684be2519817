import { u64, UNDEFINED_ADDRESS } from './hdf5Format';

/**
 * The chunks of a chunked HDF5 dataset, from its version-1 B-tree (node type 1, "raw data chunks";
 * HDF5 File Format Specification, III.A.1). Each leaf entry names a chunk: the element offset of its
 * first value in every dimension, its address, its stored (possibly compressed) size and the mask of
 * filters skipped for it. Read once per variable; a record read then visits only the chunks whose
 * first-dimension range holds that record. A chunk never written has no entry: its values are
 * missing data.
 */
export interface ChunkEntry {
  /** Element offset of the chunk in each dimension of the dataset. */
  offset: number[];
  address: number;
  /** Stored bytes (after filters). */
  size: number;
  /** Bit i set: filter i of the pipeline was not applied to this chunk. */
  filterMask: number;
}

const NODE_HEADER = 24; // "TREE", type, level, entries used, left and right siblings

/** Every chunk of the B-tree at `root` for a dataset of `rank` dimensions, sorted by offset. */
export function readChunkIndex(view: DataView, root: number, rank: number, variable: string): ChunkEntry[] {
  const chunks: ChunkEntry[] = [];
  if (root === UNDEFINED_ADDRESS) return chunks; // nothing written yet
  const keySize = 8 + 8 * (rank + 1);
  const seen = new Set<number>();
  const visit = (address: number, level: number | null): void => {
    if (seen.has(address))
      throw new RangeError(`corrupt HDF5 file: the chunk B-tree of "${variable}" loops back to node ${address}`);
    seen.add(address);
    if (address + NODE_HEADER > view.byteLength)
      throw new RangeError(
        `truncated or corrupt HDF5 file: a chunk B-tree node of "${variable}" lies past the end of the file`,
      );
    const sig = String.fromCharCode(
      view.getUint8(address),
      view.getUint8(address + 1),
      view.getUint8(address + 2),
      view.getUint8(address + 3),
    );
    if (sig !== 'TREE' || view.getUint8(address + 4) !== 1)
      throw new RangeError(`corrupt HDF5 file: no chunk B-tree node at byte ${address} for "${variable}"`);
    const nodeLevel = view.getUint8(address + 5);
    if (level !== null && nodeLevel !== level)
      throw new RangeError(`corrupt HDF5 file: chunk B-tree levels of "${variable}" do not match`);
    const entries = view.getUint16(address + 6, true);
    let p = address + NODE_HEADER;
    for (let e = 0; e < entries; e++) {
      const size = view.getUint32(p, true);
      const filterMask = view.getUint32(p + 4, true);
      const offset: number[] = [];
      for (let d = 0; d < rank; d++) offset.push(u64(view, p + 8 + 8 * d));
      const child = u64(view, p + keySize);
      p += keySize + 8;
      if (nodeLevel > 0) visit(child, nodeLevel - 1);
      else chunks.push({ offset, address: child, size, filterMask });
    }
  };
  visit(root, null);
  chunks.sort((a, b) => compareOffsets(a.offset, b.offset));
  return chunks;
}

function compareOffsets(a: number[], b: number[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

/** Index of the first chunk whose first-dimension offset is ≥ t (chunks sorted by offset). */
export function firstChunkAtOrAfter(chunks: readonly ChunkEntry[], t: number): number {
  let lo = 0;
  let hi = chunks.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (chunks[mid].offset[0] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
