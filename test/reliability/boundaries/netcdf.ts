import fc from 'fast-check';
import type { StriaRunInfo } from '../../../lib/io/cfGlobalAttributes';
import { encodeSnapshotFile, encodeZonalMeanFile } from '../../../lib/io/cfStriaWriter';
import { readNetcdf } from '../../../lib/io/netcdfRead';
import { validateParams } from '../../../lib/model/validateParams';
import { PropertyFailure, type Boundary } from '../support/boundary';

/**
 * readNetcdf: real Stria files (snapshots and zonal means, several records) cut at any length,
 * with bits flipped (mostly in the header, where the parsing is), bytes overwritten, and random
 * bytes with and without a NetCDF magic number. A refusal is a RangeError whose message says what
 * is wrong with the NetCDF file; an accepted file reads every variable in full, with as many values
 * as its header says, within the time limit.
 */
const params = validateParams({ nx: 32, ny: 32, kf: 8, dkf: 1.5 });
const run: StriaRunInfo = { params, striaVersion: '0.1.0', createdAt: '2026-01-01T00:00:00Z', command: 'stria run' };
const grid = (k: number, n: number) => Float64Array.from({ length: n }, (_, i) => Math.sin(0.1 * i + k));
const FILES = [
  encodeSnapshotFile(
    run,
    [0, 1, 2].map((r) => ({
      time: r + 0.5,
      steps: 10 * r,
      fields: { q: grid(r, 1024), zeta: grid(1, 1024), psi: grid(2, 1024), u: grid(3, 1024), v: grid(4, 1024) },
    })),
  ),
  encodeZonalMeanFile(
    run,
    [0, 1, 2, 3, 4].map((r) => ({
      time: r + 1,
      steps: r,
      fields: { ubar: grid(r, 32), qbar: grid(1, 32), upvp: grid(2, 32), vpqp: grid(3, 32), eke: grid(4, 32) },
    })),
  ),
];

const file = fc.constantFrom(...FILES);
/** Positions weighted to the header: most of the parsing (and of the ways to go wrong) is there. */
const position = (n: number) =>
  fc.oneof(
    { weight: 3, arbitrary: fc.nat({ max: Math.min(n, 2048) - 1 }) },
    { weight: 1, arbitrary: fc.nat({ max: n - 1 }) },
  );
const inputs: fc.Arbitrary<Uint8Array> = fc.oneof(
  { weight: 1, arbitrary: fc.uint8Array({ maxLength: 512 }) },
  {
    weight: 1,
    arbitrary: fc
      .tuple(fc.constantFrom(1, 2, 5, 9), fc.uint8Array({ maxLength: 512 }))
      .map(([v, b]) => Uint8Array.from([0x43, 0x44, 0x46, v, ...b])),
  },
  { weight: 3, arbitrary: file.chain((f) => fc.nat({ max: f.length }).map((n) => f.slice(0, n))) },
  {
    weight: 4,
    arbitrary: file.chain((f) =>
      fc
        .array(fc.tuple(position(f.length), fc.integer({ min: 0, max: 7 })), { minLength: 1, maxLength: 8 })
        .map((flips) => {
          const b = f.slice();
          for (const [i, bit] of flips) b[i] ^= 1 << bit;
          return b;
        }),
    ),
  },
  {
    weight: 2,
    arbitrary: file.chain((f) =>
      fc.tuple(position(f.length), fc.constantFrom(0x00, 0xff, 0x7f, 0x80)).map(([i, x]) => {
        const b = f.slice();
        b.fill(x, i, i + 4);
        return b;
      }),
    ),
  },
);

export const boundary: Boundary<Uint8Array> = {
  arbitrary: inputs,
  check(bytes) {
    let nc;
    try {
      nc = readNetcdf(bytes);
    } catch (e) {
      if (!(e instanceof RangeError))
        throw new PropertyFailure(
          `readNetcdf threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}, not a RangeError`,
        );
      if (!/NetCDF/.test(e.message))
        throw new PropertyFailure(`the refusal does not say what is wrong with the file: ${e.message}`);
      return 'rejected';
    }
    for (const v of nc.variables) {
      let values;
      try {
        values = nc.readVariable(v.name);
      } catch (e) {
        throw new PropertyFailure(
          `accepted, then reading "${v.name}" threw ${e instanceof Error ? `${e.name}: ${e.message}` : String(e)}`,
        );
      }
      const want = v.slabCount * (v.isRecord ? nc.numRecords : 1);
      if (values.length !== want)
        throw new PropertyFailure(`accepted, then "${v.name}" read ${values.length} values, its header says ${want}`);
    }
    return nc.numRecords === 0 ? 'accepted, no records' : 'accepted';
  },
};
