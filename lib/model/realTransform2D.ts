import { BatchFFT, lastStageInPlace } from './batchFFT';
import { plainFloat64, type Float64Alloc } from './sharedArena';
import { lastStageToBlock, lastStageToWorkGrid, velocitiesFirstStageY, type ColumnSlabLayout } from './fusedStages';
import type { Grid } from './grid';
import { COLUMN_UNIT, ROW_UNIT, shareBound } from './stepTeam';

/**
 * kx columns i0..i1 − 1 of both fields of the block, stored together (row y: the slab's columns of
 * field a, then of field b) for the same reason as a RowSlab.
 */
export interface ColumnSlab {
  readonly i0: number;
  readonly i1: number;
  /** The slab's part of the block: column kx of field a, row y, at 2·(y·2(i1 − i0) + kx − i0). */
  readonly block: Float64Array;
  /** Its part of the y transform's scratch. */
  readonly scratch: Float64Array;
  /** The y transform over its columns of both fields. */
  readonly fft: BatchFFT;
}

/**
 * Rows y0..y1 − 1 of the work grid, stored together (x-major among themselves) so that the thread
 * that transforms them touches one contiguous stretch of memory: threads whose shares interleave
 * within a few kilobytes slow each other down several times over (docs/threads.md).
 */
export interface RowSlab {
  readonly y0: number;
  readonly y1: number;
  /** The slab's part of the work grid: (x, y) at 2·(x·(y1 − y0) + y − y0). */
  readonly work: Float64Array;
  /** Its part of the x transform's scratch. */
  readonly scratch: Float64Array;
  /** The x transform over its rows. */
  readonly fft: BatchFFT;
}

/**
 * Real 2D transforms between grid fields and the half-plane layout of `grid.ts`, two fields at a time.
 *
 * Two real fields a, b travel together as one complex field a + i·b. The y transforms run batched
 * over the packed kx columns of both spectra (a "block", row y, columns 0..top of a then of b); the
 * x transforms run batched over all y on a complex grid stored x-major (the "work grid", point
 * (x, y) at 2·(x·ny + y)), so both are long contiguous loops (`BatchFFT`) with one transpose between.
 * The stepper works on the work grid directly (products are pointwise, so its layout does not
 * matter there); the public pair calls transpose to and from the row-major layout of grid.ts.
 *
 * `pruned = true` (the stepper's plan) touches only the modes the 2/3 rule keeps: inverse transforms
 * read kept modes only, forward transforms write kept modes and set every other stored coefficient
 * (and the mean) to exactly zero. `pruned = false` is the exact full transform. Forward results are
 * made exactly Hermitian in the self-conjugate columns. Built once per grid; calls allocate nothing.
 * Normalisation as in `grid.ts`: forward divides by nx·ny, inverse does not.
 *
 * The stepper's passes come in two kinds that threads share differently (docs/threads.md): the y
 * side works on column slabs (`inverseYSlab`, `forwardYSlab`), the x side on row slabs
 * (`inverseXSlab`, `forwardXSlab`); the arrays they write are `alloc`ated, so that they can live in
 * shared memory, and a transform built for P threads keeps each slab in one stretch of it.
 */
/** Where the rows of an nx × ny work grid cut into `slabs` row slabs go (see RowSlab). */
export interface RowSlabLayout {
  /** Slab j holds rows bounds[j]..bounds[j + 1] − 1 (shares of ROW_UNIT rows, stepTeam.ts). */
  readonly bounds: Int32Array;
  /** Point (x, y) is at rowOffset[y] + x·rowStride[y]: one slab gives 2y + 2x·ny. */
  readonly rowOffset: Int32Array;
  readonly rowStride: Int32Array;
  /**
   * 0 = c₀ < c₁ < … = ny/4: within c_i..c_{i+1} − 1 none of the rows r, r + ny/4, r + ny/2,
   * r + 3ny/4 changes slab (the runs of lastStageToWorkGrid, fusedStages.ts).
   */
  readonly rowCuts: Int32Array;
}

export function rowSlabLayout(nx: number, ny: number, slabs: number): RowSlabLayout {
  const bounds = new Int32Array(slabs + 1);
  for (let j = 0; j <= slabs; j++) bounds[j] = shareBound(ny, j, slabs, ROW_UNIT);
  const rowOffset = new Int32Array(ny);
  const rowStride = new Int32Array(ny);
  for (let j = 0; j < slabs; j++) {
    for (let y = bounds[j]; y < bounds[j + 1]; y++) {
      rowOffset[y] = 2 * nx * bounds[j] + 2 * (y - bounds[j]);
      rowStride[y] = 2 * (bounds[j + 1] - bounds[j]);
    }
  }
  const s = ny >> 2;
  const cuts = new Set<number>([0, s]);
  for (const b of bounds) for (let j = 0; j < 4; j++) if (b - j * s > 0 && b - j * s < s) cuts.add(b - j * s);
  const rowCuts = Int32Array.from([...cuts].sort((a, b) => a - b));
  return { bounds, rowOffset, rowStride, rowCuts };
}

/** Where the columns of a block cut into these slabs live (ColumnSlabLayout, fusedStages.ts). */
export function columnSlabLayout(nx: number, ny: number, columns: readonly ColumnSlab[]): ColumnSlabLayout {
  const offset = new Int32Array(nx);
  const stride = new Int32Array(nx);
  const bOffset = new Int32Array(nx);
  for (const { i0, i1 } of columns) {
    const width = i1 - i0;
    for (let k = i0; k < i1; k++) {
      offset[k] = 2 * ny * 2 * i0 + 2 * (k - i0);
      stride[k] = 4 * width;
      bOffset[k] = 2 * width;
    }
  }
  return { offset, stride, bOffset };
}

export class RealTransform2D {
  readonly grid: Grid;
  readonly pruned: boolean;
  /** Columns 0..top are transformed. */
  readonly top: number;
  /** Rows of the half plane that carry data. */
  readonly rows: Int32Array;
  /** Packed block, row y: columns 0..top of field a, then of field b (complex). */
  readonly block: Float64Array;
  /**
   * Complex work grid, x-major: (x, y) at 2·(x·ny + y); with several row slabs, slab after slab, each
   * x-major over its own rows (`slabs`, and `rowOffset`/`rowStride` for where a point is).
   */
  readonly work: Float64Array;
  /** The block's column slabs (one, the whole block, unless built for threads). */
  readonly columns: readonly ColumnSlab[];
  /** Where each column of the block lives (lastStageToBlock); null for one slab. */
  readonly columnLayout: ColumnSlabLayout | null;
  /** The work grid's row slabs (one, the whole grid, unless built for threads). */
  readonly slabs: readonly RowSlab[];
  /** Point (x, y) of the work grid is at rowOffset[y] + x·rowStride[y]; rowCuts as in RowSlabLayout. */
  readonly rowOffset: Int32Array;
  readonly rowStride: Int32Array;
  readonly rowCuts: Int32Array;
  private readonly yFFT: BatchFFT;
  private readonly xFFT: BatchFFT;
  private readonly rowIsData: Uint8Array;

  /**
   * `slabCount` > 1 cuts the block into that many column slabs and the work grid into as many row
   * slabs (one of each per thread of a step's team); only the stepper's slab passes
   * (`inverseYSlab`, `inverseXSlab`, `forwardXSlab`, `forwardYSlab`) may then be used, as the other
   * calls assume one slab.
   */
  constructor(grid: Grid, pruned: boolean, alloc: Float64Alloc = plainFloat64, slabCount = 1) {
    const rowSlabs = slabCount;
    this.grid = grid;
    this.pruned = pruned;
    this.top = pruned ? grid.Kx : grid.nkx - 1;
    if (pruned) {
      this.rows = grid.keptRows;
    } else {
      this.rows = new Int32Array(grid.ny);
      for (let j = 0; j < grid.ny; j++) this.rows[j] = j;
    }
    this.rowIsData = new Uint8Array(grid.ny);
    for (const r of this.rows) this.rowIsData[r] = 1;
    const cols = 2 * (this.top + 1);
    this.yFFT = new BatchFFT(grid.ny, cols, alloc);
    this.xFFT = new BatchFFT(grid.nx, grid.ny, alloc);
    this.block = alloc(2 * grid.ny * cols);
    this.work = alloc(2 * grid.size);
    const { nx, ny } = grid;
    const layout = rowSlabLayout(nx, ny, rowSlabs);
    this.rowOffset = layout.rowOffset;
    this.rowStride = layout.rowStride;
    this.rowCuts = layout.rowCuts;
    const slabs: RowSlab[] = [];
    for (let j = 0; j < rowSlabs; j++) {
      const y0 = layout.bounds[j];
      const y1 = layout.bounds[j + 1];
      const from = 2 * nx * y0;
      const to = 2 * nx * y1;
      const scratch = this.xFFT.work.subarray(from, to);
      // The slab's transform works in the slab's part of the scratch (no memory of its own).
      const fft = rowSlabs === 1 ? this.xFFT : new BatchFFT(nx, y1 - y0, () => scratch);
      slabs.push({ y0, y1, work: this.work.subarray(from, to), scratch, fft });
    }
    this.slabs = slabs;
    const columns: ColumnSlab[] = [];
    const half = this.top + 1;
    for (let k = 0; k < slabCount; k++) {
      const i0 = slabCount === 1 ? 0 : shareBound(half, k, slabCount, COLUMN_UNIT);
      const i1 = slabCount === 1 ? half : shareBound(half, k + 1, slabCount, COLUMN_UNIT);
      const from = 2 * ny * 2 * i0;
      const to = 2 * ny * 2 * i1;
      const scratch = this.yFFT.work.subarray(from, to);
      const fft = slabCount === 1 ? this.yFFT : new BatchFFT(ny, 2 * (i1 - i0), () => scratch);
      columns.push({ i0, i1, block: this.block.subarray(from, to), scratch, fft });
    }
    this.columns = columns;
    this.columnLayout = slabCount === 1 ? null : columnSlabLayout(nx, ny, columns);
  }

  /** Whether the transform is cut into slabs (and only the slab passes may be used). */
  get cut(): boolean {
    return this.columns.length > 1;
  }

  /**
   * The velocities of the nonlinear term onto the work grid, on column slab k: ψ̂ = −q̂·invK2 of the
   * slab's kx columns, û = −i ky ψ̂ and v̂ = i kx ψ̂, formed inside the y transform's first stage
   * (fusedStages.ts, velocitiesFirstStageY), then `inverseYSlab`. Mode (ky, kx) of q̂ is at
   * qAt + 2·(ky·qStride + kx): the ordinary layout by default, or a slab of modeSlabs.ts.
   */
  velocitiesToGridSlab(k: number, qHat: Float64Array, invK2: Float64Array, qAt = 0, qStride = this.grid.nkx): void {
    const c = this.columns[k];
    const { firstRadix, cosT, sinT } = c.fft;
    velocitiesFirstStageY(
      qHat,
      invK2,
      this.grid,
      firstRadix,
      cosT,
      sinT,
      c.block,
      c.i0,
      c.i1,
      c.i0,
      c.i1 - c.i0,
      qAt,
      qStride,
    );
    this.inverseYSlab(k);
  }

  /**
   * The y side of the inverse on column slab k, whose block part holds the y transform's first
   * stage (written by `velocitiesToGridSlab`): the middle stages, and the last one onto the work
   * grid (with that share of the zero columns).
   */
  private inverseYSlab(k: number): void {
    const { nx, ny } = this.grid;
    const c = this.columns[k];
    const Y = c.fft.transformButFirstAndLast(c.block, 1, c.scratch);
    lastStageToWorkGrid(
      Y,
      this.work,
      this.rowOffset,
      this.rowStride,
      this.rowCuts,
      nx,
      ny,
      this.top,
      c.i0,
      c.i1,
      c.i0,
      c.i1 - c.i0,
    );
  }

  /**
   * The forward y transform but its last stage on column slab k (after `forwardXSlab` of every row
   * slab); returns the slab's array holding it (read with the slab's origin and width).
   */
  forwardYSlab(k: number): Float64Array {
    const c = this.columns[k];
    return c.fft.transformButLast(c.block, -1, c.scratch);
  }

  /**
   * Inverse of the block: on entry `block` holds the two half-plane spectra on the rows that carry
   * data (other rows are cleared here; the mean is dropped when pruned). On return the array given
   * back (`work` or the x transform's scratch) holds a + i·b on the x-major grid. The block is
   * overwritten.
   */
  inverseBlockToWork(): Float64Array {
    const out = this.inverseBlockToWorkButLast();
    lastStageInPlace(out, this.xFFT.lastRun, 1);
    return out;
  }

  /** As `inverseBlockToWork`, but the x transform's last stage is left to the caller. */
  private inverseBlockToWorkButLast(): Float64Array {
    const ny = this.grid.ny;
    const top = this.top;
    const cols = 2 * (top + 1);
    const block = this.block;
    for (let y = 0; y < ny; y++) if (!this.rowIsData[y]) block.fill(0, 2 * y * cols, 2 * (y + 1) * cols);
    if (this.pruned) block[0] = block[1] = block[cols] = block[cols + 1] = 0;
    return this.finishInverseButLast(this.yFFT.transformButLast(block, 1));
  }

  /**
   * The backward x transform but its last stage on row slab j (after `inverseYSlab` of every
   * column slab); returns the slab's array holding it (its `work` or its `scratch`).
   */
  inverseXSlab(j: number): Float64Array {
    const slab = this.slabs[j];
    return slab.fft.transformButLast(slab.work, 1, slab.scratch);
  }

  /**
   * The forward x transform of row slab j, whose points are in `grid` (the slab's `work` or
   * `scratch`), finished into those rows of the block.
   */
  forwardXSlab(j: number, grid: Float64Array): void {
    const { nx, ny } = this.grid;
    const slab = this.slabs[j];
    const other = grid === slab.work ? slab.scratch : slab.work;
    const rows = slab.y1 - slab.y0;
    const X = slab.fft.transformButLast(grid, -1, other);
    lastStageToBlock(X, this.block, nx, ny, this.top, slab.y0, slab.y1, rows, slab.y0, this.columnLayout);
  }

  private finishInverseButLast(ySpectra: Float64Array): Float64Array {
    this.oneSlab();
    const { nx, ny } = this.grid;
    lastStageToWorkGrid(ySpectra, this.work, this.rowOffset, this.rowStride, this.rowCuts, nx, ny, this.top);
    return this.xFFT.transformButLast(this.work, 1);
  }

  /**
   * Forward of a work grid: on entry `grid` (`work`, or the array `inverseBlockToWork` returned)
   * holds a + i·b (x-major); on return the block holds the unnormalised half-line spectra of a and b,
   * y-transformed (row y = ky index, columns as above), in the array returned (this.block or the y
   * transform's scratch). Both work grids are overwritten.
   */
  forwardWorkToBlock(grid: Float64Array = this.work): Float64Array {
    this.oneSlab();
    const { nx, ny } = this.grid;
    const scratch = grid === this.work ? this.xFFT.work : this.work;
    // The x transform's last stage writes the half-line spectra of a and b straight into the block.
    lastStageToBlock(this.xFFT.transformButLast(grid, -1, scratch), this.block, nx, ny, this.top);
    return this.yFFT.transform(this.block, -1);
  }

  /** Grid fields a, b (row-major, grid.ts) from half-plane spectra aHat, bHat. */
  inversePair(aHat: Float64Array, bHat: Float64Array, a: Float64Array, b: Float64Array): void {
    this.packSpectra(aHat, bHat);
    this.unpackWork(this.inverseBlockToWork(), a, b);
  }

  /** Half-plane spectra aHat, bHat of grid fields a, b (row-major), divided by nx·ny. */
  forwardPair(a: Float64Array, b: Float64Array, aHat: Float64Array, bHat: Float64Array): void {
    this.packWork(a, b);
    this.unpackBlock(this.forwardWorkToBlock(), aHat, bHat);
  }

  /** Grid field from one spectrum (the partner slot carries zeros). */
  inverse(aHat: Float64Array, a: Float64Array): void {
    this.packSpectra(aHat, null);
    this.unpackWork(this.inverseBlockToWork(), a, null);
  }

  /** Spectrum of one grid field. */
  forward(a: Float64Array, aHat: Float64Array): void {
    this.packWork(a, null);
    this.unpackBlock(this.forwardWorkToBlock(), aHat, null);
  }

  /**
   * Normalise a forward block into half-plane spectra (bHat may be null to drop the partner): kept
   * rows and columns get their values, everything else zero, Hermitian columns exact.
   */
  unpackBlock(R: Float64Array, aHat: Float64Array, bHat: Float64Array | null): void {
    this.oneSlab();
    const nkx = this.grid.nkx;
    const n = 2 * (this.top + 1); // doubles per field in a block row
    const scale = 1 / this.grid.size;
    aHat.fill(0);
    bHat?.fill(0);
    for (const jy of this.rows) {
      const src = 2 * jy * n;
      const dst = 2 * jy * nkx;
      for (let t = 0; t < n; t++) aHat[dst + t] = R[src + t] * scale;
      if (bHat) for (let t = 0; t < n; t++) bHat[dst + t] = R[src + n + t] * scale;
    }
    if (this.pruned) {
      aHat[0] = aHat[1] = 0;
      if (bHat) bHat[0] = bHat[1] = 0;
    }
    this.symmetrise(aHat);
    if (bHat) this.symmetrise(bHat);
  }

  /** Copy the rows that carry data of two spectra (or one and zeros) into the block. */
  private packSpectra(aHat: Float64Array, bHat: Float64Array | null): void {
    this.oneSlab();
    const nkx = this.grid.nkx;
    const n = 2 * (this.top + 1);
    const block = this.block;
    for (const jy of this.rows) {
      const src = 2 * jy * nkx;
      const dst = 2 * jy * n; // a block row holds n doubles of a, then n of b
      for (let t = 0; t < n; t++) {
        block[dst + t] = aHat[src + t];
        block[dst + n + t] = bHat ? bHat[src + t] : 0;
      }
    }
  }

  /** The whole-grid x calls read the work grid as one slab. */
  private oneSlab(): void {
    if (this.cut) throw new Error('RealTransform2D: a whole-grid call on a transform cut into slabs');
  }

  /** Row-major grid fields a + i·b (b null: zero) into the x-major complex work grid. */
  private packWork(a: Float64Array, b: Float64Array | null): void {
    this.oneSlab();
    const { nx, ny } = this.grid;
    const W = this.work;
    for (let x = 0; x < nx; x++) {
      const base = 2 * x * ny;
      for (let y = 0; y < ny; y++) {
        W[base + 2 * y] = a[y * nx + x];
        W[base + 2 * y + 1] = b ? b[y * nx + x] : 0;
      }
    }
  }

  /** An x-major complex work grid back to row-major real fields (b null: drop the imaginary part). */
  private unpackWork(W: Float64Array, a: Float64Array, b: Float64Array | null): void {
    const { nx, ny } = this.grid;
    for (let x = 0; x < nx; x++) {
      const base = 2 * x * ny;
      for (let y = 0; y < ny; y++) {
        a[y * nx + x] = W[base + 2 * y];
        if (b) b[y * nx + x] = W[base + 2 * y + 1];
      }
    }
  }

  /**
   * Make the self-conjugate columns (kx = 0, and kx = nx/2 when stored) exactly Hermitian in ky, so a
   * spectrum of a real field stays one bit for bit: round-off otherwise differs between (0, m) and
   * (0, −m), and a state evolved from it would drift off the real fields.
   */
  private symmetrise(fHat: Float64Array): void {
    const { ny, nkx, nx } = this.grid;
    const last = this.top === nx / 2 ? nx / 2 : 0;
    for (let ix = 0; ix <= last; ix += nx / 2) {
      for (let jy = 1; jy < ny / 2; jy++) {
        const a = 2 * (jy * nkx + ix);
        const b = 2 * ((ny - jy) * nkx + ix);
        const re = 0.5 * (fHat[a] + fHat[b]);
        const im = 0.5 * (fHat[a + 1] - fHat[b + 1]);
        fHat[a] = re;
        fHat[a + 1] = im;
        fHat[b] = re;
        fHat[b + 1] = -im;
      }
      if (last === 0) break;
    }
  }
}
