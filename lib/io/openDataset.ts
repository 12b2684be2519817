import type { ByteSource } from './byteSource';
import { sniffFormat, type DatasetReader, type ReaderOptions } from './datasetReader';
import { openHdf5 } from './hdf5Dataset';
import { openNetcdf3 } from './netcdf3Dataset';

/**
 * Opens NetCDF-3 or netCDF-4 bytes by their first bytes: the one entry point of lib/io for a user's
 * own file. Refuses what is not NetCDF with a RangeError that says so.
 */
export function openDataset(source: ByteSource, options: ReaderOptions = {}): DatasetReader {
  const head = source.read(0, Math.min(8, source.byteLength)).slice();
  return sniffFormat(head, source.byteLength) === 'hdf5' ? openHdf5(source, options) : openNetcdf3(source, options);
}
