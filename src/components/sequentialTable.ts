import chroma from 'chroma-js';
import { TABLE_SIZE } from './divergingTable';

/**
 * A one-hue colour table for positive quantities (a log power map): from the near-white zero of the
 * diverging table through its red to a dark red, interpolated in CIELAB so lightness falls evenly
 * with the value. Packed like `divergingTable` (RGBA bytes viewed as platform-order words).
 */
export function sequentialTable(): Uint32Array {
  const scale = chroma
    .scale([chroma.lch(97, 0, 0), chroma.lch(62, 55, 40), chroma.lch(40, 60, 25), chroma.lch(18, 30, 20)])
    .mode('lab');
  const bytes = new Uint8ClampedArray(4 * TABLE_SIZE);
  for (let i = 0; i < TABLE_SIZE; i++) {
    const [r, g, b] = scale((i + 0.5) / TABLE_SIZE).rgb();
    bytes.set([r, g, b, 255], 4 * i);
  }
  return new Uint32Array(bytes.buffer);
}

/**
 * Paint positive values (row-major, rows ascending in y: values[r·cols + c]) into `pixels`, top row
 * = last data row, through `table` on a log scale: log10(value) from `lo` to `hi` (decades) across
 * the table, clamped; values ≤ 0 (no mode there) take the table's first entry.
 */
export function paintLogMap(
  values: Float64Array,
  cols: number,
  rows: number,
  lo: number,
  hi: number,
  table: Uint32Array,
  pixels: Uint32Array,
): void {
  if (values.length !== cols * rows || pixels.length !== cols * rows)
    throw new RangeError(
      `paintLogMap: expected ${cols * rows} values and pixels, got ${values.length} and ${pixels.length}`,
    );
  const s = hi > lo ? TABLE_SIZE / (hi - lo) : 0;
  for (let r = 0; r < rows; r++) {
    const src = r * cols;
    const dst = (rows - 1 - r) * cols;
    for (let c = 0; c < cols; c++) {
      const v = values[src + c];
      let k = v > 0 ? Math.floor((Math.log10(v) - lo) * s) : 0;
      if (k < 0) k = 0;
      else if (k > TABLE_SIZE - 1) k = TABLE_SIZE - 1;
      pixels[dst + c] = table[k];
    }
  }
}

/** The decades a log map shows: from `decades` below the largest positive value up to it. */
export function logRange(values: Float64Array, decades = 6): { lo: number; hi: number } {
  let max = 0;
  for (let i = 0; i < values.length; i++) if (values[i] > max) max = values[i];
  const hi = max > 0 ? Math.log10(max) : 0;
  return { lo: hi - decades, hi };
}
