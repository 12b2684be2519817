import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { decodeParamsFile, encodeParamsFile } from '../../lib/io/paramsFile';

describe('parameter file', () => {
  it('keeps the parameters and the physical units through a round trip', () => {
    const f = {
      title: 'matched run',
      params: { ...DEFAULT_PARAMS },
      units: { kind: 'physical' as const, metresPerLength: 6366197.7236758135, secondsPerTime: 1061032.953945969 },
    };
    expect(decodeParamsFile(JSON.parse(encodeParamsFile(f)))).toEqual(f);
    const model = { params: { beta: 3 }, units: { kind: 'model' as const } };
    expect(decodeParamsFile(JSON.parse(encodeParamsFile(model)))).toEqual(model);
  });

  it('refuses a bad envelope, naming the field', () => {
    const ok = { format: 'stria-params', version: 1, params: {} };
    expect(() => decodeParamsFile({ ...ok, version: 2 })).toThrow(/version: this Stria reads version 1/);
    expect(() => decodeParamsFile({ ...ok, params: [] })).toThrow(/params: expected an object/);
    expect(() => decodeParamsFile({ ...ok, physical_units: { metres_per_length: 0, seconds_per_time: 1 } })).toThrow(
      /physical_units\.metres_per_length: expected a finite number > 0/,
    );
    expect(() => decodeParamsFile({ ...ok, extra: 1 })).toThrow(/extra: is not a field of a parameter file/);
  });
});
