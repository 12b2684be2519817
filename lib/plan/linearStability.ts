import { twoLayerCoefficients } from '../model/params';

/**
 * Linear stability of the two-layer (Phillips) model of lib/model (docs/two-layer.md, "The linear
 * problem"): for a mode e^{i(kx + ly)} of the eddies about the imposed flows,
 *   dq̂/dt = L q̂,  L = −ik U − ik Q A + μK² E₂₂ A − νK^{2p} I,  ψ̂ = A q̂,  A = M⁻¹,
 *   M = [[−K² − F₁, F₁], [F₂, −K² − F₂]],  U = diag(U₁, U₂),  Q = diag(Q₁, Q₂),  E₂₂ = diag(0, 1),
 * K² = k² + l². Its eigenvalues λ = T ± s, T = tr L/2, s² = ((l₁₁ − l₂₂)/2)² + l₁₂l₂₁, give the growth
 * rate σ = Re λ and the frequency ω = −Im λ of the mode e^{λt}. Without drag and hyperviscosity
 * λ = −iω with ω ψ̂ = k M⁻¹(U M + Q) ψ̂, the textbook form [derived; Pedlosky 1987 §7.11;
 * Vallis 2017, baroclinic-instability chapter]. Model units. Pure arithmetic (Math.* is fine here:
 * these numbers inform a plan and check a run, they are not part of a run's bits).
 */
export interface PhillipsProblem {
  /** Deformation wavenumber k_d, k_d² = F₁ + F₂ (1/length). */
  kd: number;
  /** δ = H₁/H₂. */
  depthRatio: number;
  /** β (1/(length·time)). */
  beta: number;
  /** U₁ − U₂ (length/time). */
  shear: number;
  /** A uniform flow added to both layers (length/time): shifts ω by k·U, leaves σ. Default 0 (the model's). */
  barotropicFlow?: number;
  /** Linear drag on the lower layer's relative vorticity (1/time). Default 0. */
  mu?: number;
  /** Hyperviscosity ν (on q, both layers) and its order p. Default 0. */
  nu?: number;
  order?: number;
}

export interface ModeGrowth {
  /** Growth rate σ = Re λ of the faster-growing eigenmode (1/time); ≤ 0 when the mode is stable. */
  growth: number;
  /** Its frequency ω = −Im λ (1/time); phase speed ω/k. */
  frequency: number;
  /** The other eigenvalue's growth rate and frequency. */
  otherGrowth: number;
  otherFrequency: number;
}

/** L of the mode (k, l) as [re, im] of l₁₁, l₁₂, l₂₁, l₂₂ (8 numbers). */
export function linearMatrix(p: PhillipsProblem, k: number, l: number): number[] {
  const c = twoLayerCoefficients({ kd: p.kd, beta: p.beta, shear: p.shear, depth_ratio: p.depthRatio });
  const ub = p.barotropicFlow ?? 0;
  const U1 = c.U1 + ub;
  const U2 = c.U2 + ub;
  const K2 = k * k + l * l;
  const det = K2 * (K2 + c.F1 + c.F2);
  const a11 = (-K2 - c.F2) / det;
  const a12 = -c.F1 / det;
  const a21 = -c.F2 / det;
  const a22 = (-K2 - c.F1) / det;
  const damp = (p.nu ?? 0) * Math.pow(K2, p.order ?? 1);
  const drag = (p.mu ?? 0) * K2;
  return [
    -damp,
    -k * (U1 + c.Q1 * a11),
    0,
    -k * c.Q1 * a12,
    drag * a21,
    -k * c.Q2 * a21,
    drag * a22 - damp,
    -k * (U2 + c.Q2 * a22),
  ];
}

/** The eigenvalues of a 2 × 2 complex matrix (8 numbers as in `linearMatrix`): [re₊, im₊, re₋, im₋]. */
export function eigenvalues2x2(L: readonly number[]): [number, number, number, number] {
  const [ar, ai, br, bi, cr, ci, dr, di] = L;
  const tr = 0.5 * (ar + dr);
  const ti = 0.5 * (ai + di);
  const hr = 0.5 * (ar - dr);
  const hi = 0.5 * (ai - di);
  const zr = hr * hr - hi * hi + (br * cr - bi * ci);
  const zi = 2 * hr * hi + (br * ci + bi * cr);
  const m = Math.hypot(zr, zi);
  const sr = Math.sqrt(0.5 * (m + zr));
  const si = (zi < 0 ? -1 : 1) * Math.sqrt(0.5 * (m - zr));
  return [tr + sr, ti + si, tr - sr, ti - si];
}

/** Growth rate and frequency of the mode (k, l) (k ≥ 0, any l). */
export function growthRate(p: PhillipsProblem, k: number, l: number): ModeGrowth {
  const [r1, i1, r2, i2] = eigenvalues2x2(linearMatrix(p, k, l));
  const first = r1 >= r2;
  return {
    growth: first ? r1 : r2,
    frequency: -(first ? i1 : i2),
    otherGrowth: first ? r2 : r1,
    otherFrequency: -(first ? i2 : i1),
  };
}

export interface MostUnstable {
  /** Zonal wavenumber of the fastest growth (1/length), l as asked. */
  k: number;
  l: number;
  growth: number;
  frequency: number;
}

/**
 * The fastest-growing zonal wavenumber k in (0, kMax] at meridional wavenumber l (default 0, where
 * the Phillips model grows fastest without drag): a scan of `samples` points, then golden-section
 * search around the best one (to about 1e−10 relative in k). kMax defaults to 4·max(k_d, 1e−300).
 * Growth ≤ 0 everywhere gives the scan's best (least decaying) point.
 */
export function mostUnstable(
  p: PhillipsProblem,
  options: { l?: number; kMax?: number; samples?: number } = {},
): MostUnstable {
  const l = options.l ?? 0;
  const kMax = options.kMax ?? 4 * Math.max(p.kd, 1e-300);
  const n = options.samples ?? 400;
  const sigma = (k: number) => growthRate(p, k, l).growth;
  let best = 1;
  let bestValue = -Infinity;
  for (let i = 1; i <= n; i++) {
    const v = sigma((kMax * i) / n);
    if (v > bestValue) {
      bestValue = v;
      best = i;
    }
  }
  let a = (kMax * (best - 1)) / n;
  let b = (kMax * Math.min(best + 1, n)) / n;
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = sigma(x1);
  let f2 = sigma(x2);
  for (let it = 0; it < 200 && b - a > 1e-12 * kMax; it++) {
    if (f1 >= f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = sigma(x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = sigma(x2);
    }
  }
  const k = 0.5 * (a + b);
  const m = growthRate(p, k, l);
  return { k, l, growth: m.growth, frequency: m.frequency };
}

/**
 * The smallest shear U₁ − U₂ > 0 at which some mode grows, without drag or hyperviscosity:
 * β/F₂ = β(1 + δ)/(δ k_d²), where the lower layer's mean PV gradient Q₂ = β − F₂(U₁ − U₂) changes
 * sign (Q₁ > 0 for β ≥ 0, and the two must differ in sign: the Charney–Stern condition in layer
 * form). For equal layers 2β/k_d² [published: Phillips 1954; Pedlosky 1987 §7.11]; for unequal
 * layers the threshold is [derived] (Charney–Stern necessity; that growth sets in just above it is
 * checked against the eigenvalues in test/plan/linearStability.test.ts). 0 when β = 0.
 */
export function criticalShear(kd: number, depthRatio: number, beta: number): number {
  const F2 = twoLayerCoefficients({ kd, beta, shear: 0, depth_ratio: depthRatio }).F2;
  return beta / F2;
}
