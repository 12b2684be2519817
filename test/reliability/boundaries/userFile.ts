import fc from 'fast-check';
import { memorySource } from '../../../lib/io/byteSource';
import { analyzeFile } from '../../../lib/userfile/analyzeFile';
import { ncgen } from '../../io/ncgenTool';
import { PropertyFailure, type Boundary } from '../support/boundary';

/**
 * analyzeFile, the entry of `stria analyze` and of the Compare view, on users' files damaged at
 * random: a small netCDF-4 file (chunked, deflated, a compound attribute, a named type) and its
 * NetCDF-3 twin, both written by ncgen, with bits flipped (mostly in the first few kB, where the
 * structure is), bytes overwritten and cut short. A refusal is a RangeError in plain words: none of
 * jsfive's own strings or the JavaScript engine's messages ("… is not a function", "Offset is outside
 * the bounds of the DataView", "Invalid typed array length") and no control characters; an accepted
 * file gives an analysis. Every case runs with a memory budget, so that dimensions a flipped bit made
 * huge are refused by the estimate, not allocated.
 */
const n = 16;
const grid = (f: (i: number, j: number) => number) =>
  Array.from({ length: 2 * n * n }, (_, k) => f(k % n, Math.floor(k / n) % n).toPrecision(5)).join(', ');
const axis = Array.from({ length: n }, (_, i) => i * 1000).join(', ');
const CDL = `netcdf damaged {
types:
  compound pair { int a ; double b ; } ;
dimensions:
  time = UNLIMITED ; y = ${n} ; x = ${n} ;
variables:
  double time(time) ; time:units = "s" ;
  double y(y) ; y:units = "m" ; y:axis = "Y" ;
  double x(x) ; x:units = "m" ; x:axis = "X" ;
  float u(time, y, x) ;
    u:units = "m s-1" ;
    u:_ChunkSizes = 1, 8, 8 ;
    u:_DeflateLevel = 1 ;
    pair u:meta = {1, 2.5} ;
  float v(time, y, x) ;
    v:units = "m s-1" ;
    pair v:meta = {1, 2.5} ;
data:
  time = 0, 1 ;
  y = ${axis} ;
  x = ${axis} ;
  u = ${grid((i, j) => Math.cos((2 * Math.PI * j) / n) + 0.1 * Math.sin((2 * Math.PI * i) / n))} ;
  v = ${grid((i) => 0.1 * Math.cos((2 * Math.PI * i) / n))} ;
}
`;
const FILES = [
  ncgen(CDL, 'nc4'),
  ncgen(CDL.replace(/^.*(_ChunkSizes|_DeflateLevel|types:|compound|pair ).*$/gm, ''), 'nc3'),
];

const LOW_LEVEL =
  /is not a function|Cannot read propert|outside the bounds|Invalid (typed )?array length|allocation failed|must be an ArrayBuffer|InvalidHDF5File|undefined|\[object /i;

const file = fc.constantFrom(...FILES);
const position = (len: number) =>
  fc.oneof(
    { weight: 3, arbitrary: fc.nat({ max: Math.min(len, 6000) - 1 }) },
    { weight: 1, arbitrary: fc.nat({ max: len - 1 }) },
  );

export const boundary: Boundary<Uint8Array> = {
  arbitrary: fc.oneof(
    {
      weight: 5,
      arbitrary: file.chain((f) =>
        fc
          .array(fc.tuple(position(f.length), fc.integer({ min: 0, max: 7 })), { minLength: 1, maxLength: 4 })
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
          b.fill(x, i, i + 8);
          return b;
        }),
      ),
    },
    { weight: 1, arbitrary: file.chain((f) => fc.nat({ max: f.length }).map((k) => f.slice(0, k))) },
  ),
  check(bytes) {
    try {
      analyzeFile(memorySource(bytes), { memoryBudget: 256 * 2 ** 20 });
    } catch (e) {
      if (!(e instanceof RangeError))
        throw new PropertyFailure(
          `analyzeFile threw ${e instanceof Error ? `${e.name}: ${e.message}` : `a ${typeof e}: ${String(e)}`}, not a RangeError`,
        );
      if (LOW_LEVEL.test(e.message))
        throw new PropertyFailure(`the refusal speaks of the program, not the file: ${e.message}`);
      // eslint-disable-next-line no-control-regex -- control characters are what is looked for
      if (/[\u0000-\u001f\u007f-\u009f\ufffd]/.test(e.message))
        throw new PropertyFailure(`the refusal shows unprintable text from the file: ${JSON.stringify(e.message)}`);
      return 'rejected';
    }
    return 'accepted';
  },
  preview: (b) => `${b.length} bytes`,
};
