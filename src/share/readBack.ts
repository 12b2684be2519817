import { parseCsv } from '../../lib/io/csv';
import { readNetcdf } from '../../lib/io/netcdfRead';

/**
 * Read an exported file back before saying it was written: the NetCDF through lib/io/netcdfRead.ts
 * (header and every variable decoded), the CSV through lib/io/csv.ts. Returns what was found, in
 * words, or throws with the reason. Loaded only when a file is exported.
 */
export function readBack(name: string, bytes: Uint8Array): string {
  if (name.endsWith('.csv')) {
    const t = parseCsv(bytes);
    return `read back: ${t.header.length} columns (${t.header.join(', ')}), ${t.rows.length} rows`;
  }
  const nc = readNetcdf(bytes);
  for (const v of nc.variables) nc.readVariable(v.name);
  const kind = nc.format === 'cdf2' ? 'NetCDF-3 64-bit offset' : 'NetCDF-3 classic';
  return `read back: ${kind}, ${nc.variables.length} variables (${nc.variables.map((v) => v.name).join(', ')}), ${nc.numRecords} record${nc.numRecords === 1 ? '' : 's'}`;
}
