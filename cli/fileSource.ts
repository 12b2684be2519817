import { closeSync, fstatSync, openSync, readSync } from 'node:fs';
import { constants } from 'node:buffer';
import type { ByteSource } from '../lib/io/byteSource';

/**
 * A ByteSource over a file on disk: reads go to the file descriptor, so a NetCDF-3 file is read
 * record by record without holding it in memory. `whole()` (what the netCDF-4 reader needs, see
 * lib/io/hdf5Dataset.ts) reads the file into one buffer, refused beyond the runtime's largest buffer.
 */
export function fileSource(path: string): ByteSource & { close(): void } {
  const fd = openSync(path, 'r');
  const stat = fstatSync(fd);
  if (stat.isDirectory()) {
    closeSync(fd);
    throw Object.assign(new Error(`${path} is a directory`), { code: 'EISDIR' });
  }
  const size = stat.size;
  return {
    byteLength: size,
    read(offset: number, length: number, into?: Uint8Array): Uint8Array {
      if (!(offset >= 0 && length >= 0 && offset + length <= size))
        throw new RangeError(
          `truncated file: bytes ${offset} to ${offset + length} were asked for but the file has ${size} bytes`,
        );
      const out = into ?? new Uint8Array(length);
      let done = 0;
      while (done < length) {
        const n = readSync(fd, out, done, length - done, offset + done);
        if (n === 0) throw new RangeError(`truncated file: reading stopped at byte ${offset + done} of ${size}`);
        done += n;
      }
      return out.subarray(0, length);
    },
    whole(): ArrayBuffer {
      if (size > constants.MAX_LENGTH)
        throw new RangeError(
          `this netCDF-4 file is ${size} bytes; the HDF5 reader holds the whole file in memory and this runtime's largest buffer is ${constants.MAX_LENGTH} bytes`,
        );
      const bytes = new Uint8Array(size);
      this.read(0, size, bytes);
      return bytes.buffer;
    },
    close(): void {
      closeSync(fd);
    },
  };
}
