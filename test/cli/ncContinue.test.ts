import { appendFileSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { NcRecordFile } from '../../cli/ncRecordFile';
import { ZONAL_MEAN_FILE } from '../../lib/io/cfStria';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { validateParams } from '../../lib/model/validateParams';
import { scratchDir } from './support/stria';

const dir = scratchDir('nc-continue');
const params = validateParams({ nx: 32, ny: 32, kf: 8, dkf: 1.5 });
const run = { params, striaVersion: '0.1.0', createdAt: '2026-01-01T00:00:00Z', command: 'stria run' };
const profile = (c: number) => Float64Array.from({ length: 32 }, (_, j) => c + j / 7);
const frame = (r: number) => ({
  time: r + 0.5,
  steps: 10 * r,
  fields: { ubar: profile(r), qbar: profile(1), upvp: profile(2), vpqp: profile(3), eke: profile(4) },
});

describe('continuing a NetCDF file from a checkpoint', () => {
  it('keeps the first records, drops the rest and any cut-off tail, and grows on as one file', () => {
    const path = join(dir, 'z.nc');
    const whole = join(dir, 'whole.nc');
    const a = new NcRecordFile(path, ZONAL_MEAN_FILE, run);
    for (let r = 0; r < 5; r++) a.append(frame(r));
    a.close();
    appendFileSync(path, new Uint8Array(100).fill(7)); // a record cut short by a kill
    const b = NcRecordFile.continue(path, ZONAL_MEAN_FILE, run, 3);
    expect(readNetcdf(readFileSync(path)).numRecords).toBe(3);
    for (let r = 3; r < 6; r++) b.append(frame(r));
    b.close();
    const w = new NcRecordFile(whole, ZONAL_MEAN_FILE, run);
    for (let r = 0; r < 6; r++) w.append(frame(r));
    w.close();
    expect(readFileSync(path)).toEqual(readFileSync(whole));
  });

  it('rolls back in place, and refuses a file it did not write or that holds too few records', () => {
    const path = join(dir, 'roll.nc');
    const f = new NcRecordFile(path, ZONAL_MEAN_FILE, run);
    for (let r = 0; r < 4; r++) f.append(frame(r));
    f.rollBack(2, ZONAL_MEAN_FILE, run);
    f.append(frame(2));
    f.close();
    expect(Array.from(readNetcdf(readFileSync(path)).readVariable('time'))).toEqual([0.5, 1.5, 2.5]);
    expect(() => NcRecordFile.continue(path, ZONAL_MEAN_FILE, { ...run, command: 'stria run --other' }, 2)).toThrow(
      /its header differs from the one this run writes/,
    );
    expect(() => NcRecordFile.continue(path, ZONAL_MEAN_FILE, run, 4)).toThrow(
      /it holds 3 records, but 4 were written before the checkpoint/,
    );
    // Record 2's time set back before record 1's: not a record this run could have written.
    const nc = readNetcdf(readFileSync(path));
    const { offset } = nc.slabRange('time', 2);
    const bytes = readFileSync(path);
    new DataView(bytes.buffer, bytes.byteOffset).setFloat64(offset, 1.0, false);
    writeFileSync(join(dir, 'backwards.nc'), bytes);
    expect(statSync(join(dir, 'backwards.nc')).size).toBe(bytes.length);
    expect(() => NcRecordFile.continue(join(dir, 'backwards.nc'), ZONAL_MEAN_FILE, run, 3)).toThrow(
      /backwards\.nc: record 2: .*does not increase/,
    );
    expect(() => NcRecordFile.continue(join(dir, 'missing.nc'), ZONAL_MEAN_FILE, run, 0)).toThrow(
      /cannot continue .*missing\.nc: ENOENT/,
    );
  });
});
