/**
 * x mod π/2 for a large argument (|x| ≥ 2²⁵ rad), exactly enough that cos and sin of it are good to
 * the last bit, from the binary digits of 2/π (x = m·2^e with an integer m < 2⁵³; the digits of 2/π
 * needed reach down to 2^(−e−180)). Only linear-operator phases ω·dt of very fast waves get here, so
 * this path is rare and may be slow (BigInt).
 */

/** Bits of 2/π kept: enough for any double (e ≤ 971) with 180 bits beyond the binary point. */
const PRECISION = 1300;

let twoOverPi: bigint | null = null;

/** floor(π·2^bits) by Machin's formula π = 16 artan(1/5) − 4 artan(1/239), in fixed point. */
export function piFixed(bits: number): bigint {
  const guard = 16n;
  const one = 1n << (BigInt(bits) + guard);
  const arctanInverse = (k: bigint): bigint => {
    let term = one / k;
    let sum = term;
    for (let n = 1n; term !== 0n; n++) {
      term /= k * k;
      const t = term / (2n * n + 1n);
      sum += n % 2n === 1n ? -t : t;
    }
    return sum;
  };
  return (16n * arctanInverse(5n) - 4n * arctanInverse(239n)) >> guard;
}

/** floor(2/π · 2^PRECISION), computed once on first use. */
function twoOverPiBits(): bigint {
  if (twoOverPi === null) {
    const pi = piFixed(PRECISION + 64);
    twoOverPi = (2n << BigInt(2 * PRECISION + 64)) / pi;
  }
  return twoOverPi;
}

const PIO2_HI = 1.5707963267948966;
const PIO2_LO = 6.123233995736766e-17;
const TWO_120 = Number(1n << 120n);

/** For x ≥ 2²⁵ (finite): x = (4j + quadrant)·π/2 + r with |r| ≤ π/4. */
export function reduceHugeArgument(x: number): { quadrant: number; r: number } {
  // x = m·2^e, m an integer below 2⁵³ (halving and doubling are exact here).
  let m = x;
  let e = 0;
  while (m >= 9007199254740992) {
    m *= 0.5;
    e++;
  }
  while (!Number.isInteger(m)) {
    m *= 2;
    e--;
  }
  // x·2/π = m·T·2^(e − PRECISION), T = floor(2/π · 2^PRECISION): split at the binary point.
  const shift = BigInt(PRECISION - e);
  const prod = BigInt(m) * twoOverPiBits();
  let quadrant = Number((prod >> shift) & 3n);
  let frac = prod & ((1n << shift) - 1n);
  if (frac >= 1n << (shift - 1n)) {
    frac -= 1n << shift;
    quadrant = (quadrant + 1) & 3;
  }
  // The fraction of a quarter turn, to 120 bits, then times π/2 in two parts.
  const f = Number(frac >> (shift - 120n)) / TWO_120;
  return { quadrant, r: f * PIO2_HI + f * PIO2_LO };
}
