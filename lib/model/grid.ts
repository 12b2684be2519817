/**
 * The grid and its wavenumbers: the one place where Stria's layouts and FFT normalisation are stated.
 *
 * Physical space. A doubly periodic domain Lx × Ly (model units) holds nx × ny points, both powers of
 * two. Point (i, j) sits at x = i·Lx/nx, y = j·Ly/ny and is stored at index j·nx + i (row-major, y slow).
 *
 * Spectral space (the "half-plane layout"). A real field f has coefficients on kx ≥ 0 only:
 * nkx = nx/2 + 1 columns by ny rows, stored interleaved (re, im) at 2·(jy·nkx + ix) in a
 * Float64Array of length 2·ny·nkx. Column ix has kx = 2π·ix/Lx; row jy has
 * ky = 2π·(jy ≤ ny/2 ? jy : jy − ny)/Ly. Coefficients with kx < 0 are the complex conjugates of
 * their mirror images and are not stored.
 *
 * Normalisation. f̂(k) = (1/(nx·ny)) Σ_x f(x) e^{−ik·x} and f(x) = Σ_k f̂(k) e^{ik·x} over the full
 * plane, so f̂ are Fourier amplitudes and the domain mean of f² is Σ_full |f̂|² (Parseval). Over the
 * stored half plane that sum weighs column ix by `weight(ix)`: 1 at ix = 0 and ix = nx/2, else 2.
 *
 * Dealiasing (2/3 rule). A mode is kept when |ix| ≤ Kx = ⌊nx/3⌋ and |ky index| ≤ Ky = ⌊ny/3⌋ and it is
 * not the mean (0, 0). For nx a power of two 3·Kx < nx, so quadratic products of kept modes alias
 * only onto discarded ones.
 */
export interface GridSpec {
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
}

export class Grid {
  readonly nx: number;
  readonly ny: number;
  readonly Lx: number;
  readonly Ly: number;
  /** Stored spectral columns, nx/2 + 1. */
  readonly nkx: number;
  /** Number of grid points nx·ny; also the number of complex values in the full spectrum. */
  readonly size: number;
  /** Number of complex values in the half-plane layout, ny·nkx. */
  readonly spectralSize: number;
  /** Largest kept column index and largest kept |row wavenumber index| (2/3 rule). */
  readonly Kx: number;
  readonly Ky: number;
  readonly dx: number;
  readonly dy: number;
  /** kx per column and ky per row (rad per model length unit). */
  readonly kx: Float64Array;
  readonly ky: Float64Array;
  /** |k|² per half-plane mode, index jy·nkx + ix. */
  readonly k2: Float64Array;
  /** The kept rows, in storage order: 0..Ky then ny−Ky..ny−1. */
  readonly keptRows: Int32Array;
  /** The radius of the largest disc of kept modes, min(2π·Kx/Lx, 2π·Ky/Ly). */
  readonly kMaxKept: number;
  /** The smallest non-zero wavenumbers 2π/Lx and 2π/Ly. */
  readonly dkx: number;
  readonly dky: number;

  constructor(spec: GridSpec) {
    const { nx, ny, Lx, Ly } = spec;
    this.nx = nx;
    this.ny = ny;
    this.Lx = Lx;
    this.Ly = Ly;
    this.nkx = nx / 2 + 1;
    this.size = nx * ny;
    this.spectralSize = ny * this.nkx;
    this.Kx = Math.floor(nx / 3);
    this.Ky = Math.floor(ny / 3);
    this.dx = Lx / nx;
    this.dy = Ly / ny;
    this.dkx = (2 * Math.PI) / Lx;
    this.dky = (2 * Math.PI) / Ly;
    this.kx = new Float64Array(this.nkx);
    for (let ix = 0; ix < this.nkx; ix++) this.kx[ix] = this.dkx * ix;
    this.ky = new Float64Array(ny);
    for (let jy = 0; jy < ny; jy++) this.ky[jy] = this.dky * (jy <= ny / 2 ? jy : jy - ny);
    this.k2 = new Float64Array(this.spectralSize);
    for (let jy = 0; jy < ny; jy++) {
      for (let ix = 0; ix < this.nkx; ix++) {
        this.k2[jy * this.nkx + ix] = this.kx[ix] * this.kx[ix] + this.ky[jy] * this.ky[jy];
      }
    }
    const rows: number[] = [];
    for (let jy = 0; jy <= this.Ky; jy++) rows.push(jy);
    for (let jy = ny - this.Ky; jy < ny; jy++) rows.push(jy);
    this.keptRows = Int32Array.from(rows);
    this.kMaxKept = Math.min(this.dkx * this.Kx, this.dky * this.Ky);
  }

  /** Half-plane weight of column ix in full-plane sums (Parseval). */
  weight(ix: number): number {
    return ix === 0 || ix === this.nx / 2 ? 1 : 2;
  }

  /** Signed row wavenumber index of row jy: jy for jy ≤ ny/2, else jy − ny. */
  rowIndex(jy: number): number {
    return jy <= this.ny / 2 ? jy : jy - this.ny;
  }

  /** True when half-plane mode (ix, jy) survives the 2/3 rule and is not the mean. */
  kept(ix: number, jy: number): boolean {
    const m = this.rowIndex(jy);
    return ix <= this.Kx && Math.abs(m) <= this.Ky && (ix !== 0 || m !== 0);
  }
}
