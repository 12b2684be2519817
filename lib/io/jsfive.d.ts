/**
 * The parts of jsfive 0.4.2 (a pure-JavaScript HDF5 reader, pinned exactly in package.json) that
 * Stria uses. The package ships no types. Members with a leading underscore are internal to jsfive:
 * Stria reads them (object header messages, raw links) because the public API has no hyperslab
 * read and no access to the messages; the pin and test/io/hdf5Dataset.test.ts hold them in place.
 */
declare module 'jsfive' {
  /** One object header message: its type code, size and the absolute offset of its body. */
  export type HeaderMessage = Map<string, number>;

  export interface DataObjects {
    /** Absolute offset of the object header. */
    offset: number;
    msgs: HeaderMessage[];
    find_msg_type(type: number): HeaderMessage[];
    /** The filter pipeline, one Map per filter (filter_id, client_data, ...), or null. */
    readonly filter_pipeline: Map<string, unknown>[] | null;
    /** jsfive's dtype string, e.g. '<f4', '>f8', '<i2', 'S12', or an array for vlen/reference types. */
    readonly dtype: string | unknown[];
    readonly shape: number[];
    get_attributes(): Record<string, unknown>;
    unpack_attribute(offset: number): [string, unknown];
    _vlen_size_and_data(buf: ArrayBuffer, offset: number): [number, ArrayBuffer];
    _global_heaps: Record<string, unknown>;
    fh: ArrayBuffer;
  }

  export class Group {
    readonly name: string;
    readonly keys: string[];
    readonly attrs: Record<string, unknown>;
    get(path: string): Group | Dataset | null;
    _links: Record<string, number | string>;
    _dataobjects: DataObjects;
  }

  export class File extends Group {
    constructor(buffer: ArrayBuffer, filename?: string);
  }

  export class Dataset {
    readonly name: string;
    readonly shape: number[];
    readonly dtype: string | unknown[];
    readonly attrs: Record<string, unknown>;
    readonly value: unknown[];
    _dataobjects: DataObjects;
  }

  /** Decoders by HDF5 filter id: (chunk bytes, item size, client data) → decoded bytes. */
  export const Filters: Map<number, (buf: ArrayBuffer, itemsize: number, clientData?: unknown) => ArrayBuffer>;
}
