import { describe, expect, it } from 'vitest';
import { memorySource } from '../../lib/io/byteSource';
import { coordinateAxis, regularSpacing } from '../../lib/userfile/coordinateAxis';
import { openDataset } from '../../lib/io/openDataset';
import { cdl } from '../support/cdl';
import { ncgen, runNcgen } from '../io/ncgenTool';

describe('regular coordinate axes', () => {
  it('accepts a regular axis, ascending or descending, within the tolerance', () => {
    expect(regularSpacing('x', Float64Array.from([0, 2, 4, 6]))).toEqual({
      start: 0,
      spacing: 2,
      reversed: false,
      irregularity: 0,
    });
    expect(regularSpacing('lat', Float64Array.from([90, 45, 0, -45, -90]))).toMatchObject({
      start: -90,
      spacing: 45,
      reversed: true,
    });
    // Single-precision coordinates: 0.1° steps stored as floats deviate by ~1e-6 of the spacing.
    const f32 = Float64Array.from({ length: 3600 }, (_, i) => Math.fround(i * 0.1));
    expect(regularSpacing('lon', f32).irregularity).toBeLessThan(1e-3);
  });

  it('refuses an irregular axis, naming it, the worst deviation and where it is', () => {
    const gauss = Float64Array.from([0, 1, 2, 3.3, 4, 5]);
    expect(() => regularSpacing('lat', gauss)).toThrow(
      'irregular grid: axis "lat" is not regularly spaced — its worst deviation from a regular spacing of 1 is 0.3 at index 3 (30% of the spacing; the tolerance is 0.1%).',
    );
    expect(() => regularSpacing('x', Float64Array.from([1]))).toThrow('axis "x" has 1 point; at least 2 are needed');
    expect(() => regularSpacing('x', Float64Array.from([0, NaN, 2]))).toThrow(
      'axis "x" has a missing or non-finite position at index 1',
    );
  });

  it.runIf(runNcgen)(
    'reads units and periods: km, degrees with 360° longitude, a modulo attribute, and a given domain length',
    () => {
      const text = cdl({
        dims: [
          { name: 'lon', size: 8 },
          { name: 'lat', size: 4 },
          { name: 'xk', size: 5 },
          { name: 'n', size: 6 },
        ],
        vars: [
          {
            name: 'lon',
            type: 'double',
            dims: ['lon'],
            attrs: { units: 'degrees_east' },
            data: [0, 45, 90, 135, 180, 225, 270, 315],
          },
          { name: 'lat', type: 'double', dims: ['lat'], attrs: { units: 'degree_N' }, data: [60, 50, 40, 30] },
          { name: 'xk', type: 'double', dims: ['xk'], attrs: { units: 'km', modulo: 50 }, data: [0, 10, 20, 30, 40] },
        ],
      });
      const r = openDataset(memorySource(ncgen(text, 'nc3')));
      expect(coordinateAxis(r, 'lon', 'x')).toMatchObject({
        kind: 'longitude',
        scale: 'degrees',
        spacing: 45,
        period: 360,
        periodSource: 'longitude (360°)',
      });
      expect(coordinateAxis(r, 'lat', 'y')).toMatchObject({
        kind: 'latitude',
        start: 30,
        spacing: 10,
        reversed: true,
        period: null,
      });
      expect(coordinateAxis(r, 'xk', 'x')).toMatchObject({
        kind: 'x',
        scale: 1000,
        period: 50,
        periodSource: 'the "modulo" attribute of "xk"',
      });
      expect(coordinateAxis(r, 'n', 'y', { length: 3 })).toMatchObject({
        variable: null,
        spacing: 0.5,
        scale: 'model',
        period: 3,
      });
      expect(() => coordinateAxis(r, 'n', 'y')).toThrow(
        'dimension "n" has no coordinate variable, so its positions are unknown: give the domain length (--domain) to place its 6 points at i·L/6',
      );
      expect(() => coordinateAxis(r, 'lat', 'x')).toThrow(
        /is in degrees_north but is the second of the field's horizontal dimensions/,
      );
    },
  );
});
