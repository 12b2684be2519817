import { DEFAULT_PARAMS } from '../model/params';
import { Grid } from '../model/grid';
import { RealTransform2D } from '../model/realTransform2D';
import { typedArrayBytes, type AllocationMeter } from '../io/allocationMeter';
import { SnapshotPlan } from '../analysis/snapshot';
import { SpectraPlan, type Spectra } from '../analysis/spectra';
import { SpectralFluxPlan, type SpectralFlux } from '../analysis/spectralFlux';

/**
 * Spectral operations on a user's doubly periodic field of 2^k × 2^m points, by the exact full
 * transform of lib/model (RealTransform2D(grid, false): layout and normalisation of grid.ts, so
 * spectra.ts and spectralFlux.ts apply unchanged). Derivatives are exact for fields without Nyquist
 * content; the Nyquist column and row are dropped from first derivatives, as in profileFFT.ts.
 * Inputs must hold no NaN (callers check: a record with missing values takes the finite-difference
 * route for derivatives and is left out of spectra).
 *
 * The spectral flux is that of the model's dealiased advection term (spectralFlux.ts) applied to the
 * field truncated to the 2/3-rule modes; `keptEnergyFraction` says how much of the energy those
 * modes hold, so a reader knows what the truncation leaves out.
 */
export class UserSpectralPlan {
  readonly grid: Grid;
  readonly spectra: SpectraPlan;
  private readonly rt: RealTransform2D;
  private readonly a: Float64Array;
  private readonly b: Float64Array;
  private flux: SpectralFluxPlan | null = null;
  private fluxOut: SpectralFlux | null = null;

  constructor(
    spec: { nx: number; ny: number; Lx: number; Ly: number },
    readonly kd: number,
    private readonly meter: AllocationMeter,
  ) {
    this.grid = new Grid(spec);
    this.rt = new RealTransform2D(this.grid, false);
    this.spectra = new SpectraPlan(this.grid, kd, { extent: 'stored' });
    meter.external(typedArrayBytes([this.grid, this.rt, this.spectra]), 'spectral plans');
    this.a = meter.f64(2 * this.grid.spectralSize, 'spectral scratch');
    this.b = meter.f64(2 * this.grid.spectralSize, 'spectral scratch');
  }

  /** fHat ← spectrum of f (half-plane layout of grid.ts). */
  forward(f: Float64Array, fHat: Float64Array): Float64Array {
    this.rt.forward(f, fHat);
    return fHat;
  }

  /** ∂f/∂x into out. */
  ddx(f: Float64Array, out: Float64Array): Float64Array {
    return this.apply(f, out, 'dx');
  }

  /** ∂f/∂y into out. */
  ddy(f: Float64Array, out: Float64Array): Float64Array {
    return this.apply(f, out, 'dy');
  }

  /** ∇²f into out. */
  laplacian(f: Float64Array, out: Float64Array): Float64Array {
    return this.apply(f, out, 'lap');
  }

  /** The zero-mean ψ with ∇²ψ = ζ, into out. */
  invertLaplacian(zeta: Float64Array, out: Float64Array): Float64Array {
    return this.apply(zeta, out, 'inv');
  }

  /** f̂ times i·kx, i·ky, −k² or −1/k² (0 at k = 0), then back to the grid; no allocation. */
  private apply(f: Float64Array, out: Float64Array, op: 'dx' | 'dy' | 'lap' | 'inv'): Float64Array {
    const { nkx, ny, nx, kx, ky } = this.grid;
    const h = this.a;
    this.rt.forward(f, h);
    for (let jy = 0; jy < ny; jy++) {
      const nyquistRow = 2 * this.grid.rowIndex(jy) === ny;
      for (let ix = 0; ix < nkx; ix++) {
        const q = 2 * (jy * nkx + ix);
        const re = h[q];
        const im = h[q + 1];
        if (op === 'dx' || op === 'dy') {
          const k = op === 'dx' ? (2 * ix === nx ? 0 : kx[ix]) : nyquistRow ? 0 : ky[jy];
          h[q] = -k * im; // (i k)(re + i im)
          h[q + 1] = k * re;
        } else {
          const k2 = kx[ix] * kx[ix] + ky[jy] * ky[jy];
          const g = op === 'lap' ? -k2 : k2 > 0 ? -1 / k2 : 0;
          h[q] = g * re;
          h[q + 1] = g * im;
        }
      }
    }
    this.rt.inverse(h, out);
    return out;
  }

  /** Energy and enstrophy spectra of the PV anomaly q (grid field) into out (spectra.ts). */
  pvSpectra(q: Float64Array, out: Spectra): Spectra {
    this.rt.forward(q, this.b);
    return this.spectra.compute(this.b, out);
  }

  /** Kinetic-energy shell spectrum ½(|û|² + |v̂|²) into out (length nShells). */
  kineticSpectrum(u: Float64Array, v: Float64Array, out: Float64Array, scratch: Float64Array): Float64Array {
    this.rt.forward(u, this.a);
    this.spectra.power(this.a, out);
    this.rt.forward(v, this.b);
    this.spectra.power(this.b, scratch);
    for (let s = 0; s < out.length; s++) out[s] += scratch[s];
    return out;
  }

  /**
   * Spectral transfer and flux of the PV anomaly q (its 2/3-rule modes), and the fraction of the
   * energy ½Σ|q̂|²/K² those modes hold. The flux plan is built on first use.
   */
  pvFlux(q: Float64Array): { flux: SpectralFlux; keptEnergyFraction: number } {
    if (!this.flux) {
      const snap = new SnapshotPlan({
        ...DEFAULT_PARAMS,
        nx: this.grid.nx,
        ny: this.grid.ny,
        Lx: this.grid.Lx,
        Ly: this.grid.Ly,
        kd: this.kd,
      });
      this.flux = new SpectralFluxPlan(snap);
      this.fluxOut = this.flux.createOutput();
      this.meter.external(typedArrayBytes([snap, this.flux, this.fluxOut]), 'spectral flux plan');
    }
    this.rt.forward(q, this.b);
    const { nkx, ny } = this.grid;
    let all = 0;
    let kept = 0;
    for (let jy = 0; jy < ny; jy++) {
      for (let ix = 0; ix < nkx; ix++) {
        const q2 = jy * nkx + ix;
        const e = this.spectra.weight[q2] * this.spectra.invK2[q2] * (this.b[2 * q2] ** 2 + this.b[2 * q2 + 1] ** 2);
        all += e;
        if (this.grid.kept(ix, jy)) kept += e;
      }
    }
    return {
      flux: (this.flux as SpectralFluxPlan).compute(this.b, this.fluxOut as SpectralFlux),
      keptEnergyFraction: all > 0 ? kept / all : 1,
    };
  }
}
