/**
 * The statistical steady state, as Stria's runs decide it. Time from the start t₀ of the run is cut
 * into consecutive windows of length W (default the spin-up time 1/(2μ)): [t₀, t₀+W), [t₀+W, t₀+2W), …
 * At the end of each window, the time-mean energy of that window, Ē_n, is compared with that of the
 * window before, Ē_{n−1}. The run is steady at the first window end where
 *
 *     |Ē_n − Ē_{n−1}| ≤ tol · (Ē_n + Ē_{n−1}) / 2,
 *
 * so at t₀ + 2W at the earliest. Why this test: from rest under linear drag the energy spins up as
 * E(t) = E_s(1 − e^{−2μt}); with W = 1/(2μ) the means of windows n−1 and n (window n covering
 * [(n−1)W, nW]) differ by E_s(1 − e^{−1})² e^{−(n−2)}, about 0.4 E_s e^{−(n−2)}, so the default
 * tol = 5% first passes at the end of window 5 (t = 2.5/μ), when the energy is within e^{−5} ≈ 0.7%
 * of E_s [derived]. A window mean also
 * averages out the stochastic forcing's fluctuations, which a pointwise test would chase.
 *
 * Means are dt-weighted: each step's energy (at its start, as the step report gives it) counts for
 * its dt in the window where the step begins. Energy E = ½⟨|∇ψ|² + k_d²ψ²⟩, model units.
 */
export class SteadyCriterion {
  readonly window: number;
  readonly tolerance: number;
  private windowEnd: number;
  private sum = 0;
  private duration = 0;
  private previous = NaN;
  /** The last two window means compared, once the criterion has passed (or the last pair seen). */
  lastPair: [number, number] = [NaN, NaN];
  steadyAt: number | null = null;

  constructor(start: number, window: number, tolerance: number) {
    if (!(window > 0 && Number.isFinite(window)))
      throw new RangeError(`SteadyCriterion: window = ${window} must be a positive finite time`);
    if (!(tolerance > 0)) throw new RangeError(`SteadyCriterion: tolerance = ${tolerance} must be > 0`);
    this.window = window;
    this.tolerance = tolerance;
    this.windowEnd = start + window;
  }

  /**
   * Record one step that started at time `t` and lasted `dt`, with energy `energy` at its start.
   * Returns true once the run is steady (and stays true).
   */
  add(t: number, dt: number, energy: number): boolean {
    if (this.steadyAt !== null) return true;
    // A step that begins at or after the window's end closes it first (and any empty windows after).
    while (t >= this.windowEnd) {
      if (this.closeWindow()) return true;
    }
    this.sum += energy * dt;
    this.duration += dt;
    return false;
  }

  /** Close the current window; true when its mean and the previous one agree within the tolerance. */
  private closeWindow(): boolean {
    const mean = this.duration > 0 ? this.sum / this.duration : NaN;
    const prev = this.previous;
    const end = this.windowEnd;
    this.previous = mean;
    this.sum = 0;
    this.duration = 0;
    this.windowEnd += this.window;
    if (!Number.isFinite(prev) || !Number.isFinite(mean)) return false;
    this.lastPair = [prev, mean];
    if (Math.abs(mean - prev) <= (this.tolerance * (mean + prev)) / 2) {
      this.steadyAt = end;
      return true;
    }
    return false;
  }
}
