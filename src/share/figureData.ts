import { encodeCsv, type CsvColumn } from '../../lib/io/csv';
import { encodeNetcdf3 } from '../../lib/io/netcdf3Writer';
import { ncText, type NcAttribute } from '../../lib/io/netcdf3Types';
import pkg from '../../package.json';

/**
 * The data behind a view's figure, as files: CSV for profiles, spectra and time series (one column
 * per series, all of one length: shorter series padded with missing values, NaN, which CSV writes as
 * empty fields), NetCDF for two-dimensional data (a CF-style grid with its two coordinates).
 */
export interface DataFile {
  name: string;
  blob: Blob;
  /** What it holds, in words, for the message after saving. */
  description: string;
}

/** A column of numbers, or of missing values where the series has none (null, NaN). */
export function numbers(name: string, values: ArrayLike<number | null>, length = values.length): CsvColumn {
  const out = new Float64Array(length).fill(NaN);
  for (let i = 0; i < Math.min(length, values.length); i++) {
    const v = values[i];
    out[i] = v === null || v === undefined ? NaN : v;
  }
  return { name, values: out };
}

/** A CSV file of columns, padded to the longest. */
export function csvFile(name: string, columns: readonly CsvColumn[], description: string): DataFile {
  const rows = Math.max(...columns.map((c) => c.values.length));
  const padded = columns.map((c) =>
    c.values.length === rows || typeof c.values[0] === 'string'
      ? c
      : numbers(c.name, c.values as ArrayLike<number>, rows),
  );
  return { name, blob: new Blob([encodeCsv(padded) as Uint8Array<ArrayBuffer>], { type: 'text/csv' }), description };
}

/** One coordinate of a 2D grid: its name, unit and values (ascending). */
export interface GridAxis {
  name: string;
  units: string;
  longName: string;
  values: ArrayLike<number>;
}

/**
 * A NetCDF-3 file of fields on a grid (rows `y`, columns `x`, row-major: data[j·nx + i]), each with its
 * unit and a long name, and the coordinates as variables of their own dimensions (CF conventions 1.8,
 * section 4). Model units are "1" (docs/file-formats.md); `title` and `comment` say what it is.
 */
export function gridNetcdf(spec: {
  name: string;
  title: string;
  comment: string;
  y: GridAxis;
  x: GridAxis;
  fields: { name: string; units: string; longName: string; data: ArrayLike<number> }[];
  attributes?: NcAttribute[];
}): DataFile {
  const { x, y } = spec;
  for (const f of spec.fields)
    if (f.data.length !== x.values.length * y.values.length)
      throw new RangeError(`${f.name}: ${f.data.length} values on a ${y.values.length} × ${x.values.length} grid`);
  const axis = (a: GridAxis) => ({
    name: a.name,
    type: 'double' as const,
    dimensions: [a.name],
    attributes: [ncText('units', a.units), ncText('long_name', a.longName)],
    data: a.values,
  });
  const bytes = encodeNetcdf3({
    dimensions: [
      { name: y.name, size: y.values.length },
      { name: x.name, size: x.values.length },
    ],
    attributes: [
      ncText('Conventions', 'CF-1.8'),
      ncText('title', spec.title),
      ncText('source', `Stria ${pkg.version} (app)`),
      ncText('comment', spec.comment),
      ...(spec.attributes ?? []),
    ],
    variables: [
      axis(y),
      axis(x),
      ...spec.fields.map((f) => ({
        name: f.name,
        type: 'double' as const,
        dimensions: [y.name, x.name],
        attributes: [ncText('units', f.units), ncText('long_name', f.longName)],
        data: f.data,
      })),
    ],
  });
  return {
    name: spec.name,
    blob: new Blob([bytes as Uint8Array<ArrayBuffer>], { type: 'application/x-netcdf' }),
    description: `${spec.fields.map((f) => f.name).join(', ')} on ${y.values.length} × ${x.values.length} (${y.name}, ${x.name})`,
  };
}
