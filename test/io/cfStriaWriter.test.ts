import { describe, expect, it } from 'vitest';
import { SnapshotPlan } from '../../lib/analysis/snapshot';
import { ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import type { StriaRunInfo } from '../../lib/io/cfGlobalAttributes';
import { SNAPSHOT_FILE, ZONAL_MEAN_FILE } from '../../lib/io/cfStria';
import {
  encodeSnapshotFile,
  encodeStriaFile,
  encodeZonalMeanFile,
  snapshotFrame,
  StriaFileWriter,
  zonalMeanFrame,
  type StriaFrame,
} from '../../lib/io/cfStriaWriter';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { Model } from '../../lib/model/model';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { randomArray } from '../support/random';
import { QUIET, randomKeptState } from '../support/modelFixtures';

// Stria files written and read back: values in Stria's grid order, unit conversion, record-by-record
// writing that leaves a complete file after every frame, CF 5's strictly monotonic time.
const params = { ...DEFAULT_PARAMS, nx: 32, ny: 32 };
const run: StriaRunInfo = { params, striaVersion: '0.1.0', createdAt: '2025-01-31T12:00:00Z', command: 'stria run' };
const n = params.nx * params.ny;

function zonalFrame(t: number, seed: number): StriaFrame {
  const ny = params.ny;
  return {
    time: t,
    steps: 10 * t,
    fields: {
      ubar: randomArray(ny, seed),
      qbar: randomArray(ny, seed + 1),
      upvp: randomArray(ny, seed + 2),
      vpqp: randomArray(ny, seed + 3),
      eke: randomArray(ny, seed + 4),
    },
  };
}

describe('Stria snapshot files', () => {
  it('store the gridded fields of a model state as they are, bit for bit', () => {
    const model = new Model({ ...params, ...QUIET });
    const plan = new SnapshotPlan(model.params);
    const frames = [0, 1, 2].map((k) =>
      snapshotFrame(0.25 * k, 50 * k, plan.gridFields(randomKeptState(model, 5 + k))),
    );
    const f = readNetcdf(encodeSnapshotFile(run, frames));
    expect(f.numRecords).toBe(3);
    expect(f.attributes.stria_file_kind).toBe('snapshots');
    expect(Array.from(f.readVariable('time'))).toEqual([0, 0.25, 0.5]);
    expect(Array.from(f.readVariable('step'))).toEqual([0, 50, 100]);
    expect(f.variable('u').shape).toEqual([3, 32, 32]);
    for (let r = 0; r < 3; r++) {
      for (const name of ['q', 'zeta', 'psi', 'u', 'v'])
        expect(Array.from(f.readRecord(name, r)), `${name} ${r}`).toEqual(Array.from(frames[r].fields[name as 'q']));
    }
  });

  it('rounds to float when asked, and converts to physical units', () => {
    const field = randomArray(n, 2);
    const frame = { time: 2, steps: 4, fields: { q: field, zeta: field, psi: field, u: field, v: field } };
    const single = readNetcdf(encodeSnapshotFile(run, [frame], { precision: 'float', format: 'cdf1' }));
    expect(single.format).toBe('cdf1');
    expect(Array.from(single.readRecord('u', 0))).toEqual(Array.from(Float32Array.from(field)));

    const L = 5e4;
    const T = 3600;
    const phys = readNetcdf(
      encodeSnapshotFile({ ...run, units: { kind: 'physical', metresPerLength: L, secondsPerTime: T } }, [frame]),
    );
    expect(phys.readVariable('time')[0]).toBe(2 * T);
    const psi = phys.readRecord('psi', 0);
    const u = phys.readRecord('u', 0);
    const q = phys.readRecord('q', 0);
    for (const i of [0, 17, n - 1]) {
      expect(psi[i]).toBe(field[i] * ((L * L) / T));
      expect(u[i]).toBe(field[i] * (L / T));
      expect(q[i]).toBe(field[i] * (1 / T));
    }
    expect(phys.variable('x').attributes.units).toBe('m');
    expect(phys.readVariable('x')[1]).toBeCloseTo((params.Lx * L) / 32, 6);
  });
});

describe('Stria zonal-mean files', () => {
  it('store profiles in y as a time series', () => {
    const frames = [0, 1, 2, 3].map((t) => zonalFrame(t, 10 * t));
    const f = readNetcdf(encodeZonalMeanFile(run, frames));
    expect(f.dimensions.map((d) => [d.name, d.size])).toEqual([
      ['time', 4],
      ['y', 32],
    ]);
    expect(f.attributes.stria_file_kind).toBe('zonal_means');
    for (const name of ['ubar', 'qbar', 'upvp', 'vpqp', 'eke']) {
      expect(f.variable(name).dimensions).toEqual(['time', 'y']);
      expect(Array.from(f.readRecord(name, 3))).toEqual(Array.from(frames[3].fields[name]));
    }
  });
});

describe('frames from the analysis', () => {
  const model = new Model({ ...params, ...QUIET, beta: 3 });
  const fields = new SnapshotPlan(model.params).gridFields(randomKeptState(model, 21));
  const zm = new ZonalMeanPlan(params, { beta: 3 }).compute(fields);

  it("writes the total PV of ZonalMeans (qtot, with beta y) as the file's qbar", () => {
    const f = readNetcdf(encodeZonalMeanFile(run, [zonalMeanFrame(1, 2, zm)]));
    expect(Array.from(f.readRecord('qbar', 0))).toEqual(Array.from(zm.qtot));
    expect(Array.from(f.readRecord('eke', 0))).toEqual(Array.from(zm.eke));
  });

  it('refuses ZonalMeans passed as they are, whose qbar is the anomaly', () => {
    expect(() => encodeZonalMeanFile(run, [{ time: 0, steps: 0, fields: zm as never }])).toThrow(
      /"qtot" is not a field of a zonal_means file .* build frames from ZonalMeans with zonalMeanFrame/,
    );
  });

  it('takes GridFields as they are (their size numbers are not fields)', () => {
    const f = readNetcdf(encodeSnapshotFile(run, [{ time: 0, steps: 0, fields: fields as never }]));
    expect(Array.from(f.readRecord('psi', 0))).toEqual(Array.from(fields.psi));
  });
});

describe('StriaFileWriter', () => {
  it('leaves a complete file after every frame, equal to the whole-file encoding at the end', () => {
    const frames = [0, 0.5, 1].map((t, k) => zonalFrame(t, k));
    const w = new StriaFileWriter(ZONAL_MEAN_FILE, run);
    let file: Uint8Array = w.head();
    for (const [k, frame] of frames.entries()) {
      const record = w.appendFrame(frame);
      const grown = new Uint8Array(file.length + record.length);
      grown.set(file);
      grown.set(record, w.recordOffset(k));
      grown.set(w.numrecsField(), StriaFileWriter.NUMRECS_OFFSET);
      file = grown;
      const view = readNetcdf(file);
      expect(view.numRecords).toBe(k + 1);
      expect(view.readRecord('time', k)[0]).toBe(frame.time);
    }
    expect(Array.from(file)).toEqual(Array.from(encodeStriaFile(ZONAL_MEAN_FILE, run, frames)));
  });

  it('refuses frames that would make a bad file, naming the problem', () => {
    const w = new StriaFileWriter(ZONAL_MEAN_FILE, run);
    w.appendFrame(zonalFrame(1, 0));
    expect(() => w.appendFrame(zonalFrame(1, 0))).toThrow(
      /frame 1: time 1 does not increase \(previous 1\); CF coordinates must be strictly monotonic/,
    );
    expect(() => w.appendFrame({ ...zonalFrame(2, 0), time: NaN })).toThrow(/time must be a finite number/);
    expect(() => w.appendFrame({ ...zonalFrame(2, 0), steps: -1 })).toThrow(/steps must be a non-negative integer/);
    const { eke: _eke, ...noEke } = zonalFrame(2, 0).fields;
    expect(() => w.appendFrame({ time: 2, steps: 0, fields: noEke })).toThrow(
      /field "eke" is missing \(a zonal_means file holds ubar, qbar, upvp, vpqp, eke\)/,
    );
    expect(() => w.appendFrame({ time: 2, steps: 0, fields: { ...noEke, eke: new Float64Array(31) } })).toThrow(
      /record 1 of variable "eke" needs 32 values, got 31/,
    );
    expect(w.numrecs).toBe(1);
    expect(() => new StriaFileWriter(SNAPSHOT_FILE, { ...run, createdAt: 'now' })).toThrow(/createdAt/);
  });
});
