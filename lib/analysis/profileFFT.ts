import FFT from 'fft.js';

/**
 * Spectral operations on one periodic meridional profile f_j = f(y_j), y_j = j·Ly/ny, j = 0..ny−1:
 * derivative, band truncation, Gaussian smoothing and the amplitude spectrum. The Fourier convention
 * is that of lib/model/grid.ts along y: f̂_m = (1/ny) Σ_j f_j e^{−2πi m j/ny}, f_j = Σ_m f̂_m e^{i k_m y_j},
 * k_m = 2π m/Ly with m the signed index (−ny/2 < m ≤ ny/2).
 *
 * Built once per (ny, Ly); a call allocates nothing. Every operation reads f into scratch before
 * writing out, so out may be f itself (in place).
 */
export class ProfileFFT {
  readonly ny: number;
  readonly Ly: number;
  /** Smallest meridional wavenumber 2π/Ly. */
  readonly dky: number;
  private readonly fft: FFT;
  /** Complex interleaved scratch: the input packed as complex, then its coefficients. */
  private readonly work: Float64Array;
  private readonly spec: Float64Array;

  constructor(ny: number, Ly: number) {
    if (!(Ly > 0) || !Number.isFinite(Ly))
      throw new RangeError(`ProfileFFT: Ly = ${Ly} must be a positive finite length`);
    if (!Number.isInteger(ny) || ny < 2 || (ny & (ny - 1)) !== 0)
      throw new RangeError(`ProfileFFT: ny = ${ny} must be a power of two ≥ 2`);
    this.fft = new FFT(ny);
    this.ny = ny;
    this.Ly = Ly;
    this.dky = (2 * Math.PI) / Ly;
    this.work = new Float64Array(2 * ny);
    this.spec = new Float64Array(2 * ny);
  }

  /** Signed index of stored coefficient s: s for s ≤ ny/2, else s − ny. */
  private index(s: number): number {
    return s <= this.ny / 2 ? s : s - this.ny;
  }

  /** spec ← f̂ (normalised as in grid.ts). */
  private forward(f: Float64Array): void {
    const { ny, work, spec } = this;
    if (f.length !== ny) throw new RangeError(`ProfileFFT: profile has ${f.length} points, expected ${ny}`);
    for (let j = 0; j < ny; j++) {
      work[2 * j] = f[j];
      work[2 * j + 1] = 0;
    }
    this.fft.transform(spec, work); // Σ_j f_j e^{−2πi m j/ny}
    const s = 1 / ny;
    for (let i = 0; i < 2 * ny; i++) spec[i] *= s;
  }

  /** out ← Σ_m spec_m e^{i k_m y_j}, the real part (spec is Hermitian up to round-off). */
  private inverse(out: Float64Array): void {
    this.fft.inverseTransform(this.work, this.spec); // divides by ny, undone below
    for (let j = 0; j < this.ny; j++) out[j] = this.work[2 * j] * this.ny;
  }

  /**
   * Multiply f̂_m by (i k_m)^order · exp(−½(k_m σ)²) and keep only |m| ≤ band; the result into out.
   * A derivative (order odd) also drops the Nyquist coefficient m = ny/2, whose derivative has no real
   * representation on the grid (the standard choice; exact for profiles without Nyquist content).
   */
  filter(f: Float64Array, out: Float64Array, order: 0 | 1, band: number, sigma = 0): Float64Array {
    this.forward(f);
    const { ny, spec: work, dky } = this;
    for (let s = 0; s < ny; s++) {
      const m = this.index(s);
      const k = dky * m;
      let gain = Math.abs(m) <= band ? Math.exp(-0.5 * (k * sigma) * (k * sigma)) : 0;
      if (order === 1 && 2 * m === ny) gain = 0;
      const re = work[2 * s] * gain;
      const im = work[2 * s + 1] * gain;
      if (order === 1) {
        // (i k)(re + i im) = −k im + i k re
        work[2 * s] = -k * im;
        work[2 * s + 1] = k * re;
      } else {
        work[2 * s] = re;
        work[2 * s + 1] = im;
      }
    }
    this.inverse(out);
    return out;
  }

  /** ∂f/∂y (units of f per length), exact for periodic profiles without Nyquist content. */
  derivative(f: Float64Array, out: Float64Array, band = this.ny / 2): Float64Array {
    return this.filter(f, out, 1, band);
  }

  /** f with meridional indices |m| > band removed. */
  truncate(f: Float64Array, out: Float64Array, band: number): Float64Array {
    return this.filter(f, out, 0, band);
  }

  /** f convolved with a periodic Gaussian of standard deviation σ (length units): f̂_m·e^{−½(k_m σ)²}. */
  smooth(f: Float64Array, out: Float64Array, sigma: number): Float64Array {
    return this.filter(f, out, 0, this.ny / 2, sigma);
  }

  /**
   * The trigonometric interpolant of f at arbitrary positions ys (length units): Σ_m f̂_m e^{i k_m y},
   * the Nyquist term taken as its real part f̂_{ny/2} cos(k_{ny/2} y). Consistent with `derivative`:
   * the integral of the derivative over [a, b] is the interpolant's difference.
   */
  evaluate(f: Float64Array, ys: readonly number[]): number[] {
    this.forward(f);
    const { ny, spec, dky } = this;
    return ys.map((y) => {
      let sum = 0;
      for (let s = 0; s < ny; s++) {
        const m = this.index(s);
        const ph = dky * m * y;
        sum += 2 * m === ny ? spec[2 * s] * Math.cos(ph) : spec[2 * s] * Math.cos(ph) - spec[2 * s + 1] * Math.sin(ph);
      }
      return sum;
    });
  }

  /**
   * One-sided amplitude spectrum into out (length ny/2 + 1): out[m] is the amplitude a of the
   * component a·cos(k_m y + φ), i.e. 2|f̂_m| for 0 < m < ny/2, and |f̂_0|, |f̂_{ny/2}| at the ends.
   */
  amplitudes(f: Float64Array, out: Float64Array = new Float64Array(this.ny / 2 + 1)): Float64Array {
    this.forward(f);
    const half = this.ny / 2;
    for (let m = 0; m <= half; m++) {
      const a = Math.hypot(this.spec[2 * m], this.spec[2 * m + 1]);
      out[m] = m === 0 || m === half ? a : 2 * a;
    }
    return out;
  }
}
