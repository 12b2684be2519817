import type { DataObjects } from 'jsfive';
import type { DatasetDimension, DatasetVariable } from './datasetReader';
import { cleanAttributes, dimensionAddresses } from './hdf5Attributes';
import { elementType } from './hdf5Format';

/**
 * The netCDF-4 data model over HDF5 objects (the netCDF-4 format as the netCDF library writes it):
 * a dimension is an HDF5 dimension scale (CLASS = "DIMENSION_SCALE"), ordered by _Netcdf4Dimid; a
 * scale whose NAME begins "This is a netCDF dimension but not a netCDF variable" is a dimension
 * only; every other dataset is a variable whose DIMENSION_LIST names its dimensions by object
 * reference. A plain HDF5 dataset without DIMENSION_LIST gets dimensions of its own, named
 * <variable>_dim<k>.
 */
export interface Entry {
  name: string;
  obj: DataObjects;
  attrs: Record<string, unknown>;
  dims: number[];
  unlimited: boolean[];
}

export function netcdf4Structure(
  links: Record<string, number | string>,
  entries: Entry[],
): { dimensions: DatasetDimension[]; variables: { variable: DatasetVariable; obj: DataObjects }[]; notes: string[] } {
  const dimensions: DatasetDimension[] = [];
  const variables: { variable: DatasetVariable; obj: DataObjects }[] = [];
  const notes: string[] = [];
  const nameAt = new Map<number, string>();
  for (const [name, address] of Object.entries(links)) if (typeof address === 'number') nameAt.set(address, name);
  const scales = entries.filter((e) => String(e.attrs.CLASS ?? '').replace(/\0+$/, '') === 'DIMENSION_SCALE');
  const byId = scales.slice().sort((a, b) => Number(a.attrs._Netcdf4Dimid ?? 0) - Number(b.attrs._Netcdf4Dimid ?? 0));
  for (const s of byId) dimensions.push({ name: s.name, size: s.dims[0] ?? 0, unlimited: s.unlimited[0] ?? false });
  for (const e of entries) {
    if (/^This is a netCDF dimension but not a netCDF variable/.test(String(e.attrs.NAME ?? ''))) continue;
    let names: string[];
    const addresses = dimensionAddresses(e.attrs.DIMENSION_LIST);
    if (scales.includes(e)) names = [e.name];
    else if (addresses && addresses.length === e.dims.length)
      names = addresses.map((a) => nameAt.get(a) ?? `${e.name}_dim${a}`);
    else {
      names = e.dims.map((_, k) => `${e.name}_dim${k}`);
      if (e.dims.length) {
        notes.push(
          `"${e.name}" names no netCDF dimensions (no DIMENSION_LIST): its dimensions are called ${names.join(', ')}`,
        );
        e.dims.forEach((size, k) => dimensions.push({ name: names[k], size, unlimited: e.unlimited[k] }));
      }
    }
    const { type } = elementType(e.obj.dtype);
    variables.push({
      variable: { name: e.name, type, dimensions: names, shape: e.dims.slice(), attributes: cleanAttributes(e.attrs) },
      obj: e.obj,
    });
  }
  return { dimensions, variables, notes };
}
