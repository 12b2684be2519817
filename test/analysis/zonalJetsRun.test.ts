import { describe, expect, it } from 'vitest';
import { eddyDiffusivity } from '../../lib/analysis/eddyDiffusivity';
import { HovmollerAccumulator } from '../../lib/analysis/hovmoller';
import { trackJets } from '../../lib/analysis/jetTracking';
import { JetFinder } from '../../lib/analysis/jets';
import { ProfileFFT } from '../../lib/analysis/profileFFT';
import { dissipationWavenumber, steadyZonostrophyIndex, transitionalWavenumber } from '../../lib/analysis/scales';
import { SnapshotPlan, type GridFields } from '../../lib/analysis/snapshot';
import { StaircaseFitter } from '../../lib/analysis/staircase';
import { ProfileTimeMean } from '../../lib/analysis/timeMean';
import { createZonalMeans, ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import { Model } from '../../lib/model/model';
import { NonlinearTerm } from '../../lib/model/nonlinearTerm';
import { keptRadius } from '../../lib/model/validateParams';
import { maxAbs } from '../support/random';

/**
 * A forced β-plane run spun up to eastward jets, cheap enough for the unit suite (≈ 5 s on one core).
 *  - Grid 32 × 64 on a channel Lx = π, Ly = 2π: jets are zonal and their meridional scale is set by
 *    Ly; halving Lx halves the cost, and kx = 2, 4, … still resolve the forcing ring.
 *  - Forcing ring k_f = 12 ± 1.5 inside the dealiased radius 20; ε = 0.04, μ = 0.03 on vorticity, so
 *    U = (ε/μ)^½ ≈ 1.15; β = 10 puts k_β = (β³/ε)^{1/5} ≈ 7.6 below k_f (an inverse-cascade range
 *    before the arrest) and R_β = √2(β²ε/μ⁵)^{1/20} ≈ 3.6, zonostrophic.
 *  - ν = 1e-10, p = 4: the dissipation wavenumber (η^{1/3}/ν)^{1/8}, η = k_f²ε, is ≈ 19, between k_f
 *    and the cutoff. A weaker ν (1e-13 gives ≈ 45, off the grid) lets enstrophy pile up at the cutoff:
 *    a flat, thermalised spectrum and no jets at this resolution.
 *  - Spin-up t < 60 (≈ 2/μ; the energy balance itself takes 1/(2μ) ≈ 17), means over t ∈ [60, 120].
 */
const params = {
  Lx: Math.PI,
  Ly: 2 * Math.PI,
  nx: 32,
  ny: 64,
  beta: 10,
  kd: 0,
  mu: 0.03,
  nu: 1e-10,
  nu_order: 4,
  forcing: 'stochastic' as const,
  kf: 12,
  dkf: 1.5,
  eps: 0.04,
  dt: 0.05,
  cfl: 0.8,
  seed: 3,
};
const T_SPIN = 60;
const T_END = 120;
const SAMPLE = 0.5;

describe('a spun-up jet run, measured', () => {
  it('has eastward jets fed by eddy momentum flux convergence, a PV staircase and a closed zonal-mean budget', () => {
    // The plan of the run: k_β (Vallis & Maltrud 1993 [published; memory for pages]) below k_f; R_β
    // above 2.5, "fully developed zonostrophic" (Sukoriansky et al. 2007; Galperin et al. 2010
    // [published; memory for the thresholds]); k_ν between k_f and the cutoff [practice].
    expect(params.kf + params.dkf).toBeLessThanOrEqual(keptRadius(params));
    expect(transitionalWavenumber(params.beta, params.eps)).toBeLessThan(params.kf);
    expect(steadyZonostrophyIndex(params.beta, params.eps, params.mu)).toBeGreaterThan(2.5);
    const kNu = dissipationWavenumber(params.kf ** 2 * params.eps, params.nu, params.nu_order);
    expect(kNu).toBeGreaterThan(params.kf + params.dkf);
    expect(kNu).toBeLessThan(keptRadius(params));

    const model = new Model(params);
    const plan = new SnapshotPlan(model.params);
    const { ny, Ly, Ky } = plan.grid;
    const zonal = new ZonalMeanPlan(plan.grid, { beta: params.beta, band: Ky });
    const z = createZonalMeans(ny);
    const names = ['ubar', 'upvp', 'convUpvp', 'qtot', 'vpqp', 'dqdy', 'eke'] as const;
    const late = new ProfileTimeMean(names, ny, { kind: 'since', tStart: T_SPIN });
    const early = new ProfileTimeMean(names, ny, { kind: 'last', span: 8 });
    const hov = new HovmollerAccumulator(ny, Ly, 256);
    const mean = () =>
      Object.fromEntries(names.map((n) => [n, new Float64Array(ny)])) as Record<(typeof names)[number], Float64Array>;
    const earlyMean = mean();
    let fields: GridFields | undefined;
    let next = SAMPLE;
    let earlyDone = false;
    while (model.time < T_END) {
      model.step(1);
      if (model.time < next) continue;
      next += SAMPLE;
      fields = plan.gridFields(model.qHat, fields);
      zonal.compute(fields, z);
      late.add(model.time, z);
      early.add(model.time, z);
      if (model.time >= T_SPIN) hov.add(model.time, z.ubar);
      if (!earlyDone && model.time >= 10) {
        early.mean(earlyMean); // t ∈ [2, 10]: the flow before jets form, for comparison
        earlyDone = true;
      }
    }
    const m = mean();
    const window = late.mean(m);
    expect(window.tStart).toBeGreaterThanOrEqual(T_SPIN);
    expect(window.count).toBeGreaterThan(100);

    // Jets in the time-mean ū.
    const finder = new JetFinder(ny, Ly);
    const jets = finder.find(m.ubar);
    expect(jets.count).toBeGreaterThanOrEqual(2);

    // −∂y(u′v′) > 0 at eastward-jet cores, keeping the jets up against drag [practice] a standard result
    // of jet dynamics (CHECKS). Measured as its mean over each core (between the half-level edges):
    // pointwise values of a 60-time-unit mean still carry grid-scale noise larger than the signal.
    const core = jets.jets.map((j) => finder.coreConvergence(j, m.upvp));
    for (const c of core) expect(c).toBeGreaterThan(0);

    // Time-mean zonal momentum budget with drag on vorticity (hence on ū): ∂t ū = −∂y(u′v′) − μū + small
    // hyperviscous and direct-forcing terms [derived] from the model equation. Over a window of
    // ≈ 1.8/μ the tendency is not zero, so the least-squares slope of −∂y(u′v′) on ū is μ within a factor 2.
    let cu = 0;
    let uu = 0;
    for (let j = 0; j < ny; j++) {
      cu += m.convUpvp[j] * m.ubar[j];
      uu += m.ubar[j] ** 2;
    }
    const slope = cu / uu;
    expect(slope / params.mu).toBeGreaterThan(0.5);
    expect(slope / params.mu).toBeLessThan(2);

    // The staircase: edges at the jets, index clearly above that of the flow before the jets.
    const fitter = new StaircaseFitter(ny, Ly, params.beta);
    const stair = fitter.fit(m.qtot);
    const stairEarly = fitter.fit(earlyMean.qtot);
    expect(stair.edges.length).toBeGreaterThanOrEqual(jets.count);
    expect(stair.index).toBeGreaterThan(0.03);
    expect(stair.index).toBeGreaterThan(stairEarly.index + 0.02);

    // Eddy diffusivity, reported only: in a steady state the PV budget with drag on vorticity gives
    // v′q′ = μū [derived], an up-gradient flux (D < 0) at eastward jets; a 60-unit mean is not steady
    // and its pointwise fluxes carry grid-scale noise, so no sign is asserted here.
    const diff = eddyDiffusivity(m.vpqp, m.dqdy, m.eke);
    const dAtJets = jets.jets.map((j) => (diff.valid[j.index] ? diff.D[j.index] : NaN));

    // The zonal means agree with the model's own dynamics: the kx = 0 column of the dealiased
    // −J(ψ, q) is the PV flux divergence −∂y(v′q′) of the banded profiles, to round-off [derived]
    // (docs/zonalMean.md).
    const tend = new Float64Array(2 * plan.grid.spectralSize);
    new NonlinearTerm(plan.grid, model.linear, model.transform).evaluate(model.qHat, tend);
    zonal.compute(plan.gridFields(model.qHat, fields), z);
    const divFlux = new ProfileFFT(ny, Ly).derivative(z.vpqp, new Float64Array(ny), Ky);
    let worst = 0;
    for (let j = 0; j < ny; j++) {
      let s = 0; // the kx = 0 column on row j: Σ_m Ĵ(0, m) e^{i k_m y_j}
      for (let jy = 0; jy < ny; jy++) {
        const k = plan.grid.ky[jy] * ((j * Ly) / ny);
        const c = 2 * jy * plan.grid.nkx;
        s += tend[c] * Math.cos(k) - tend[c + 1] * Math.sin(k);
      }
      worst = Math.max(worst, Math.abs(s + divFlux[j]));
    }
    expect(worst).toBeLessThan(1e-12 * maxAbs(divFlux));

    // Jets followed through the Hovmöller record after spin-up.
    const tracking = trackJets(hov.snapshot());
    const longest = tracking.tracks.reduce((a, tr) => (tr.t.length > a.t.length ? tr : a));
    expect(longest.t.length).toBeGreaterThan(hov.view().columns / 2);

    console.log(
      [
        `run ${params.nx}×${params.ny}, t = ${model.time.toFixed(1)}, ${model.steps} steps, mean over [${window.tStart.toFixed(1)}, ${window.tEnd.toFixed(1)}] (${window.count} samples)`,
        `jets ${jets.count} at y = ${jets.jets.map((j) => j.y.toFixed(2)).join(', ')}, speeds ${jets.jets.map((j) => j.speed.toFixed(3)).join(', ')}, widths ${jets.jets.map((j) => j.width.toFixed(2)).join(', ')}, spacing ${jets.meanSpacing?.toFixed(2)} ± ${jets.spacingStd?.toFixed(2)}, dominant m ${jets.dominantIndex}`,
        `core −∂y(u′v′) ${core.map((c) => c.toFixed(4)).join(', ')} vs μ·u_peak ${jets.jets.map((j) => (params.mu * j.speed).toFixed(4)).join(', ')}; pointwise at the peaks ${jets.jets.map((j) => m.convUpvp[j.index].toFixed(4)).join(', ')}; slope on ū ${slope.toFixed(4)} (μ = ${params.mu})`,
        `staircase index ${stair.index.toFixed(3)} (t ∈ [2, 10]: ${stairEarly.index.toFixed(3)}), edges ${stair.edges.map((e) => e.toFixed(2)).join(', ')}, jumps/ideal ${stair.jumps.map((h, i) => (h / stair.idealJumps[i]).toFixed(2)).join(', ')}`,
        `D at jets ${dAtJets.map((d) => d.toFixed(4)).join(', ')}, D_fit ${diff.Dfit?.toFixed(4)}, mean D ${diff.Dmean?.toFixed(4)} over ${diff.validCount} points, U′ ${diff.Urms.toFixed(3)}, L_mix ${diff.Lmix?.toFixed(4)}`,
        `tracks ${tracking.tracks.length}, longest ${longest.t.length}/${hov.view().columns} columns drifting ${longest.drift?.toFixed(4)}, mergers ${tracking.mergers.length}, splits ${tracking.splits.length}; budget check ${(worst / maxAbs(divFlux)).toExponential(1)}`,
      ].join('\n'),
    );
  });
});
