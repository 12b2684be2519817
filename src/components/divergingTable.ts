import chroma from 'chroma-js';

/** Entries in a colour lookup table: one byte of index, so painting is a multiply, a clamp and a load. */
export const TABLE_SIZE = 256;

/**
 * The colours of a signed field, symmetric about zero: blue for negative, near-white at zero, red for
 * positive. Both ends have the same CIELAB lightness (L* = 40) and the middle is a neutral L* = 97,
 * and the scale interpolates in CIELAB, so |value| alone sets the lightness and equal steps in value
 * read as equal steps in lightness. Blue against red stays distinguishable under the common
 * colour-vision deficiencies (unlike red against green). Chroma is the largest each hue holds in sRGB.
 */
const NEGATIVE = chroma.lch(40, 48, 280);
const ZERO = chroma.lch(97, 0, 0);
const POSITIVE = chroma.lch(40, 60, 25);

/**
 * A 256-entry table of opaque RGBA pixels packed in the platform's byte order, ready to store into a
 * Uint32Array view of ImageData.data. Entry i stands for the value (i + ½)/128 − 1 of the range [−1, 1]
 * (zero lies between entries 127 and 128), and entry 255 − i mirrors entry i.
 */
export function divergingTable(): Uint32Array {
  const scale = chroma.scale([NEGATIVE, ZERO, POSITIVE]).mode('lab');
  // Write bytes, then view them as words: the packing follows the platform's endianness by construction.
  const bytes = new Uint8ClampedArray(4 * TABLE_SIZE);
  for (let i = 0; i < TABLE_SIZE; i++) {
    const [r, g, b] = scale((i + 0.5) / TABLE_SIZE).rgb();
    bytes[4 * i] = r;
    bytes[4 * i + 1] = g;
    bytes[4 * i + 2] = b;
    bytes[4 * i + 3] = 255;
  }
  return new Uint32Array(bytes.buffer);
}
