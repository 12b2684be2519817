import type { Grid } from './grid';
import type { ColumnSlab } from './realTransform2D';

/**
 * Where the stepper keeps the kept modes of its stage spectra when the step is cut into column
 * slabs (realTransform2D.ts): slab after slab, each row-major over its own kx columns, so that the
 * thread that owns a slab reads and writes one stretch of memory (docs/threads.md). Mode (ky, kx)
 * of slab k is at origin[k] + 2·(ky·stride[k] + kx). One slab is the ordinary half-plane layout of
 * grid.ts (origin 0, stride nkx), so a step on one thread keeps its arrays as they always were.
 */
export class ModeSlabs {
  /** Per slab: the offset and the row length (in modes) of the formula above. */
  readonly origin: Int32Array;
  readonly stride: Int32Array;
  /** Per kx column 0..Kx: mode (ky, kx) is at at[kx] + ky·rowStep[kx]. */
  readonly at: Int32Array;
  readonly rowStep: Int32Array;
  /** 1 for the kept rows ky. */
  private readonly keep: Uint8Array;

  constructor(grid: Grid, columns: readonly ColumnSlab[]) {
    const { ny, nkx, Kx } = grid;
    this.origin = new Int32Array(columns.length);
    this.stride = new Int32Array(columns.length);
    this.at = new Int32Array(Kx + 1);
    this.rowStep = new Int32Array(Kx + 1);
    this.keep = new Uint8Array(ny);
    for (const ky of grid.keptRows) this.keep[ky] = 1;
    columns.forEach(({ i0, i1 }, k) => {
      const one = columns.length === 1;
      this.origin[k] = one ? 0 : 2 * ny * i0 - 2 * i0;
      this.stride[k] = one ? nkx : i1 - i0;
      for (let kx = i0; kx < i1; kx++) {
        this.at[kx] = this.origin[k] + 2 * kx;
        this.rowStep[kx] = 2 * this.stride[k];
      }
    });
  }

  /** Whether the layout is the ordinary one (one slab). */
  get plain(): boolean {
    return this.origin.length === 1;
  }

  /**
   * Copy the kept modes of `src` (this layout) into `dst` (the ordinary layout), every other entry
   * of dst set to zero.
   */
  toPlain(src: Float64Array, dst: Float64Array, grid: Grid): void {
    if (this.plain) {
      dst.set(src);
      return;
    }
    const { ny, nkx, Kx } = grid;
    const { at, rowStep, keep } = this;
    // One pass over dst: the kept columns of a kept row copied, everything else zeroed.
    for (let ky = 0; ky < ny; ky++) {
      const row = 2 * ky * nkx;
      if (!keep[ky]) {
        dst.fill(0, row, row + 2 * nkx);
        continue;
      }
      for (let kx = 0; kx <= Kx; kx++) {
        const s = at[kx] + ky * rowStep[kx];
        dst[row + 2 * kx] = src[s];
        dst[row + 2 * kx + 1] = src[s + 1];
      }
      dst.fill(0, row + 2 * (Kx + 1), row + 2 * nkx);
    }
  }
}
