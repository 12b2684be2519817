/**
 * ln(j/64) for j = 48..96 (c from 3/4 to 3/2 in steps of 1/64) as pairs of doubles (hi + lo, about
 * 106 bits): the table of portableMath.ts's logarithm. Computed once at load in exact integer
 * arithmetic (BigInt), so every engine builds the same table: ln(j/64) = 2 artanh((j − 64)/(j + 64)),
 * the series summed in fixed point with 160 fractional bits.
 */
export const LOG_FIRST = 48;
export const LOG_LAST = 96;
export const LOG_DENOMINATOR = 64;

const FRACTION = 160n;
const SCALE = Number(1n << FRACTION);

/** 2 artanh(p/q)·2^FRACTION, rounded toward zero at each term (|p| < q, integers). */
export function twiceArtanhFixed(p: bigint, q: bigint): bigint {
  const one = 1n << FRACTION;
  let power = (one * p) / q; // (p/q)^(2k+1) in fixed point
  let sum = 0n;
  for (let k = 0n; power !== 0n; k++) {
    sum += power / (2n * k + 1n);
    power = (power * p * p) / (q * q);
  }
  return 2n * sum;
}

/** A fixed-point value (scale 2^FRACTION) as hi + lo doubles. */
export function fixedToPair(v: bigint): [number, number] {
  const top = Number(v); // the nearest double: an integer at this scale
  return [top / SCALE, Number(v - BigInt(top)) / SCALE];
}

const size = LOG_LAST - LOG_FIRST + 1;
/** ln(j/64) ≈ LOG_HI[j − 48] + LOG_LO[j − 48]. */
export const LOG_HI = new Float64Array(size);
export const LOG_LO = new Float64Array(size);
for (let j = LOG_FIRST; j <= LOG_LAST; j++) {
  [LOG_HI[j - LOG_FIRST], LOG_LO[j - LOG_FIRST]] = fixedToPair(
    twiceArtanhFixed(BigInt(j - LOG_DENOMINATOR), BigInt(j + LOG_DENOMINATOR)),
  );
}
