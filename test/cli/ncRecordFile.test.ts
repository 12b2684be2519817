import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { NcRecordFile } from '../../cli/ncRecordFile';
import { ZONAL_MEAN_FILE } from '../../lib/io/cfStria';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { validateParams } from '../../lib/model/validateParams';
import { scratchDir } from './support/stria';

const dir = scratchDir('nc');

describe('NetCDF file growing record by record', () => {
  it('is a complete file after every record, before it is closed', () => {
    const params = validateParams({ nx: 32, ny: 32, kf: 8, dkf: 1.5 });
    const path = join(dir, 'zonal.nc');
    const file = new NcRecordFile(path, ZONAL_MEAN_FILE, {
      params,
      striaVersion: '0.1.0',
      createdAt: '2025-01-01T00:00:00Z',
    });
    expect(readNetcdf(readFileSync(path)).numRecords).toBe(0);
    const profile = (c: number) => Float64Array.from({ length: 32 }, (_, j) => c + j);
    for (let r = 0; r < 3; r++) {
      file.append({
        time: r + 0.5,
        steps: 10 * r,
        fields: { ubar: profile(r), qbar: profile(1), upvp: profile(2), vpqp: profile(3), eke: profile(4) },
      });
      const nc = readNetcdf(readFileSync(path));
      expect(nc.numRecords).toBe(r + 1);
      expect(Array.from(nc.readRecord('ubar', r))).toEqual(Array.from(profile(r)));
      expect(Array.from(nc.readVariable('time'))).toEqual(Array.from({ length: r + 1 }, (_, k) => k + 0.5));
    }
    file.close();
  });
});
