import { reduceHugeArgument } from './hugeArgument';
import { INV_FACT, ROUNDER } from './portableMath';

/**
 * cos and sin with the same bits on every JavaScript engine (why: portableMath.ts), about 1 ulp:
 *   cis x       (cos x, sin x): x = n·π/2 + r, |r| ≤ π/4, with π/2 in five parts of 28 bits (each
 *               n·part exact for |x| < 2²⁵) summed exactly (two-sum), or from the bits of 2/π for
 *               larger |x| (hugeArgument.ts); cos r and sin r by their Taylor series to r¹⁶ and r¹⁷
 *   cisTurns u  (cos 2πu, sin 2πu): u = n/4 + f exactly, then r = 2πf; exact quadrants for the FFT's
 *               twiddles (u = m/n) and the random phases (u uniform in [0, 1))
 */

// π/2 in five parts of 28 significant bits each (test/model/portableMath.test.ts checks the sum).
const PIO2_1 = 1.570796325802803;
const PIO2_2 = 9.9209357395935172e-10;
const PIO2_3 = 5.7211887096635749e-18;
const PIO2_4 = 1.6446256892965207e-26;
const PIO2_5 = 4.3359050623281898e-35;
const PIO2_TAIL = [PIO2_2, PIO2_3, PIO2_4, PIO2_5];
/** The five parts, for the test that they sum to π/2. */
export const PIO2_PARTS: readonly number[] = [PIO2_1, ...PIO2_TAIL];
const TWO_OVER_PI = 0.6366197723675814;
const TWO_PI = 2 * Math.PI;
/** Below this |x| the five-part reduction is exact in its products (n < 2²⁵, parts of 28 bits). */
const MEDIUM = 33554432;

const [, , , F3, F4, F5, F6, F7, F8, F9, F10, F11, F12, F13, F14, F15, F16, F17] = INV_FACT;

/** cos r and sin r before the rotation by quadrant (module-level scratch). */
const pair = new Float64Array(2);

/** a·cos and a·sin of r + qπ/2, for |r| ≤ π/4 (a little beyond is fine). */
function cisKernel(r: number, q: number, a: number, out: Float64Array): void {
  const z = r * r;
  const z2 = z * z;
  const z4 = z2 * z2;
  // cos r = 1 − (z/2 − z²(1/4! − z/6! + … + z⁶/16!)), sin r = r − r·z·(1/3! − z/5! + … + z⁷/17!),
  // the brackets in pairs as in expPortable.
  const c = F4 - F6 * z + z2 * (F8 - F10 * z) + z4 * (F12 - F14 * z + z2 * F16);
  const s = F3 - F5 * z + z2 * (F7 - F9 * z) + z4 * (F11 - F13 * z + z2 * (F15 - F17 * z));
  pair[0] = 1 - (0.5 * z - z2 * c);
  pair[1] = r - r * z * s;
  // Rotate by q quarter turns without a branch (a random phase's quadrant is unpredictable):
  // (cos, sin) of r + qπ/2 is (c, s), (−s, c), (−c, −s), (s, −c); ±1 and a scale by a are exact.
  const swap = q & 1;
  out[0] = pair[swap] * (a * (1 - 2 * (((q + 1) >> 1) & 1)));
  out[1] = pair[swap ^ 1] * (a * (1 - 2 * (q >> 1)));
}

/** out[0] = cos x, out[1] = sin x (radians), the same bits everywhere; NaN for a non-finite x. */
export function cisPortable(x: number, out: Float64Array): void {
  if (!Number.isFinite(x)) {
    out[0] = out[1] = NaN;
    return;
  }
  const a = Math.abs(x);
  if (a <= 0.7853981633974483) return cisKernel(x, 0, 1, out);
  if (a >= MEDIUM) {
    const h = reduceHugeArgument(a);
    cisKernel(x < 0 ? -h.r : h.r, x < 0 ? (4 - h.quadrant) & 3 : h.quadrant, 1, out);
    return;
  }
  // x − n·π/2 with every product exact, summed with the exact error of each subtraction kept.
  const n = x * TWO_OVER_PI + ROUNDER - ROUNDER;
  let hi = x - n * PIO2_1; // exact: x and n·PIO2_1 are within a factor 2 of each other (Sterbenz)
  let lo = 0;
  for (let i = 0; i < 4; i++) {
    const p = n * PIO2_TAIL[i];
    const s = hi - p;
    const back = s - hi;
    lo += hi - (s - back) - (p + back);
    hi = s;
  }
  cisKernel(hi + lo, n & 3, 1, out); // |n| < 2²⁵: an int32, and & 3 is n mod 4 for negative n too
}

/** n mod 4 in 0..3 for an integer-valued n: bit arithmetic in int32 range, exact floating point beyond. */
function quadrantOf(n: number): number {
  return n < 2147483648 && n >= -2147483648 ? n & 3 : n - 4 * Math.floor(n * 0.25);
}

/** out[0] = a·cos 2πu, out[1] = a·sin 2πu (a = 1 unless given), the same bits everywhere; NaN for a non-finite u. */
export function cisTurnsPortable(u: number, out: Float64Array, a = 1): void {
  if (!Number.isFinite(u)) {
    out[0] = out[1] = NaN;
    return;
  }
  const n = Math.abs(u) < 562949953421312 ? 4 * u + ROUNDER - ROUNDER : Math.round(4 * u); // |4u| < 2⁵¹ for the rounder
  // u − n/4 is exact: both are multiples of the smaller of ulp(u) and 1/4, and it is at most 1/8.
  cisKernel(TWO_PI * (u - n * 0.25), quadrantOf(n), a, out);
}
