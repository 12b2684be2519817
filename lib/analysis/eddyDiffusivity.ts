/**
 * Eddy diffusivity of PV from the flux-gradient closure v′q′ = −D ∂y q̄_tot (Taylor 1915; Vallis
 * 2017), with ∂y q̄_tot = ∂y q̄ + β (`ZonalMeans.dqdy`). Model units: D in length²/time, positive for
 * down-gradient flux.
 */
export interface DiffusivityOptions {
  /** |∂y q̄_tot| below this is too small to divide by (1/(length·time)); default relativeFloor·rms(∂y q̄_tot). */
  floor?: number;
  /** Default 0.1. */
  relativeFloor?: number;
}

export interface EddyDiffusivity {
  /** D(y) = −v′q′/∂y q̄_tot where valid, else 0 (never NaN). */
  D: Float64Array;
  /** 1 where |∂y q̄_tot| ≥ floor, else 0. */
  valid: Uint8Array;
  validCount: number;
  /** The gradient floor used. */
  floor: number;
  /** Mean of D(y) over the valid points; null when none is valid. */
  Dmean: number | null;
  /**
   * Least-squares bulk diffusivity over all points, the one D that best fits v′q′ = −D ∂y q̄_tot:
   * D_fit = −⟨v′q′ ∂y q̄_tot⟩/⟨(∂y q̄_tot)²⟩. The flux-weighted ratio −⟨v′q′⟩/⟨∂y q̄_tot⟩ is not offered:
   * in a periodic channel ⟨v′q′⟩ = −⟨∂y(u′v′)⟩ = 0 (Taylor identity), so it vanishes identically.
   * Null when ∂y q̄_tot is zero everywhere.
   */
  Dfit: number | null;
  /** Eddy rms speed U′ = ⟨u′² + v′²⟩^½ = (2⟨EKE⟩)^½ (domain means). */
  Urms: number;
  /** Mixing length L_mix = D_fit/U′ (length); null when D_fit is or U′ = 0. */
  Lmix: number | null;
}

/**
 * D(y), its masks and domain means from the profiles of one instant or a time mean: vpqp = v′q′,
 * dqdy = ∂y q̄_tot, eke = ½(u′² + v′²), all of one length. Writes into out.D and out.valid when given
 * (no allocation); returns the result.
 */
export function eddyDiffusivity(
  vpqp: ArrayLike<number>,
  dqdy: ArrayLike<number>,
  eke: ArrayLike<number>,
  options: DiffusivityOptions = {},
  out?: { D: Float64Array; valid: Uint8Array },
): EddyDiffusivity {
  const n = dqdy.length;
  if (vpqp.length !== n || eke.length !== n)
    throw new RangeError(`eddyDiffusivity: profiles of lengths ${vpqp.length}, ${n}, ${eke.length} differ`);
  const D = out?.D ?? new Float64Array(n);
  const valid = out?.valid ?? new Uint8Array(n);
  if (D.length !== n || valid.length !== n) throw new RangeError(`eddyDiffusivity: outputs must have length ${n}`);
  let g2 = 0;
  let fg = 0;
  let ke = 0;
  for (let j = 0; j < n; j++) {
    g2 += dqdy[j] * dqdy[j];
    fg += vpqp[j] * dqdy[j];
    ke += eke[j];
  }
  const floor = options.floor ?? (options.relativeFloor ?? 0.1) * Math.sqrt(g2 / n);
  if (!(floor >= 0)) throw new RangeError(`eddyDiffusivity: floor = ${floor} must be ≥ 0`);
  let count = 0;
  let sum = 0;
  for (let j = 0; j < n; j++) {
    const g = dqdy[j];
    // A zero gradient is never divided by, whatever the floor.
    if (Math.abs(g) >= floor && g !== 0) {
      D[j] = -vpqp[j] / g;
      valid[j] = 1;
      count++;
      sum += D[j];
    } else {
      D[j] = 0;
      valid[j] = 0;
    }
  }
  const Dfit = g2 > 0 ? -fg / g2 : null;
  const Urms = Math.sqrt((2 * ke) / n);
  return {
    D,
    valid,
    validCount: count,
    floor,
    Dmean: count ? sum / count : null,
    Dfit,
    Urms,
    Lmix: Dfit !== null && Urms > 0 ? Dfit / Urms : null,
  };
}
