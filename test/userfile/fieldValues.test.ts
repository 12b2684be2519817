import { describe, expect, it } from 'vitest';
import { memorySource } from '../../lib/io/byteSource';
import type { DatasetVariable } from '../../lib/io/datasetReader';
import { applyValueRule, newMaskCounts, valueRule } from '../../lib/userfile/fieldValues';
import { openDataset } from '../../lib/io/openDataset';
import { cdl } from '../support/cdl';
import { ncgen, runNcgen } from '../io/ncgenTool';

const variable = (type: DatasetVariable['type'], attributes: DatasetVariable['attributes']): DatasetVariable => ({
  name: 'f',
  type,
  dimensions: ['x'],
  shape: [1],
  attributes,
});

describe('masking and unpacking of stored values', () => {
  // CF Conventions 1.8, sections 2.5.1 (_FillValue, missing_value, valid_min/valid_max/valid_range,
  // compared with the stored values) and 8.1 (value = stored·scale_factor + add_offset) [published].
  it('masks fill, missing_value, non-finite and out-of-range values, counting each reason', () => {
    const rule = valueRule(
      variable('float64', { _FillValue: -999, missing_value: [-888, -777], valid_range: [-50, 50] }),
    );
    const raw = Float64Array.from([1, -999, -888, -777, NaN, Infinity, 51, -50, 50]);
    const counts = newMaskCounts();
    const out = new Float64Array(raw.length);
    expect(applyValueRule(rule, raw, out, counts)).toBe(6);
    expect(Array.from(out)).toEqual([1, NaN, NaN, NaN, NaN, NaN, NaN, -50, 50]);
    expect(counts).toEqual({ total: 9, nonFinite: 2, fill: 3, outOfRange: 1 });
  });

  it('unpacks packed integers after masking in the stored domain', () => {
    const rule = valueRule(
      variable('int16', { scale_factor: 0.01, add_offset: 10, _FillValue: -32767, valid_min: -1000 }),
      100,
    );
    const out = new Float64Array(4);
    applyValueRule(rule, Float64Array.from([0, 250, -32767, -1001]), out, newMaskCounts());
    // (stored·0.01 + 10) m/s → ×100: the unit factor applies to the unpacked value.
    expect(out[0]).toBeCloseTo(1000, 12);
    expect(out[1]).toBeCloseTo(1250, 12);
    expect(out.slice(2).every(Number.isNaN)).toBe(true);
  });

  it('compares float attributes in single precision, as stored', () => {
    const rule = valueRule(variable('float32', { _FillValue: 1e20 }));
    const out = new Float64Array(1);
    applyValueRule(rule, Float64Array.of(Math.fround(1e20)), out, newMaskCounts());
    expect(out[0]).toBeNaN();
  });

  it('takes the default fill value of the type when _FillValue is absent, but not for bytes', () => {
    // NetCDF Users Guide, default fill values NC_FILL_FLOAT = 9.9692099683868690e36, NC_FILL_SHORT = −32767 [published].
    const out = new Float64Array(1);
    applyValueRule(
      valueRule(variable('float32', {})),
      Float64Array.of(Math.fround(9.969209968386869e36)),
      out,
      newMaskCounts(),
    );
    expect(out[0]).toBeNaN();
    applyValueRule(valueRule(variable('int16', {})), Float64Array.of(-32767), out, newMaskCounts());
    expect(out[0]).toBeNaN();
    applyValueRule(valueRule(variable('int8', {})), Float64Array.of(-127), out, newMaskCounts());
    expect(out[0]).toBe(-127);
  });

  it.runIf(runNcgen)('masks what the NetCDF library writes for unwritten values ("_" in CDL), in both formats', () => {
    const text = cdl({
      dims: [{ name: 'x', size: 4 }],
      vars: [
        { name: 'a', type: 'float', dims: ['x'], data: [1, null, 3, null] },
        { name: 'b', type: 'double', dims: ['x'], attrs: { _FillValue: -1 }, data: [null, 2, 3, 4] },
        { name: 'c', type: 'short', dims: ['x'], data: [5, null, 7, 8] },
      ],
    });
    for (const kind of ['nc3', 'nc4'] as const) {
      const r = openDataset(memorySource(ncgen(text, kind)));
      for (const [name, want] of [
        ['a', [1, NaN, 3, NaN]],
        ['b', [NaN, 2, 3, 4]],
        ['c', [5, NaN, 7, 8]],
      ] as const) {
        const raw = r.readAll(name);
        applyValueRule(valueRule(r.variable(name)), raw, raw, newMaskCounts());
        expect(Array.from(raw)).toEqual(want);
      }
    }
  });
});
