import type { Grid } from '../model/grid';
import type { SnapshotPlan } from './snapshot';

/**
 * Isotropic and 2D energy and enstrophy spectra of a PV anomaly spectrum q̂ (half-plane layout and
 * Fourier-amplitude normalisation of lib/model/grid.ts), model units.
 *
 * Per full-plane mode k ≠ 0, with K² = |k|² + k_d²: enstrophy ½|q̂|², energy ½|q̂|²/K² (= ½K²|ψ̂|²).
 * A stored mode with kx > 0 stands for itself and its conjugate mirror (weight 2); kx = 0 and the
 * Nyquist column kx = π nx/Lx count once. So Σ over every shell of E(k) is the domain mean
 * E = ½⟨|∇ψ|² + k_d²ψ²⟩ and Σ Z(k) = Z = ½⟨q²⟩ − ½q̄²: the mean (0, 0) is left out, it has no ψ.
 *
 * Binning (docs/spectra.md): shells of width dk = min(2π/Lx, 2π/Ly); mode k goes to shell
 * s = round(|k|/dk) − 1 ≥ 0, centred at k_s = (s + 1)·dk and spanning [(s + ½)dk, (s + 3/2)dk).
 * E(k_s) is the energy in the shell (a sum, not a density: divide by dk for one). Every stored mode is
 * binned, so the spectra work for Stria's states (only the 2/3-rule modes are non-zero) and for the
 * exact transform of any real field alike.
 *
 * Zonal part: the kx = 0 modes (functions of y alone), binned by |ky|; residual: all the others.
 * E = EZonal + EResidual shell by shell, exactly.
 */
export interface Spectra {
  /** Shell centres k_s = (s + 1)·dk (1/length). */
  readonly k: Float64Array;
  /** Energy and enstrophy per shell (length²/time² and 1/time²), total, zonal and residual. */
  readonly E: Float64Array;
  readonly EZonal: Float64Array;
  readonly EResidual: Float64Array;
  readonly Z: Float64Array;
  readonly ZZonal: Float64Array;
  readonly ZResidual: Float64Array;
  /**
   * The 2D energy spectrum for a heatmap: energy of each full-plane mode ½|q̂|²/K² (no mirror weight,
   * so the map is the symmetric density of the half plane kx ≥ 0), row-major with rows in ascending
   * ky (`ky2d`) and columns in ascending kx (`kx2d`); the mean cell is 0. Σ_cells w(kx)·E2d = E when
   * the block covers every non-zero mode, w = 1 on kx = 0 (and the Nyquist column), else 2.
   */
  readonly kx2d: Float64Array;
  readonly ky2d: Float64Array;
  readonly E2d: Float64Array;
  /** Totals Σ E(k) and Σ Z(k). */
  energy: number;
  enstrophy: number;
}

export interface SpectraOptions {
  /**
   * Extent of the 2D spectrum: 'kept' (default) the 2/3-rule block |ix| ≤ Kx, |m| ≤ Ky, which holds
   * all of a Stria state; 'stored' every stored mode (for fields with content up to the Nyquist modes).
   */
  extent?: 'kept' | 'stored';
}

/** Shell binning and spectra for one grid and k_d; build once, `compute` allocates nothing. */
export class SpectraPlan {
  readonly grid: Grid;
  readonly kd: number;
  /** Shell width min(2π/Lx, 2π/Ly). */
  readonly dk: number;
  /** Number of shells, up to the corner mode of the stored half plane. */
  readonly nShells: number;
  /** Shells 0..keptShells−1 contain a mode the 2/3 rule keeps; above them a Stria state has nothing. */
  readonly keptShells: number;
  /** Shells 0..completeShells−1 hold only kept modes: the full isotropic range of a Stria state. */
  readonly completeShells: number;
  /** Full-plane number of modes per shell. */
  readonly modeCount: Int32Array;
  /** Shell of each half-plane mode, −1 for the mean. */
  readonly shellOf: Int32Array;
  /** Full-plane weight w(ix) per half-plane mode (1 at kx = 0 and Nyquist, else 2; 0 at the mean). */
  readonly weight: Float64Array;
  /** 1/K² = 1/(|k|² + k_d²) per half-plane mode (0 at the mean). */
  readonly invK2: Float64Array;
  /** Cell of each half-plane mode in the 2D block, −1 outside. */
  private readonly cellOf: Int32Array;
  private readonly k: Float64Array;
  private readonly kx2d: Float64Array;
  private readonly ky2d: Float64Array;

  constructor(grid: Grid, kd: number, options: SpectraOptions = {}) {
    this.grid = grid;
    this.kd = kd;
    const { nkx, ny, spectralSize, Kx, Ky } = grid;
    this.dk = Math.min(grid.dkx, grid.dky);
    const kCorner = Math.hypot(grid.kx[nkx - 1], grid.dky * (ny / 2));
    this.nShells = Math.round(kCorner / this.dk);
    this.k = new Float64Array(this.nShells);
    for (let s = 0; s < this.nShells; s++) this.k[s] = (s + 1) * this.dk;
    this.modeCount = new Int32Array(this.nShells);
    this.shellOf = new Int32Array(spectralSize);
    this.weight = new Float64Array(spectralSize);
    this.invK2 = new Float64Array(spectralSize);
    // Extent of the 2D block: columns 0..ixTop, rows m = mLo..mHi (ascending ky).
    const stored = options.extent === 'stored';
    const ixTop = stored ? nkx - 1 : Kx;
    const mLo = stored ? -(ny / 2 - 1) : -Ky;
    const mHi = stored ? ny / 2 : Ky;
    const cols = ixTop + 1;
    this.kx2d = grid.kx.slice(0, cols);
    this.ky2d = new Float64Array(mHi - mLo + 1);
    for (let m = mLo; m <= mHi; m++) this.ky2d[m - mLo] = m * grid.dky;
    this.cellOf = new Int32Array(spectralSize).fill(-1);
    let keptTop = -1;
    let firstIncomplete = this.nShells;
    const kd2 = kd * kd;
    for (let jy = 0; jy < ny; jy++) {
      const m = grid.rowIndex(jy);
      for (let ix = 0; ix < nkx; ix++) {
        const q = jy * nkx + ix;
        if (ix <= ixTop && m >= mLo && m <= mHi) this.cellOf[q] = (m - mLo) * cols + ix;
        if (ix === 0 && m === 0) {
          this.shellOf[q] = -1;
          continue;
        }
        const s = Math.round(Math.sqrt(grid.k2[q]) / this.dk) - 1;
        this.shellOf[q] = s;
        this.modeCount[s] += grid.weight(ix);
        this.weight[q] = grid.weight(ix);
        this.invK2[q] = 1 / (grid.k2[q] + kd2);
        if (grid.kept(ix, jy)) keptTop = Math.max(keptTop, s);
        else firstIncomplete = Math.min(firstIncomplete, s);
      }
    }
    this.keptShells = keptTop + 1;
    this.completeShells = firstIncomplete;
  }

  /** A plan for the snapshots of a SnapshotPlan (same grid and k_d). */
  static forSnapshots(plan: SnapshotPlan, options: SpectraOptions = {}): SpectraPlan {
    return new SpectraPlan(plan.grid, plan.params.kd, options);
  }

  /** Preallocated outputs for `compute`. */
  createOutput(): Spectra {
    const n = this.nShells;
    const f = () => new Float64Array(n);
    return {
      k: this.k.slice(),
      E: f(),
      EZonal: f(),
      EResidual: f(),
      Z: f(),
      ZZonal: f(),
      ZResidual: f(),
      kx2d: this.kx2d.slice(),
      ky2d: this.ky2d.slice(),
      E2d: new Float64Array(this.kx2d.length * this.ky2d.length),
      energy: 0,
      enstrophy: 0,
    };
  }

  /** Spectra of q̂ into out (from `createOutput`); returns out. */
  compute(qHat: Float64Array, out: Spectra = this.createOutput()): Spectra {
    const { shellOf, weight, invK2, cellOf } = this;
    const { nkx, ny } = this.grid;
    const { EZonal, EResidual, ZZonal, ZResidual, E2d } = out;
    EZonal.fill(0);
    EResidual.fill(0);
    ZZonal.fill(0);
    ZResidual.fill(0);
    E2d.fill(0);
    for (let jy = 0; jy < ny; jy++) {
      for (let ix = 0; ix < nkx; ix++) {
        const q = jy * nkx + ix;
        const s = shellOf[q];
        if (s < 0) continue;
        const re = qHat[2 * q];
        const im = qHat[2 * q + 1];
        const zMode = 0.5 * (re * re + im * im); // one full-plane mode's enstrophy
        const eMode = zMode * invK2[q];
        const c = cellOf[q];
        if (c >= 0) E2d[c] = eMode;
        const w = weight[q];
        if (ix === 0) {
          EZonal[s] += w * eMode;
          ZZonal[s] += w * zMode;
        } else {
          EResidual[s] += w * eMode;
          ZResidual[s] += w * zMode;
        }
      }
    }
    let e = 0;
    let z = 0;
    for (let s = 0; s < this.nShells; s++) {
      out.E[s] = EZonal[s] + EResidual[s];
      out.Z[s] = ZZonal[s] + ZResidual[s];
      e += out.E[s];
      z += out.Z[s];
    }
    out.energy = e;
    out.enstrophy = z;
    return out;
  }

  /**
   * Shell sums of ½|f̂|² for any real field f (its half-plane spectrum), into out (length nShells):
   * Σ out = ½⟨f²⟩ − ½f̄², e.g. the kinetic energy spectrum from û and v̂. Returns out.
   */
  power(fHat: Float64Array, out: Float64Array = new Float64Array(this.nShells)): Float64Array {
    const { shellOf, weight } = this;
    out.fill(0);
    for (let q = 0; q < this.grid.spectralSize; q++) {
      const s = shellOf[q];
      if (s < 0) continue;
      out[s] += 0.5 * weight[q] * (fHat[2 * q] * fHat[2 * q] + fHat[2 * q + 1] * fHat[2 * q + 1]);
    }
    return out;
  }
}
