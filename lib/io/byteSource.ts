/**
 * Random access to the bytes of a file, so that a reader can take one record at a time from a file
 * larger than memory. The command line implements it over a file descriptor; in memory (tests, the
 * browser) `memorySource` wraps a byte array. Offsets and lengths are in bytes.
 */
export interface ByteSource {
  /** Length of the file in bytes. */
  readonly byteLength: number;
  /** The bytes are in memory already (not read from a disk as asked for): memory estimates count them. */
  readonly inMemory?: boolean;
  /**
   * Bytes [offset, offset + length). With `into` (at least `length` bytes long) they are read into
   * it and its first `length` bytes are returned; without it the source may return a view of its own
   * storage (valid until the next read) or a new array. Reading past the end is an error.
   */
  read(offset: number, length: number, into?: Uint8Array): Uint8Array;
  /**
   * The whole file as one ArrayBuffer of exactly `byteLength` bytes. HDF5 metadata may lie anywhere
   * in a file and jsfive reads from one buffer, so the netCDF-4 reader needs this.
   */
  whole(): ArrayBuffer;
}

/** A ByteSource over bytes already in memory (no copies, except `whole` of a partial view). */
export function memorySource(input: ArrayBuffer | Uint8Array): ByteSource {
  const bytes = input instanceof Uint8Array ? input : new Uint8Array(input);
  return {
    byteLength: bytes.length,
    inMemory: true,
    read(offset: number, length: number, into?: Uint8Array): Uint8Array {
      if (!(offset >= 0 && length >= 0 && offset + length <= bytes.length)) {
        throw new RangeError(
          `truncated file: bytes ${offset} to ${offset + length} were asked for but the file has ${bytes.length} bytes`,
        );
      }
      const view = bytes.subarray(offset, offset + length);
      if (!into) return view;
      into.set(view);
      return into.subarray(0, length);
    },
    whole(): ArrayBuffer {
      const b = bytes.buffer;
      if (b instanceof ArrayBuffer && bytes.byteOffset === 0 && bytes.byteLength === b.byteLength) return b;
      return bytes.slice().buffer as ArrayBuffer;
    },
  };
}
