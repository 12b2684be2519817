import { layerFieldSpectrum } from '../model/layerFields';
import type { ModelParams } from '../model/params';
import { NonlinearTerm } from '../model/nonlinearTerm';
import { TwoLayerNonlinearTerm } from '../model/twoLayerNonlinear';
import { barotropicParams, LayerSnapshotPlan } from './layerSnapshot';
import { SnapshotPlan } from './snapshot';
import { SpectraPlan } from './spectra';

/**
 * Barotropic and baroclinic energy spectra and spectral energy fluxes of a two-layer state (q̂₁ then
 * q̂₂, half-plane layout of lib/model/grid.ts), model units, instantaneous (average snapshots for a
 * mean). Shells as in spectra.ts (sums per shell, width dk = min(2π/Lx, 2π/Ly)).
 *
 * Spectra per full-plane mode (docs/two-layer.md, "The energy cycle"): barotropic kinetic energy
 * ½K²|ψ̂_bt|², baroclinic kinetic energy ½h₁h₂K²|τ̂|² and available potential energy ½h₁h₂k_d²|τ̂|²;
 * their sums over the shells are KE_bt, KE_bc and APE of the step report.
 *
 * Transfers, from the dealiased nonlinear terms of the model itself (TwoLayerNonlinearTerm,
 * N_i = −J(ψ_i, q_i)): per mode the rate the advection changes the barotropic energy, T_bt =
 * −Re(ψ̂_bt* N_bt), N_bt = h₁N₁ + h₂N₂, and the baroclinic, T_bc = −h₁h₂ Re(τ̂* (N₁ − N₂)). Since
 * N_bt = −J(ψ_bt, ζ_bt) − h₁h₂J(τ, ∇²τ) [derived: the F terms cancel, F₁h₁ = F₂h₂], T_bt splits into
 * the barotropic self-interaction T_self (the one-layer term of ψ_bt, which sums to zero) and the
 * exchange X = T_bt − T_self, what the baroclinic mode gives the barotropic at that wavenumber (its sum
 * is the eddies' share of the energy cycle's barotropic transfer). Fluxes through the outer shell
 * edges kEdge_s = (s + 3/2)dk, positive toward high k, from cumulative sums from low k:
 *   Π = −Σ_{≤s}(T_bt + T_bc)  all energy,
 *   Π_bt = −Σ_{≤s} T_self     barotropic energy by barotropic triads,
 *   Π_bc = Π − Π_bt           energy carried by every triad with a baroclinic leg (and the exchange);
 * all three vanish below the first shell and, to round-off, above the last kept one.
 */
export interface LayerSpectra {
  readonly k: Float64Array;
  readonly kEdge: Float64Array;
  readonly kineticBarotropic: Float64Array;
  readonly kineticBaroclinic: Float64Array;
  readonly potential: Float64Array;
  /** Per-shell transfers (length²/time³): T_bt, T_self, the exchange X and T_bc. */
  readonly transferBarotropic: Float64Array;
  readonly transferSelf: Float64Array;
  readonly exchange: Float64Array;
  readonly transferBaroclinic: Float64Array;
  /** Fluxes through kEdge (positive toward high k). */
  readonly flux: Float64Array;
  readonly fluxBarotropic: Float64Array;
  readonly fluxBaroclinic: Float64Array;
  /** Σ X: the eddies' baroclinic → barotropic transfer; Σ (T_bt + T_bc), round-off; Σ |T|, its scale. */
  netExchange: number;
  netTransfer: number;
  grossTransfer: number;
}

/** Spectra and fluxes of two-layer states of one parameter set; `compute` allocates nothing. */
export class LayerSpectraPlan {
  readonly shells: SpectraPlan;
  private readonly layer: LayerSnapshotPlan;
  private readonly nl: TwoLayerNonlinearTerm;
  private readonly self: NonlinearTerm;
  private readonly bt: Float64Array;
  private readonly N1: Float64Array;
  private readonly N2: Float64Array;
  private readonly Nself: Float64Array;

  constructor(params: ModelParams) {
    this.layer = new LayerSnapshotPlan(params);
    const grid = this.layer.grid;
    this.shells = new SpectraPlan(grid, 0);
    this.nl = new TwoLayerNonlinearTerm(grid, this.layer.lin);
    const bt = new SnapshotPlan(barotropicParams(params));
    this.self = new NonlinearTerm(bt.grid, bt.lin, bt.transform);
    const n = 2 * grid.spectralSize;
    this.bt = new Float64Array(n);
    this.N1 = new Float64Array(n);
    this.N2 = new Float64Array(n);
    this.Nself = new Float64Array(n);
  }

  createOutput(): LayerSpectra {
    const n = this.shells.nShells;
    const f = () => new Float64Array(n);
    const k = f();
    const kEdge = f();
    for (let s = 0; s < n; s++) {
      k[s] = (s + 1) * this.shells.dk;
      kEdge[s] = (s + 1.5) * this.shells.dk;
    }
    return {
      k,
      kEdge,
      kineticBarotropic: f(),
      kineticBaroclinic: f(),
      potential: f(),
      transferBarotropic: f(),
      transferSelf: f(),
      exchange: f(),
      transferBaroclinic: f(),
      flux: f(),
      fluxBarotropic: f(),
      fluxBaroclinic: f(),
      netExchange: 0,
      netTransfer: 0,
      grossTransfer: 0,
    };
  }

  /** Spectra, transfers and fluxes of q̂ into out; returns out. */
  compute(qHat: Float64Array, out: LayerSpectra = this.createOutput()): LayerSpectra {
    const { grid, lin } = this.layer;
    const n = 2 * grid.spectralSize;
    if (qHat.length !== 2 * n)
      throw new RangeError(`LayerSpectraPlan: expected a two-layer state of ${2 * n} values, got ${qHat.length}`);
    this.nl.evaluate(qHat.subarray(0, n), qHat.subarray(n), this.N1, this.N2);
    layerFieldSpectrum('q', 'barotropic', qHat, grid, lin, this.bt);
    this.self.evaluate(this.bt, this.Nself);
    const { h1, h2 } = lin.coefficients;
    const h12 = h1 * h2;
    const kd2 = lin.coefficients.F1 + lin.coefficients.F2;
    const { shellOf, weight } = this.shells;
    const { invK2Barotropic: ib, invK2Baroclinic: ic, kept } = lin;
    for (const a of [
      out.kineticBarotropic,
      out.kineticBaroclinic,
      out.potential,
      out.transferBarotropic,
      out.transferSelf,
      out.exchange,
      out.transferBaroclinic,
    ])
      a.fill(0);
    const { N1, N2, Nself } = this;
    let gross = 0;
    for (let m = 0; m < grid.spectralSize; m++) {
      const s = shellOf[m];
      if (s < 0 || !kept[m]) continue;
      const t = 2 * m;
      const w = weight[m];
      const [q1r, q1i, q2r, q2i] = [qHat[t], qHat[t + 1], qHat[n + t], qHat[n + t + 1]];
      const K2 = grid.k2[m];
      // ψ̂_bt = −q̂_bt/K², τ̂ = −(q̂₁ − q̂₂)/(K² + k_d²).
      const br = -(h1 * q1r + h2 * q2r) * ib[m];
      const bi = -(h1 * q1i + h2 * q2i) * ib[m];
      const tr = -(q1r - q2r) * ic[m];
      const ti = -(q1i - q2i) * ic[m];
      out.kineticBarotropic[s] += 0.5 * w * K2 * (br * br + bi * bi);
      out.kineticBaroclinic[s] += 0.5 * w * h12 * K2 * (tr * tr + ti * ti);
      out.potential[s] += 0.5 * w * h12 * kd2 * (tr * tr + ti * ti);
      const tBt = -w * (br * (h1 * N1[t] + h2 * N2[t]) + bi * (h1 * N1[t + 1] + h2 * N2[t + 1]));
      const tSelf = -w * (br * Nself[t] + bi * Nself[t + 1]);
      const tBc = -w * h12 * (tr * (N1[t] - N2[t]) + ti * (N1[t + 1] - N2[t + 1]));
      out.transferBarotropic[s] += tBt;
      out.transferSelf[s] += tSelf;
      out.exchange[s] += tBt - tSelf;
      out.transferBaroclinic[s] += tBc;
      gross += Math.abs(tBt) + Math.abs(tBc);
    }
    let cum = 0;
    let cumSelf = 0;
    let exchange = 0;
    for (let s = 0; s < out.k.length; s++) {
      cum += out.transferBarotropic[s] + out.transferBaroclinic[s];
      cumSelf += out.transferSelf[s];
      exchange += out.exchange[s];
      out.flux[s] = -cum;
      out.fluxBarotropic[s] = -cumSelf;
      out.fluxBaroclinic[s] = -cum + cumSelf;
    }
    out.netExchange = exchange;
    out.netTransfer = cum;
    out.grossTransfer = gross;
    return out;
  }
}
