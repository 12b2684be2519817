import { describe, expect, it } from 'vitest';
import { memorySource } from '../../lib/io/byteSource';
import { discoverFields } from '../../lib/userfile/fieldDiscovery';
import { openDataset } from '../../lib/io/openDataset';
import { cdl, type CdlVariable } from '../support/cdl';
import { ncgen, runNcgen } from '../io/ncgenTool';

/** A (time, lat, lon) file with the given field variables, written by ncgen. */
function lonlatFile(fields: CdlVariable[], dims: { name: string; size: number | 'unlimited' }[] = []) {
  return openDataset(
    memorySource(
      ncgen(
        cdl({
          dims: [{ name: 'time', size: 'unlimited' }, { name: 'lat', size: 4 }, { name: 'lon', size: 8 }, ...dims],
          vars: [
            {
              name: 'time',
              type: 'double',
              dims: ['time'],
              attrs: { units: 'hours since 2001-01-01', axis: 'T' },
              data: [0, 6],
            },
            {
              name: 'lat',
              type: 'float',
              dims: ['lat'],
              attrs: { units: 'degrees_north', standard_name: 'latitude' },
              data: [40, 42, 44, 46],
            },
            {
              name: 'lon',
              type: 'float',
              dims: ['lon'],
              attrs: { units: 'degrees_east' },
              data: [0, 45, 90, 135, 180, 225, 270, 315],
            },
            ...fields,
          ],
        }),
        'nc4',
      ),
    ),
  );
}

const grid = (name: string, attrs: CdlVariable['attrs'], dims = ['time', 'lat', 'lon']): CdlVariable => ({
  name,
  type: 'float',
  dims,
  attrs,
  data: Array.from({ length: 64 }, (_, k) => k),
});

describe.runIf(runNcgen)('field discovery', () => {
  it('finds u and v by CF standard name before common names, and says so', () => {
    const r = lonlatFile([
      grid('U', { standard_name: 'eastward_wind', units: 'm s-1' }),
      grid('V', { standard_name: 'northward_wind', units: 'm/s' }),
      grid('u', { units: 'm s-1' }),
    ]);
    const d = discoverFields(r);
    expect(d.layout).toBe('gridded');
    expect(d.fields.u).toMatchObject({
      variable: 'U',
      how: 'standard_name',
      detail: 'standard_name "eastward_wind"',
      factor: 1,
    });
    expect(d.fields.v).toMatchObject({ variable: 'V', how: 'standard_name' });
    expect(d.notes.some((n) => n.includes('took "U"') && n.includes('--map u=NAME'))).toBe(true);
    expect(d.x).toMatchObject({ kind: 'longitude', n: 8 });
    expect(d.y).toMatchObject({ kind: 'latitude', n: 4 });
    expect(d.records).toMatchObject({
      dimension: 'time',
      variable: 'time',
      count: 2,
      units: 'hours since 2001-01-01',
      secondsPer: 3600,
    });
    expect(d.order).toBe('yx');
  });

  it('takes common names only with fitting units and no other standard name', () => {
    const r = lonlatFile([
      grid('q', { standard_name: 'specific_humidity', units: 'kg kg-1' }),
      grid('zeta', { units: 'm' }),
      grid('vort', { units: 's-1' }),
      grid('uo', { units: 'cm s-1' }),
    ]);
    const d = discoverFields(r);
    expect(d.fields.q).toBeUndefined();
    expect(d.fields.zeta).toMatchObject({ variable: 'vort', how: 'name' });
    expect(d.fields.u).toMatchObject({ variable: 'uo', factor: 0.01 });
    expect(d.notes).toContain(
      '"q" was not taken as potential vorticity anomaly q (QG, without βy unless stated): its standard_name is "specific_humidity"',
    );
    expect(d.notes).toContain(
      '"zeta" was not taken as relative vorticity ζ: its units "m" are not those of relative vorticity ζ',
    );
  });

  it('follows an explicit mapping, and names what is missing', () => {
    const r = lonlatFile([grid('A', { units: 'm s-1' }), grid('B', {})]);
    const d = discoverFields(r, { map: { u: 'A', zeta: 'B' } });
    expect(d.fields.u).toMatchObject({ variable: 'A', how: 'mapping' });
    expect(d.fields.zeta).toMatchObject({ variable: 'B', how: 'mapping' });
    expect(() => discoverFields(r, { map: { v: 'C' } })).toThrow(
      'missing variable: the mapping names "C" for v, but the file has "time", "lat", "lon", "A", "B"',
    );
    expect(() => discoverFields(r)).toThrow(
      /^missing variables: no field to analyse — found no eastward velocity u, .* The file has "time" \(time\), .* name the fields with --map, e.g. --map u=U,v=V$/,
    );
  });

  it('finds a zonal-mean zonal wind on (time, latitude) and reads a transposed grid', () => {
    const prof = lonlatFile([
      { name: 'uzm', type: 'double', dims: ['time', 'lat'], attrs: { units: 'm s-1' }, data: [1, 2, 3, 4, 5, 6, 7, 8] },
    ]);
    const d = discoverFields(prof);
    expect(d.layout).toBe('zonal-mean');
    expect(d.fields.ubar).toMatchObject({ variable: 'uzm' });
    expect(d.x).toBeNull();
    // An eastward wind on (time, latitude) is the zonal-mean wind.
    const sn = lonlatFile([
      {
        name: 'ua_zm',
        type: 'double',
        dims: ['time', 'lat'],
        attrs: { standard_name: 'eastward_wind', units: 'm s-1' },
        data: [1, 2, 3, 4, 5, 6, 7, 8],
      },
    ]);
    expect(discoverFields(sn).fields.ubar).toMatchObject({
      variable: 'ua_zm',
      how: 'standard_name',
      detail: 'standard_name "eastward_wind"',
    });
    const t = lonlatFile([grid('u', { units: 'm s-1' }, ['time', 'lon', 'lat'])]);
    expect(discoverFields(t).order).toBe('xy');
  });

  it('accepts a level dimension of length 1 or a layer dimension, refuses a second long dimension, and leaves off fields on another grid', () => {
    const one = lonlatFile(
      [
        {
          name: 'u',
          type: 'float',
          dims: ['time', 'lev', 'lat', 'lon'],
          attrs: { units: 'm s-1' },
          data: Array.from({ length: 64 }, (_, k) => k),
        },
      ],
      [{ name: 'lev', size: 1 }],
    );
    expect(discoverFields(one).records).toMatchObject({ dimension: 'time', count: 2 });
    const many = lonlatFile(
      [
        {
          name: 'u',
          type: 'float',
          dims: ['time', 'lev', 'lat', 'lon'],
          attrs: { units: 'm s-1' },
          data: Array.from({ length: 192 }, (_, k) => k),
        },
      ],
      [{ name: 'lev', size: 3 }],
    );
    // A vertical dimension (by its name, lev) is a layer dimension: the depth-weighted mean by
    // default (equal weights without thicknesses), or one level with `layer`.
    const levels = discoverFields(many);
    expect(levels.records).toMatchObject({ dimension: 'time', count: 2 });
    expect(levels.level).toMatchObject({ dimension: 'lev', count: 3, index: null });
    expect(Array.from(levels.level!.weights)).toEqual([1 / 3, 1 / 3, 1 / 3]);
    expect(discoverFields(many, { layer: 2 }).level).toMatchObject({ index: 1 });
    expect(() => discoverFields(many, { layer: 4 })).toThrow('--layer 4: "lev" has layers 1 to 3');
    expect(() => discoverFields(one, { layer: 1 })).toThrow('has no layer or vertical dimension');
    const members = lonlatFile(
      [
        {
          name: 'u',
          type: 'float',
          dims: ['time', 'member', 'lat', 'lon'],
          attrs: { units: 'm s-1' },
          data: Array.from({ length: 192 }, (_, k) => k),
        },
      ],
      [{ name: 'member', size: 3 }],
    );
    expect(() => discoverFields(members)).toThrow(
      '"u" has 2 dimensions besides its horizontal ones longer than 1 (time = 2, member = 3): Stria analyses a 2D field over records; extract one level first',
    );
    const stag = lonlatFile([
      grid('u', { units: 'm s-1' }),
      {
        name: 'v',
        type: 'float',
        dims: ['lat', 'lon'],
        attrs: { units: 'm s-1' },
        data: Array.from({ length: 32 }, (_, k) => k),
      },
    ]);
    const d = discoverFields(stag);
    expect(d.fields.v).toBeUndefined();
    expect(
      d.notes.some((n) =>
        n.startsWith('"v" is left out: it is on dimensions (lat, lon), not those of "u" (time, lat, lon)'),
      ),
    ).toBe(true);
  });

  it('refuses an irregular latitude axis, naming it and its worst deviation', () => {
    const text = cdl({
      dims: [
        { name: 'lat', size: 5 },
        { name: 'lon', size: 4 },
      ],
      vars: [
        { name: 'lat', type: 'double', dims: ['lat'], attrs: { units: 'degrees_north' }, data: [-60, -31, 0, 29, 60] },
        { name: 'lon', type: 'double', dims: ['lon'], attrs: { units: 'degrees_east' }, data: [0, 90, 180, 270] },
        {
          name: 'u',
          type: 'double',
          dims: ['lat', 'lon'],
          attrs: { units: 'm s-1' },
          data: Array.from({ length: 20 }, () => 1),
        },
      ],
    });
    const r = openDataset(memorySource(ncgen(text, 'nc3')));
    expect(() => discoverFields(r)).toThrow(
      'irregular grid: axis "lat" is not regularly spaced — its worst deviation from a regular spacing of 30 is 1 at index 1 (3.333% of the spacing',
    );
  });
});
