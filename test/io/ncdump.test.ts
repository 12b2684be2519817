import { describe, expect, it } from 'vitest';
import { SNAPSHOT_FIELDS, ZONAL_MEAN_FIELDS } from '../../lib/io/cfStria';
import { encodeSnapshotFile, encodeZonalMeanFile } from '../../lib/io/cfStriaWriter';
import { ncText, type NcFile } from '../../lib/io/netcdf3Types';
import { encodeNetcdf3 } from '../../lib/io/netcdf3Writer';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { randomArray } from '../support/random';
import { hasNcdump, mustHaveNcdump, ncdump, NCDUMP_MISSING } from './ncdumpTool';

// Files written by our writer, parsed by ncdump from the NetCDF reference library (netcdf-bin): the
// reference reading of the NetCDF classic format specification. Skipped, with a message, where
// ncdump is missing; under CI a missing ncdump fails instead.
const run = hasNcdump || mustHaveNcdump ? it : it.skip;
const title = (what: string) => (hasNcdump || mustHaveNcdump ? what : `${what} [skipped: ${NCDUMP_MISSING}]`);

/** The values ncdump prints for one variable in its data section, as numbers (or strings for text). */
function dumpedValues(cdl: string, name: string): string[] {
  const data = cdl.slice(cdl.indexOf('\ndata:'));
  const m = new RegExp(`\\n ${name} =\\s*([^;]*);`).exec(data);
  if (!m) throw new Error(`ncdump shows no data for ${name}:\n${cdl}`);
  return m[1]
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
}
/** ncdump suffixes float values with "f" (e.g. "NaNf"); the rest is a JS number literal. */
const asNumber = (s: string) => Number(s.replace(/f$/, ''));

const tiny: NcFile = {
  dimensions: [
    { name: 'time', unlimited: true },
    { name: 'x', size: 3 },
    { name: 'len', size: 5 },
  ],
  attributes: [ncText('Conventions', 'CF-1.8'), ncText('note', 'odd length')],
  variables: [
    { name: 'label', type: 'char', dimensions: ['len'], data: 'ζeta' }, // 5 bytes of UTF-8
    { name: 'x', type: 'double', dimensions: ['x'], data: [0, 1 / 3, 2 / 3] },
    { name: 's', type: 'short', dimensions: ['time', 'x'], data: [1, -2, 3, 32767, -32768, 0] },
    { name: 'b', type: 'byte', dimensions: ['time'], data: [-128, 127] },
    {
      name: 'q',
      type: 'double',
      dimensions: ['time', 'x'],
      data: [0, -0, 5e-324, 1.7976931348623157e308, 1 / 3, -Infinity],
    },
  ],
};

describe('ncdump reads what we write', () => {
  run(title('reports the format variant (ncdump -k)'), () => {
    expect(ncdump(['-k'], encodeNetcdf3({ ...tiny, format: 'cdf1' })).trim()).toBe('classic');
    expect(ncdump(['-k'], encodeNetcdf3(tiny)).trim()).toBe('64-bit offset');
  });

  run(title('prints the values we wrote (ncdump -v), record variables padded with fill between slabs'), () => {
    for (const format of ['cdf1', 'cdf2'] as const) {
      const cdl = ncdump(['-p', '9,17', '-v', 'label,x,s,b,q'], encodeNetcdf3({ ...tiny, format }));
      expect(cdl).toContain('time = UNLIMITED ; // (2 currently)');
      expect(dumpedValues(cdl, 'label')).toEqual(['"\\316\\266eta"']); // ncdump prints char bytes ≥ 0x80 in octal: ζ is CE B6
      expect(dumpedValues(cdl, 'x').map(asNumber)).toEqual([0, 1 / 3, 2 / 3]);
      expect(dumpedValues(cdl, 's').map(asNumber)).toEqual([1, -2, 3, 32767, -32768, 0]);
      expect(dumpedValues(cdl, 'b').map(asNumber)).toEqual([-128, 127]);
      expect(dumpedValues(cdl, 'q').map(asNumber)).toEqual([0, -0, 5e-324, 1.7976931348623157e308, 1 / 3, -Infinity]);
    }
  });

  run(title('reads a single short record variable of odd length (packed records, no padding)'), () => {
    const s = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12, 13, 14, 15];
    const bytes = encodeNetcdf3({
      format: 'cdf1',
      dimensions: [
        { name: 't', unlimited: true },
        { name: 'n', size: 3 },
      ],
      variables: [{ name: 's', type: 'short', dimensions: ['t', 'n'], data: s }],
    });
    expect(dumpedValues(ncdump(['-v', 's'], bytes), 's').map(asNumber)).toEqual(s);
    const c = encodeNetcdf3({
      dimensions: [
        { name: 't', unlimited: true },
        { name: 'n', size: 3 },
      ],
      variables: [{ name: 'c', type: 'char', dimensions: ['t', 'n'], data: 'abcdefg' + 'hi' }],
    });
    expect(dumpedValues(ncdump(['-v', 'c'], c), 'c')).toEqual(['"abc"', '"def"', '"ghi"']);
  });

  run(title('parses a Stria snapshot file header (ncdump -h): variables and Conventions'), () => {
    const params = { ...DEFAULT_PARAMS, nx: 32, ny: 32 };
    const f = randomArray(32 * 32, 1);
    const frame = { time: 0, steps: 0, fields: { q: f, zeta: f, psi: f, u: f, v: f } };
    const info = { params, striaVersion: '0.1.0', createdAt: '2025-01-31T12:00:00Z' };
    const cdl = ncdump(['-h'], encodeSnapshotFile(info, [frame]));
    expect(cdl).toContain(':Conventions = "CF-1.8" ;');
    for (const v of ['x(x)', 'y(y)', 'time(time)', 'step(time)'])
      expect(cdl).toMatch(new RegExp(`\\t(double|int) ${v.replace(/[()]/g, '\\$&')} ;`));
    for (const field of SNAPSHOT_FIELDS) expect(cdl).toContain(`\tdouble ${field.name}(time, y, x) ;`);
    expect(cdl).toContain(':stria_seed = 1. ;');

    const z = new Float64Array(32);
    const zonal = ncdump(
      ['-h'],
      encodeZonalMeanFile(info, [{ time: 0, steps: 0, fields: { ubar: z, qbar: z, upvp: z, vpqp: z, eke: z } }], {
        precision: 'float',
        format: 'cdf1',
      }),
    );
    expect(zonal).toContain(':Conventions = "CF-1.8" ;');
    for (const field of ZONAL_MEAN_FIELDS) expect(zonal).toContain(`\tfloat ${field.name}(time, y) ;`);
  });
});
