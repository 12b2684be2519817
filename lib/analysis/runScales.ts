import { Forcing } from '../model/forcing';
import type { ModelParams } from '../model/params';
import {
  REGIME_LABELS,
  RHINES_DEFINITIONS,
  dissipationWavenumber,
  frictionWavenumber,
  regimeOf,
  rhinesWavenumber,
  transitionalWavenumber,
  zonostrophyIndex,
  type Regime,
  type RhinesConvention,
} from './scales';
import { SnapshotPlan, type Snapshot } from './snapshot';

/**
 * The scale ladder of a run at one instant: the measured rms velocity and the wavenumbers it and the
 * parameters set (formulas in scales.ts, docs/scales.md), model units. Lengths sit at k = 2π/L.
 *
 * U_rms = ⟨u² + v²⟩^½ over the domain (= (2·KE)^½), measured from the snapshot. ε is the parameter
 * (the ensemble-mean injection rate of stochastic forcing; nominal for steady forcing); η = ε·N/Σ 1/K²
 * over the forced annulus is the matching enstrophy injection (= k_f² ε for a thin ring at k_d = 0).
 * The Rhines entry follows the chosen convention; R_β = k_β/k_R always uses k_R = (β/2U)^½, the
 * definition under the regime thresholds.
 */
export type ScaleId = 'domain' | 'rhines' | 'transitional' | 'friction' | 'forcing' | 'deformation' | 'dissipation' | 'grid';

export interface ScaleEntry {
  id: ScaleId;
  /** Plain label, with the formula used. */
  label: string;
  /** Wavenumber (1/length) and length 2π/k; null when the scale is undefined (e.g. β = 0, k_d = 0). */
  k: number | null;
  length: number | null;
}

export interface RunScales {
  time: number;
  steps: number;
  /** Measured rms velocity (length/time). */
  U_rms: number;
  /** Energy and enstrophy injection rates used (length²/time³, 1/time³). */
  eps: number;
  eta: number;
  rhinesConvention: RhinesConvention;
  /** The ladder, in ascending k (undefined scales last). */
  ladder: ScaleEntry[];
  /** The same entries by id. */
  scales: Record<ScaleId, ScaleEntry>;
  /** Zonostrophy index k_β/k_R and its regime (null when β or ε is 0). */
  R_beta: number | null;
  regime: Regime | null;
  regimeLabel: string;
}

const positive = (x: number): number | null => (Number.isFinite(x) && x > 0 ? x : null);
const entry = (id: ScaleId, label: string, k: number): ScaleEntry => {
  const kk = positive(k);
  return { id, label, k: kk, length: kk === null ? null : (2 * Math.PI) / kk };
};

/** Built once per parameter set (forcing annulus, 1/K²); `measure` reads a snapshot's q̂. */
export class RunScalesPlan {
  readonly params: ModelParams;
  private readonly snap: SnapshotPlan;
  /** η/ε of the forced annulus, N/Σ 1/K² (0 without forcing). */
  private readonly etaPerEps: number;

  constructor(params: ModelParams, snap: SnapshotPlan = new SnapshotPlan(params)) {
    this.params = params;
    this.snap = snap;
    const f = new Forcing(snap.grid, params, snap.lin);
    let s = 0;
    for (let i = 0; i < f.modes.length; i++) s += snap.lin.invK2[f.modes[i]];
    this.etaPerEps = s > 0 ? f.count / s : 0;
  }

  /** U_rms = ⟨u² + v²⟩^½ of q̂: Σ over the full plane of |k|²|ψ̂|², ψ̂ = −q̂/K². */
  rmsVelocity(qHat: Float64Array): number {
    const { nkx, Kx, keptRows, k2 } = this.snap.grid;
    const invK2 = this.snap.lin.invK2;
    let s = 0;
    for (let r = 0; r < keptRows.length; r++) {
      const row = keptRows[r] * nkx;
      for (let ix = 0; ix <= Kx; ix++) {
        const q = row + ix;
        const a = (qHat[2 * q] * qHat[2 * q] + qHat[2 * q + 1] * qHat[2 * q + 1]) * invK2[q] * invK2[q] * k2[q];
        s += ix === 0 ? a : 2 * a;
      }
    }
    return Math.sqrt(s);
  }

  measure(snapshot: Snapshot, convention: RhinesConvention = 'kR'): RunScales {
    const p = this.params;
    const grid = this.snap.grid;
    const U = this.rmsVelocity(snapshot.qHat);
    const eps = p.forcing === 'none' ? 0 : p.eps;
    const eta = eps * this.etaPerEps;
    const def = RHINES_DEFINITIONS[convention];
    const kR = rhinesWavenumber(p.beta, U);
    const kBeta = transitionalWavenumber(p.beta, eps);
    const list: ScaleEntry[] = [
      entry('domain', 'domain 2π/max(Lx, Ly)', (2 * Math.PI) / Math.max(p.Lx, p.Ly)),
      entry('rhines', `Rhines: ${def.label}`, (2 * Math.PI) / def.length(p.beta, U)),
      entry('transitional', 'transitional k_β = (β³/ε)^{1/5}', kBeta),
      entry('friction', 'friction k_fric = (μ³/ε)^½', frictionWavenumber(p.mu, eps)),
      entry('forcing', 'forcing k_f', p.forcing === 'none' ? 0 : p.kf),
      entry('deformation', 'deformation k_d = 1/L_d', p.kd),
      entry('dissipation', `dissipation k_ν = (η^{1/3}/ν)^{1/(2p)}, p = ${p.nu_order}`, dissipationWavenumber(eta, p.nu, p.nu_order)),
      entry('grid', 'grid: largest kept disc (2/3 rule)', grid.kMaxKept),
    ];
    const scales = {} as Record<ScaleId, ScaleEntry>;
    for (const e of list) scales[e.id] = e;
    const ladder = list.slice().sort((a, b) => (a.k ?? Infinity) - (b.k ?? Infinity));
    const R = positive(kR) !== null && positive(kBeta) !== null ? zonostrophyIndex(kBeta, kR) : null;
    const regime = R === null ? null : regimeOf(R);
    return {
      time: snapshot.time,
      steps: snapshot.steps,
      U_rms: U,
      eps,
      eta,
      rhinesConvention: convention,
      ladder,
      scales,
      R_beta: R,
      regime,
      regimeLabel: regime === null ? 'no regime: needs β > 0, ε > 0 and motion' : REGIME_LABELS[regime],
    };
  }
}

/** One-off ladder of a snapshot (builds a plan; keep a RunScalesPlan for repeated use). */
export function runScales(snapshot: Snapshot, convention: RhinesConvention = 'kR'): RunScales {
  return new RunScalesPlan(snapshot.params).measure(snapshot, convention);
}
