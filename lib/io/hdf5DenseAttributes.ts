import type { DataObjects } from 'jsfive';
import { u64, uint, UNDEFINED_ADDRESS } from './hdf5Format';

/**
 * Attributes in HDF5 "dense" storage, which jsfive 0.4.2 skips without a word (its get_attributes
 * reads only attribute messages in the object header). HDF5 moves an object's attributes there once
 * it has more than 8 (the default), and the netCDF library creates objects that track attribute
 * creation order, so any netCDF-4 variable with more than 8 attributes — a CF-rich variable — has
 * its units, _FillValue, standard_name and DIMENSION_LIST there.
 *
 * Path (HDF5 File Format Specification 3.0): the Attribute Info message (0x0015) gives a fractal heap
 * (III.G) and a version-2 B-tree of attribute names (III.A.2, record type 8: heap ID, flags, creation
 * order, name hash). Each heap object is an attribute message, decoded by jsfive's own attribute
 * decoder. Supported: B-trees of depth 0 and 1, heaps whose root is a direct block or an indirect
 * block of direct blocks, without I/O filters; anything else is refused by name.
 */
export function denseAttributes(obj: DataObjects, owner: string): Record<string, unknown> {
  const info = obj.find_msg_type(0x0015)[0];
  if (!info) return {};
  const view = new DataView(obj.fh);
  const p = info.get('offset_to_message') as number;
  const flags = view.getUint8(p + 1);
  const q = p + 2 + (flags & 1 ? 2 : 0);
  const heapAddress = u64(view, q);
  const nameTree = u64(view, q + 8);
  if (heapAddress === UNDEFINED_ADDRESS || nameTree === UNDEFINED_ADDRESS) return {};
  const heap = new FractalHeap(view, heapAddress, owner);
  const out: Record<string, unknown> = {};
  // Records come in name-hash order; the netCDF data model lists attributes in creation order.
  const records = attributeRecords(view, nameTree, owner).sort((a, b) => a.order - b.order);
  for (const { id } of records) {
    const bytes = heap.object(id);
    const [name, value] = decodeAttributeMessage(obj, bytes);
    out[name] = value;
  }
  return out;
}

/** jsfive's attribute decoder, run on a message held outside the object header (in a heap object). */
function decodeAttributeMessage(obj: DataObjects, message: ArrayBuffer): [string, unknown] {
  // The decoder reads the message from `this.fh`; variable-length values (DIMENSION_LIST) live in
  // the file's global heap, which jsfive's own _vlen_size_and_data reads from the file.
  const proxy = Object.create(Object.getPrototypeOf(obj)) as DataObjects;
  proxy.fh = message;
  proxy._global_heaps = obj._global_heaps;
  proxy._vlen_size_and_data = (buf: ArrayBuffer, offset: number) => obj._vlen_size_and_data(buf, offset);
  return proxy.unpack_attribute(0);
}

/** Heap IDs and creation orders of the records of an attribute-name B-tree (type 8, 17-byte records). */
function attributeRecords(view: DataView, header: number, owner: string): { id: Uint8Array; order: number }[] {
  expectSignature(view, header, 'BTHD', owner);
  const type = view.getUint8(header + 5);
  const nodeSize = view.getUint32(header + 6, true);
  const recordSize = view.getUint16(header + 10, true);
  const depth = view.getUint16(header + 12, true);
  const root = u64(view, header + 16);
  const rootRecords = view.getUint16(header + 24, true);
  if (type !== 8)
    throw new RangeError(`corrupt HDF5 file: the attribute B-tree of ${owner} has type ${type}, expected 8`);
  if (depth > 1)
    throw new RangeError(
      `${owner} has so many attributes that their HDF5 B-tree is ${depth} levels deep; this reader reads at most 1`,
    );
  const ids: { id: Uint8Array; order: number }[] = [];
  const records = (node: number, count: number) => {
    for (let i = 0; i < count; i++) {
      const r = node + 6 + i * recordSize;
      ids.push({ id: new Uint8Array(view.buffer, view.byteOffset + r, 8), order: view.getUint32(r + 9, true) });
      if (view.getUint8(r + 8) & 1)
        throw new RangeError(`${owner} has a shared attribute message, which this reader does not support`);
    }
  };
  if (root === UNDEFINED_ADDRESS) return ids;
  if (depth === 0) {
    expectSignature(view, root, 'BTLF', owner);
    records(root, rootRecords);
    return ids;
  }
  // Depth 1: an internal node with records of its own and child pointers (address, record count in
  // as many bytes as the largest leaf count needs).
  expectSignature(view, root, 'BTIN', owner);
  records(root, rootRecords);
  const leafMax = Math.floor((nodeSize - 10) / recordSize);
  const countBytes = Math.max(1, Math.ceil(Math.log2(leafMax + 1) / 8));
  let c = root + 6 + rootRecords * recordSize;
  for (let i = 0; i <= rootRecords; i++, c += 8 + countBytes) {
    const child = u64(view, c);
    expectSignature(view, child, 'BTLF', owner);
    records(child, uint(view, c + 8, countBytes));
  }
  return ids;
}

function expectSignature(view: DataView, at: number, sig: string, owner: string): void {
  if (at + 4 > view.byteLength)
    throw new RangeError(`truncated HDF5 file: attribute storage of ${owner} lies past the end of the file`);
  const got = String.fromCharCode(
    view.getUint8(at),
    view.getUint8(at + 1),
    view.getUint8(at + 2),
    view.getUint8(at + 3),
  );
  if (got !== sig)
    throw new RangeError(
      `corrupt HDF5 file: expected "${sig}" at byte ${at} in the attribute storage of ${owner}, found "${got}"`,
    );
}

/** The managed objects of a fractal heap whose root is a direct block or one indirect block of direct blocks. */
class FractalHeap {
  private readonly offsetBytes: number;
  private readonly lengthBytes: number;
  private readonly blockOffsetBytes: number;
  private readonly width: number;
  private readonly start: number;
  private readonly maxDirect: number;
  private readonly root: number;
  private readonly rows: number;

  constructor(
    private readonly view: DataView,
    at: number,
    private readonly owner: string,
  ) {
    expectSignature(view, at, 'FRHP', owner);
    if (view.getUint16(at + 7, true) !== 0)
      throw new RangeError(`${owner}: attributes in a filtered HDF5 fractal heap are not supported`);
    const maxManaged = view.getUint32(at + 10, true);
    this.width = view.getUint16(at + 110, true);
    this.start = u64(view, at + 112);
    this.maxDirect = u64(view, at + 120);
    const maxHeapBits = view.getUint16(at + 128, true);
    this.root = u64(view, at + 132);
    this.rows = view.getUint16(at + 140, true);
    this.offsetBytes = Math.ceil(maxHeapBits / 8);
    this.blockOffsetBytes = this.offsetBytes;
    this.lengthBytes = Math.ceil(Math.log2(Math.min(this.maxDirect, maxManaged) + 1) / 8);
  }

  /** The bytes of the object with this heap ID (a copy). */
  object(id: Uint8Array): ArrayBuffer {
    const kind = (id[0] >> 4) & 3;
    if (kind !== 0)
      throw new RangeError(
        `${this.owner}: an attribute stored as a ${kind === 1 ? 'huge' : 'tiny'} heap object is not supported`,
      );
    const idView = new DataView(id.buffer, id.byteOffset, id.byteLength);
    const offset = uint(idView, 1, this.offsetBytes);
    const length = uint(idView, 1 + this.offsetBytes, this.lengthBytes);
    const where = this.locate(offset);
    if (where + length > this.view.byteLength)
      throw new RangeError(`truncated HDF5 file: an attribute of ${this.owner} lies past the end of the file`);
    return (this.view.buffer as ArrayBuffer).slice(this.view.byteOffset + where, this.view.byteOffset + where + length);
  }

  /** File address of heap offset `o`: the direct block holding it, plus the offset within the block. */
  private locate(o: number): number {
    if (this.rows === 0) return this.root + o; // the root is a single direct block starting at heap offset 0
    expectSignature(this.view, this.root, 'FHIB', this.owner);
    const maxDirectRows = Math.log2(this.maxDirect) - Math.log2(this.start) + 2;
    let entry = this.root + 4 + 1 + 8 + this.blockOffsetBytes;
    let rowStart = 0;
    for (let row = 0; row < this.rows; row++) {
      if (row >= maxDirectRows) break;
      const size = row === 0 ? this.start : this.start * 2 ** (row - 1);
      for (let col = 0; col < this.width; col++, entry += 8) {
        const blockStart = rowStart + col * size;
        if (o >= blockStart && o < blockStart + size) {
          const address = u64(this.view, entry);
          if (address === UNDEFINED_ADDRESS)
            throw new RangeError(
              `corrupt HDF5 file: an attribute of ${this.owner} points into an unallocated heap block`,
            );
          expectSignature(this.view, address, 'FHDB', this.owner);
          return address + (o - blockStart);
        }
      }
      rowStart += this.width * size;
    }
    throw new RangeError(
      `${this.owner}: an attribute lies in a nested indirect heap block, which this reader does not support`,
    );
  }
}
