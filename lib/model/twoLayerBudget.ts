import type { QuadraticBudget, StepReport } from './budget';
import type { Forcing } from './forcing';
import type { Grid } from './grid';
import type { TwoLayerLinearOperator } from './twoLayerLinear';

/**
 * The two-layer budgets at the start of a step (docs/two-layer.md, "Energy and enstrophy"), from the
 * state q (layer 1, then layer 2), its ψ̂₁, ψ̂₂ and its nonlinear term a (same layout); adds the
 * steady forcing to both layers of a. Model units, domain means, full-plane sums (a stored mode with
 * kx > 0 stands for itself and its conjugate). With h_i = H_i/H and τ = ψ₁ − ψ₂:
 *   E = ½Σ_i h_i⟨|∇ψ_i|²⟩ + ½F₁h₁⟨τ²⟩ = ½Σ(|h₁q̂₁ + h₂q̂₂|²/k² + h₁h₂|q̂₁ − q̂₂|²/(k² + k_d²)),
 *   Z = ½Σ_i h_i⟨q_i²⟩,
 *   dE/dt = injection + generation − drag − hyper − largeScale + transfer, likewise for Z, with
 *   generation_E = F₁h₁(U₁ − U₂)⟨vτ⟩, generation_Z = k_d²·generation_E (the imposed flows' terms
 *     U_i∂x q_i and Q_i∂xψ_i: only their differences between the layers survive),
 *   drag_E = μh₂⟨|∇ψ₂|²⟩ = 2μ·KE₂, drag_Z = −μh₂⟨q₂∇²ψ₂⟩ (lower layer only),
 *   hyper, largeScale = 2·rate·(mode's share), as in one layer (both act on q in both layers),
 *   transfer_E = −Σ_i h_i⟨ψ_i N_i⟩, transfer_Z = Σ_i h_i⟨q_i N_i⟩, zero to round-off (the budget's
 *     residual), N_i = −J(ψ_i, q_i),
 *   injection: steady ⟨−ψ_bt F⟩ and ⟨q_bt F⟩ (F acts on both layers: ψ_bt = h₁ψ₁ + h₂ψ₂,
 *     q_bt = h₁q₁ + h₂q₂); stochastic, the ensemble mean σ²Σ1/k² and σ²N(h₁ + h₂).
 * The energy cycle (TwoLayerTerms; docs/two-layer.md, "The energy cycle"): each term's tendency T
 * (per layer) projected per mode on the barotropic energy, dE_bt = −Re(ψ̂_bt* (h₁T₁ + h₂T₂)), and the
 * baroclinic, dE_bc = −h₁h₂ Re(τ̂* (T₁ − T₂)), the latter split into APE and baroclinic KE in the
 * mode's proportions k_d²/(K² + k_d²) and K²/(K² + k_d²). With X = the mode's share of ⟨vτ⟩:
 *   imposed shear and β   dE_bt = h₁h₂(U₁ − U₂) K² X,  dE_bc = h₁h₂(U₁ − U₂)(k_d² − K²) X,
 *   drag                  dE_bt = −h₂μK² Re(ψ̂_bt* ψ̂₂),  dE_bc = h₁h₂μK² Re(τ̂* ψ̂₂),
 *   hyper, large-scale    −2·rate times each reservoir's share,
 *   nonlinear N           its projections (their sum is `transfer`),
 *   generation = Σ F₁h₁(U₁ − U₂) X, conversion = generation − APE share of (shear + drag + N),
 *   barotropicTransfer = dE_bt of (shear + N), drag parts = −dE of the drag.
 */
export function twoLayerStartBudget(
  grid: Grid,
  lin: TwoLayerLinearOperator,
  forcing: Forcing,
  q: Float64Array,
  psi1: Float64Array,
  psi2: Float64Array,
  a: Float64Array,
  r: StepReport,
): void {
  const { nkx, Kx, keptRows, kx, k2 } = grid;
  const { h1, h2, F1, F2, U1, U2 } = lin.coefficients;
  const h12 = h1 * h2;
  const mu = lin.mu;
  const { invK2Barotropic: ib, invK2Baroclinic: ic, hyperRate, lsRate } = lin;
  const n = 2 * grid.spectralSize;
  const steady = forcing.kind === 'steady' ? forcing.steady : null;
  let e = 0,
    z = 0,
    ke1 = 0,
    ke2 = 0,
    ape = 0,
    heat = 0;
  let eDrag = 0,
    eHyper = 0,
    eLs = 0,
    eTr = 0,
    eInj = 0;
  let zDrag = 0,
    zHyper = 0,
    zLs = 0,
    zTr = 0,
    zInj = 0;
  // The energy cycle: reservoirs, the split of drag, hyper and large-scale losses, the conversions.
  let keBt = 0,
    keBc = 0,
    conv = 0,
    toBt = 0,
    dragBt = 0,
    dragBc = 0,
    hypA = 0,
    hypBc = 0,
    hypBt = 0,
    lsA = 0,
    lsBc = 0,
    lsBt = 0;
  const kd2 = F1 + F2;
  const dU = U1 - U2;
  for (let k = 0; k < keptRows.length; k++) {
    const row = keptRows[k] * nkx;
    for (let ix = 0; ix <= Kx; ix++) {
      const m = row + ix;
      const t = 2 * m;
      const u = n + t;
      // Half of the full-plane weight (2 for kx > 0, 1 for kx = 0): the ½ of E and Z folded in.
      const wgt = ix === 0 ? 0.5 : 1;
      const q1r = q[t],
        q1i = q[t + 1],
        q2r = q[u],
        q2i = q[u + 1];
      const p1r = psi1[t],
        p1i = psi1[t + 1],
        p2r = psi2[t],
        p2i = psi2[t + 1];
      const btr = h1 * q1r + h2 * q2r,
        bti = h1 * q1i + h2 * q2i;
      const bcr = q1r - q2r,
        bci = q1i - q2i;
      const em = wgt * ((btr * btr + bti * bti) * ib[m] + h12 * (bcr * bcr + bci * bci) * ic[m]);
      const zm = wgt * (h1 * (q1r * q1r + q1i * q1i) + h2 * (q2r * q2r + q2i * q2i));
      e += em;
      z += zm;
      const K2 = k2[m];
      const k1m = wgt * h1 * K2 * (p1r * p1r + p1i * p1i);
      const k2m = wgt * h2 * K2 * (p2r * p2r + p2i * p2i);
      ke1 += k1m;
      ke2 += k2m;
      const tr = p1r - p2r,
        ti = p1i - p2i;
      const apeM = wgt * h1 * F1 * (tr * tr + ti * ti);
      ape += apeM;
      // ⟨vτ⟩: Re((i kx ψ̂₁)* τ̂) = kx·Im(ψ̂₁* τ̂) = kx·(ψ₁ᵢψ₂ᵣ − ψ₁ᵣψ₂ᵢ), twice for the full plane.
      const X = 2 * wgt * kx[ix] * (p1i * p2r - p1r * p2i);
      heat += X;
      eDrag += 2 * mu * k2m;
      zDrag -= 2 * wgt * h2 * mu * K2 * (q2r * p2r + q2i * p2i);
      const hr = 2 * hyperRate[m];
      const lr = 2 * lsRate[m];
      eHyper += hr * em;
      eLs += lr * em;
      zHyper += hr * zm;
      zLs += lr * zm;
      const a1r = a[t],
        a1i = a[t + 1],
        a2r = a[u],
        a2i = a[u + 1];
      eTr -= 2 * wgt * (h1 * (p1r * a1r + p1i * a1i) + h2 * (p2r * a2r + p2i * a2i));
      zTr += 2 * wgt * (h1 * (q1r * a1r + q1i * a1i) + h2 * (q2r * a2r + q2i * a2i));
      // The cycle: ψ̂_bt, the APE share fA of the baroclinic energy, each term's projections.
      const pbr = h1 * p1r + h2 * p2r,
        pbi = h1 * p1i + h2 * p2i;
      const fA = kd2 * ic[m];
      const keBtM = wgt * K2 * (pbr * pbr + pbi * pbi);
      const keBcM = wgt * h12 * K2 * (tr * tr + ti * ti);
      keBt += keBtM;
      keBc += keBcM;
      const shearBt = h12 * dU * K2 * X;
      const shearBc = h12 * dU * (kd2 - K2) * X;
      const dragBtM = -2 * wgt * h2 * mu * K2 * (pbr * p2r + pbi * p2i);
      const dragBcM = 2 * wgt * h12 * mu * K2 * (tr * p2r + ti * p2i);
      const nBt = -2 * wgt * (pbr * (h1 * a1r + h2 * a2r) + pbi * (h1 * a1i + h2 * a2i));
      const nBc = -2 * wgt * h12 * (tr * (a1r - a2r) + ti * (a1i - a2i));
      conv += F1 * h1 * dU * X - fA * (shearBc + dragBcM + nBc);
      toBt += shearBt + nBt;
      dragBt -= dragBtM;
      dragBc -= dragBcM;
      hypA += hr * apeM;
      hypBc += hr * keBcM;
      hypBt += hr * keBtM;
      lsA += lr * apeM;
      lsBc += lr * keBcM;
      lsBt += lr * keBtM;
      if (steady) {
        const fr = steady[t];
        const fi = steady[t + 1];
        eInj -= 2 * wgt * (pbr * fr + pbi * fi);
        zInj += 2 * wgt * (btr * fr + bti * fi);
        a[t] += fr;
        a[t + 1] += fi;
        a[u] += fr;
        a[u + 1] += fi;
      }
    }
  }
  if (forcing.kind === 'stochastic') {
    let s = 0;
    for (let i = 0; i < forcing.modes.length; i++) s += ib[forcing.modes[i]];
    eInj = forcing.variance * s;
    zInj = forcing.variance * forcing.count * (h1 + h2);
  }
  const eGen = F1 * h1 * (U1 - U2) * heat;
  r.kinetic = ke1 + ke2;
  const L = r.layers!;
  L.kineticUpper = ke1;
  L.kineticLower = ke2;
  L.potential = ape;
  L.heatFlux = heat;
  L.kineticBarotropic = keBt;
  L.kineticBaroclinic = keBc;
  L.conversion = conv;
  L.barotropicTransfer = toBt;
  L.dragBarotropic = dragBt;
  L.dragBaroclinic = dragBc;
  L.hyperPotential = hypA;
  L.hyperBaroclinic = hypBc;
  L.hyperBarotropic = hypBt;
  L.largeScalePotential = lsA;
  L.largeScaleBaroclinic = lsBc;
  L.largeScaleBarotropic = lsBt;
  fill(r.energy, e, eInj, eGen, eDrag, eHyper, eLs, eTr);
  fill(r.enstrophy, z, zInj, (F1 + F2) * eGen, zDrag, zHyper, zLs, zTr);
}

function fill(
  bud: QuadraticBudget,
  value: number,
  inj: number,
  gen: number,
  drag: number,
  hyper: number,
  ls: number,
  tr: number,
): void {
  bud.value = value;
  bud.injection = inj;
  bud.generation = gen;
  bud.drag = drag;
  bud.hyper = hyper;
  bud.largeScale = ls;
  bud.transfer = tr;
  bud.tendency = inj + gen - drag - hyper - ls + tr;
}
