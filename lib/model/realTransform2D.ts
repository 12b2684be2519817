import FFT from 'fft.js';
import { ColumnFFT } from './columnFFT';
import type { Grid } from './grid';

/**
 * Real 2D transforms between grid fields and the half-plane layout of `grid.ts`, two fields at a time.
 *
 * Built once per grid (twiddles, scratch); a call allocates nothing. Two real fields a, b travel
 * together as one complex field a + i·b, which halves the row transforms. Column transforms (along y)
 * run batched over the packed columns only (see `ColumnFFT`).
 *
 * `pruned = true` (the stepper's plan) touches only the modes the 2/3 rule keeps: inverse transforms
 * read kept modes only and treat the rest as zero; forward transforms write kept modes and set every
 * other stored coefficient (and the mean) to exactly zero. `pruned = false` is the exact full
 * transform, for analysis of arbitrary fields.
 *
 * Normalisation as in `grid.ts`: forward divides by nx·ny, inverse does not. Inputs and outputs must
 * be distinct arrays; inputs are left unchanged.
 */
export class RealTransform2D {
  readonly grid: Grid;
  readonly pruned: boolean;
  /** Columns 0..kxTop are transformed; rows listed in `rows` carry data. */
  private readonly kxTop: number;
  private readonly rows: Int32Array;
  private readonly rowFFT: FFT;
  private readonly colFFT: ColumnFFT;
  /** Packed block: row y holds columns 0..kxTop of field a, then of field b. */
  private readonly block: Float64Array;
  private readonly rowIn: Float64Array;
  private readonly rowOut: Float64Array;
  /** Zero partners for single-field calls (never written) and sinks for the unused outputs. */
  private readonly zeroSpec: Float64Array;
  private readonly zeroGrid: Float64Array;
  private readonly sinkSpec: Float64Array;
  private readonly sinkGrid: Float64Array;

  constructor(grid: Grid, pruned: boolean) {
    this.grid = grid;
    this.pruned = pruned;
    this.kxTop = pruned ? grid.Kx : grid.nkx - 1;
    if (pruned) {
      this.rows = grid.keptRows;
    } else {
      this.rows = new Int32Array(grid.ny);
      for (let j = 0; j < grid.ny; j++) this.rows[j] = j;
    }
    const cols = 2 * (this.kxTop + 1);
    this.rowFFT = new FFT(grid.nx);
    this.colFFT = new ColumnFFT(grid.ny, cols);
    this.block = new Float64Array(2 * grid.ny * cols);
    this.rowIn = new Float64Array(2 * grid.nx);
    this.rowOut = new Float64Array(2 * grid.nx);
    this.zeroSpec = new Float64Array(2 * grid.spectralSize);
    this.zeroGrid = new Float64Array(grid.size);
    this.sinkSpec = new Float64Array(2 * grid.spectralSize);
    this.sinkGrid = new Float64Array(grid.size);
  }

  /** Grid fields a, b from half-plane spectra aHat, bHat (unnormalised sum over the full plane). */
  inversePair(aHat: Float64Array, bHat: Float64Array, a: Float64Array, b: Float64Array): void {
    const { nx, ny, nkx } = this.grid;
    const top = this.kxTop;
    const cols = 2 * (top + 1);
    const bOff = 2 * (top + 1);
    const block = this.block;
    // Stage 1: pack the columns that carry data; rows outside `rows` stay zero.
    block.fill(0);
    const rows = this.rows;
    for (let r = 0; r < rows.length; r++) {
      const jy = rows[r];
      const src = 2 * jy * nkx;
      const dst = 2 * jy * cols;
      for (let t = 0; t < bOff; t++) {
        block[dst + t] = aHat[src + t];
        block[dst + bOff + t] = bHat[src + t];
      }
    }
    if (this.pruned) block[0] = block[1] = block[bOff] = block[bOff + 1] = 0; // the mean is not kept
    // Stage 2: backward transforms down the columns.
    this.colFFT.transform(block, 1);
    // Stage 3: per grid row, one complex transform of length nx gives both real rows.
    // Z = A + iB over the full kx line (A, B Hermitian in kx); z = Σ Z e^{+ikx} = conj(FFT(conj Z)).
    const rowIn = this.rowIn;
    const rowOut = this.rowOut;
    const nyq = nx / 2;
    for (let y = 0; y < ny; y++) {
      const base = 2 * y * cols;
      rowIn.fill(0);
      for (let ix = 0; ix <= top; ix++) {
        const ar = block[base + 2 * ix];
        const ai = block[base + 2 * ix + 1];
        const br = block[base + bOff + 2 * ix];
        const bi = block[base + bOff + 2 * ix + 1];
        // conj(Z[ix]), Z[ix] = (ar − bi) + i(ai + br)
        rowIn[2 * ix] = ar - bi;
        rowIn[2 * ix + 1] = -(ai + br);
        if (ix > 0 && ix < nyq) {
          // conj(Z[nx − ix]), Z[nx − ix] = conj(A) + i conj(B) = (ar + bi) + i(br − ai)
          const m = nx - ix;
          rowIn[2 * m] = ar + bi;
          rowIn[2 * m + 1] = -(br - ai);
        }
      }
      this.rowFFT.transform(rowOut, rowIn);
      const g = y * nx;
      for (let x = 0; x < nx; x++) {
        a[g + x] = rowOut[2 * x];
        b[g + x] = -rowOut[2 * x + 1];
      }
    }
  }

  /** Half-plane spectra aHat, bHat of grid fields a, b (divided by nx·ny). */
  forwardPair(a: Float64Array, b: Float64Array, aHat: Float64Array, bHat: Float64Array): void {
    const { nx, ny, nkx, size } = this.grid;
    const top = this.kxTop;
    const cols = 2 * (top + 1);
    const bOff = 2 * (top + 1);
    const block = this.block;
    const rowIn = this.rowIn;
    const rowOut = this.rowOut;
    // Stage 1: per grid row, transform a + ib and split into the two half-line spectra.
    for (let y = 0; y < ny; y++) {
      const g = y * nx;
      for (let x = 0; x < nx; x++) {
        rowIn[2 * x] = a[g + x];
        rowIn[2 * x + 1] = b[g + x];
      }
      this.rowFFT.transform(rowOut, rowIn);
      const base = 2 * y * cols;
      for (let k = 0; k <= top; k++) {
        const m = k === 0 ? 0 : nx - k;
        const yr = rowOut[2 * k];
        const yi = rowOut[2 * k + 1];
        const zr = rowOut[2 * m];
        const zi = rowOut[2 * m + 1];
        block[base + 2 * k] = 0.5 * (yr + zr);
        block[base + 2 * k + 1] = 0.5 * (yi - zi);
        block[base + bOff + 2 * k] = 0.5 * (yi + zi);
        block[base + bOff + 2 * k + 1] = -0.5 * (yr - zr);
      }
    }
    // Stage 2: forward transforms down the columns.
    this.colFFT.transform(block, -1);
    // Stage 3: unpack the rows that carry data, normalised; everything else is exactly zero.
    const scale = 1 / size;
    aHat.fill(0);
    bHat.fill(0);
    const rows = this.rows;
    for (let r = 0; r < rows.length; r++) {
      const jy = rows[r];
      const src = 2 * jy * cols;
      const dst = 2 * jy * nkx;
      for (let t = 0; t < bOff; t++) {
        aHat[dst + t] = block[src + t] * scale;
        bHat[dst + t] = block[src + bOff + t] * scale;
      }
    }
    if (this.pruned) {
      aHat[0] = aHat[1] = 0;
      bHat[0] = bHat[1] = 0;
    }
    this.symmetrise(aHat);
    this.symmetrise(bHat);
  }

  /**
   * Make the self-conjugate columns (kx = 0, and kx = nx/2 when stored) exactly Hermitian in ky, so a
   * spectrum of a real field stays one bit for bit: round-off otherwise differs between (0, m) and
   * (0, −m), and a state evolved from it would drift off the real fields.
   */
  private symmetrise(fHat: Float64Array): void {
    const { ny, nkx, nx } = this.grid;
    const columns = this.kxTop === nx / 2 ? [0, nx / 2] : [0];
    for (const ix of columns) {
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
    }
  }

  /** Grid field a from its half-plane spectrum (one field: the partner slot carries zeros). */
  inverse(aHat: Float64Array, a: Float64Array): void {
    this.inversePair(aHat, this.zeroSpec, a, this.sinkGrid);
  }

  /** Half-plane spectrum of one grid field. */
  forward(a: Float64Array, aHat: Float64Array): void {
    this.forwardPair(a, this.zeroGrid, aHat, this.sinkSpec);
  }
}
