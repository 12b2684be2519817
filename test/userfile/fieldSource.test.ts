import { describe, expect, it } from 'vitest';
import { memorySource } from '../../lib/io/byteSource';
import { discoverFields } from '../../lib/userfile/fieldDiscovery';
import { openDataset } from '../../lib/io/openDataset';
import { userFieldSource } from '../../lib/userfile/fieldSource';
import { PLANETS } from '../../lib/plan/planets';
import { cdl } from '../support/cdl';
import { ncgen, runNcgen } from '../io/ncgenTool';

describe.runIf(runNcgen)("user fields in Stria's layout", () => {
  it('reorders transposed, north-to-south, east-to-west fields to y slow, both axes ascending', () => {
    // u(lon, lat) with lat descending and lon descending: value = 10·lat + lon/10.
    const lat = [60, 50, 40];
    const lon = [270, 180, 90, 0];
    const data = lon.flatMap((l) => lat.map((p) => 10 * p + l / 10));
    const text = cdl({
      dims: [
        { name: 'lon', size: 4 },
        { name: 'lat', size: 3 },
      ],
      vars: [
        { name: 'lon', type: 'double', dims: ['lon'], attrs: { units: 'degrees_east' }, data: lon },
        { name: 'lat', type: 'double', dims: ['lat'], attrs: { units: 'degrees_north' }, data: lat },
        { name: 'u', type: 'double', dims: ['lon', 'lat'], attrs: { units: 'cm/s' }, data },
      ],
    });
    const r = openDataset(memorySource(ncgen(text, 'nc4')));
    const d = discoverFields(r);
    const s = userFieldSource(r, d);
    expect(s.grid).toMatchObject({
      nx: 4,
      ny: 3,
      x0: 0,
      dx: 90,
      y0: 40,
      dy: 10,
      lengthUnit: 'degrees',
      periodicX: true,
      periodicY: false,
    });
    const u = new Float64Array(12);
    s.read(0, { u });
    const want: number[] = [];
    for (const p of [40, 50, 60]) for (const l of [0, 90, 180, 270]) want.push((10 * p + l / 10) / 100); // cm/s → m/s
    u.forEach((x, k) => expect(x).toBeCloseTo(want[k], 14));
    expect(s.grid.notes).toContain(
      'geometry: longitude/latitude in degrees, not mapped onto a plane (give a planet to map it): diagnostics that need lengths are skipped',
    );
  });

  it('maps longitude/latitude onto the tangent plane: x = R cos φ0 (λ − λ0), y = R (φ − φ0)', () => {
    const text = cdl({
      dims: [
        { name: 'lat', size: 11 },
        { name: 'lon', size: 36 },
      ],
      vars: [
        {
          name: 'lat',
          type: 'double',
          dims: ['lat'],
          attrs: { units: 'degrees_north' },
          data: Array.from({ length: 11 }, (_, j) => 30 + 2 * j),
        },
        {
          name: 'lon',
          type: 'double',
          dims: ['lon'],
          attrs: { units: 'degrees_east' },
          data: Array.from({ length: 36 }, (_, i) => 10 * i),
        },
        {
          name: 'u',
          type: 'float',
          dims: ['lat', 'lon'],
          attrs: { units: 'm s-1' },
          data: Array.from({ length: 396 }, () => 1),
        },
      ],
    });
    const r = openDataset(memorySource(ncgen(text, 'nc3')));
    const R = PLANETS.earth.radius;
    const s = userFieldSource(r, discoverFields(r), { tangentPlane: { radius: R, label: 'Earth', lon0: 0 } });
    const rad = Math.PI / 180;
    expect(s.plane).toMatchObject({ lat0: 40, lon0: 0 });
    expect(s.grid.lengthUnit).toBe('m');
    expect(s.grid.dx).toBeCloseTo(R * Math.cos(40 * rad) * 10 * rad, 6);
    expect(s.grid.dy).toBeCloseTo(R * 2 * rad, 6);
    expect(s.grid.y0).toBeCloseTo(R * -10 * rad, 6);
    expect(s.grid.x0).toBe(0);
    expect(s.grid.periodicX).toBe(true);
    expect(s.grid.notes.some((n) => n.includes('This approximates the spherical geometry'))).toBe(true);
    expect(() =>
      userFieldSource(r, discoverFields(r), { tangentPlane: { radius: R, label: 'Earth', lat0: 90 } }),
    ).toThrow('the central latitude 90° must lie strictly between −90° and 90°');
  });

  it('refuses axes in different unit systems', () => {
    const text = cdl({
      dims: [
        { name: 'y', size: 3 },
        { name: 'x', size: 3 },
      ],
      vars: [
        { name: 'y', type: 'double', dims: ['y'], attrs: { units: 'm' }, data: [0, 1, 2] },
        { name: 'x', type: 'double', dims: ['x'], attrs: { units: '1' }, data: [0, 1, 2] },
        { name: 'u', type: 'double', dims: ['y', 'x'], data: [1, 2, 3, 4, 5, 6, 7, 8, 9] },
      ],
    });
    const r = openDataset(memorySource(ncgen(text, 'nc3')));
    expect(() => userFieldSource(r, discoverFields(r))).toThrow(
      'the axes are in different unit systems: "x" in "1", "y" in "m"',
    );
  });
});
