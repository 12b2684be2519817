import { balanceVelocity } from '../analysis/scales';
import { heldLarichevVelocity } from './baroclinicScales';
import { keptRadius } from '../model/validateParams';
import { pointsForSpacing } from './gridPoints';
import type { UnitSystem, ValidPlanInput } from './planInput';
import { PLANETS } from './planets';
import { tangentPlane } from './tangentPlane';
import { fmt } from './format';

/**
 * A validated plan with every derived input worked out, in one consistent unit system: SI (m, s) for
 * a physical plan, the plan's own model units otherwise. Wavenumbers are in rad per length unit
 * (k = 2π/λ); rates in 1/time. Nothing here is a prediction of the flow except U, which the drive
 * fixes (target U, or the drag balance U = (ε/μ)^½).
 */
export interface ResolvedPlan {
  input: ValidPlanInput;
  units: UnitSystem;
  /** β (1/(L·T)) and f (1/T; null when neither a planet nor f was given). */
  beta: number;
  f: number | null;
  /** Deformation radius L_d (L; Infinity for none) and wavenumber k_d = 1/L_d (0 for none). */
  Ld: number;
  kd: number;
  /** Energy injection rate ε (L²/T³), linear drag μ = 1/dragTime (1/T), rms velocity U (L/T). */
  eps: number;
  mu: number;
  U: number;
  /** Forcing annulus centre k_f = 2π/λ_f and half-width δk (1/L). */
  kf: number;
  dkf: number;
  Lx: number;
  Ly: number;
  nx: number;
  ny: number;
  dx: number;
  dy: number;
  /** Radius of the largest disc of kept wavenumbers under the 2/3 rule (1/L). */
  kMax: number;
  /** Hyperviscosity order p, grid-scale damping time τ (T) and ν = 1/(τ k_max^{2p}) (L^{2p}/T). */
  order: number;
  gridDampingTime: number;
  nu: number;
  runLength: number;
  cfl: number;
  /** How each derived input was obtained, in words, for the report. */
  derivations: string[];
}

/**
 * The inputs the planner works from, derived from an input that has passed the field checks of
 * validatePlanInput (which calls this itself to make sure the predictions come out finite).
 */
export function derivePlan(p: ValidPlanInput): ResolvedPlan {
  const derivations: string[] = [];
  let beta: number;
  let f: number | null;
  if (p.rotation.kind === 'planet') {
    const planet = PLANETS[p.rotation.planet];
    const plane = tangentPlane(planet, p.rotation.latitudeDeg);
    beta = plane.beta;
    f = plane.f;
    derivations.push(
      `f = 2Ω sin φ and β = 2Ω cos φ/R for ${planet.name} (Ω = ${fmt(planet.omega, 8)} rad/s, R = ${fmt(planet.radius, 11)} m) at φ = ${p.rotation.latitudeDeg}° (sphere, planetocentric latitude)`,
    );
  } else {
    beta = p.rotation.beta;
    f = p.rotation.f ?? null;
  }
  let Ld = Infinity;
  if (p.deformation.kind === 'radius') Ld = p.deformation.Ld;
  if (p.deformation.kind === 'layer') {
    // validatePlanInput has made sure f is known and non-zero here.
    Ld = Math.sqrt(p.deformation.gPrime * p.deformation.H) / Math.abs(f as number);
    derivations.push('L_d = √(g′H)/|f| from the layer depth and reduced gravity');
  }
  const mu = 1 / p.dragTime;
  let eps: number;
  let U: number;
  if (p.drive.kind === 'baroclinic') {
    // No stirring: the eddies' speed is Held & Larichev's V ≈ ξU (baroclinicPlan.ts), and ε the drag
    // balance at it, so the one-layer predictions below read as estimates for the eddies.
    U = heldLarichevVelocity(p.drive.shear, p.drive.depthRatio ?? 1, beta, Ld);
    eps = mu * U * U;
    derivations.push(
      'baroclinic drive: U = V ≈ ξ·(U₁ − U₂)/2, the eddy speed of Held & Larichev (1996), and ε = μU² the drag balance at it; the forcing fields are not used (no stirring)',
    );
  } else if (p.drive.kind === 'velocity') {
    U = p.drive.U;
    eps = mu * U * U;
    derivations.push('ε = μU² from the energy balance dE/dt = ε − 2μE at the target rms velocity U');
  } else {
    eps = p.drive.eps;
    U = balanceVelocity(eps, mu);
  }
  const { Lx, Ly } = p.domain;
  let nx: number;
  let ny: number;
  if (p.grid.kind === 'points') {
    nx = p.grid.nx;
    ny = p.grid.ny;
  } else {
    nx = pointsForSpacing(Lx, p.grid.dx);
    ny = pointsForSpacing(Ly, p.grid.dy);
    derivations.push(`nx, ny: the smallest powers of two with spacing at most dx = ${p.grid.dx}, dy = ${p.grid.dy}`);
  }
  const kMax = keptRadius({ nx, ny, Lx, Ly });
  const kf = (2 * Math.PI) / p.forcing.wavelength;
  const nu = 1 / (p.hyperviscosity.gridDampingTime * Math.pow(kMax, 2 * p.hyperviscosity.order));
  derivations.push('k_f = 2π/λ_f; ν = 1/(τ k_max^{2p}) with k_max the largest kept wavenumber under the 2/3 rule');
  return {
    input: p,
    units: p.units,
    beta,
    f,
    Ld,
    kd: Number.isFinite(Ld) ? 1 / Ld : 0,
    eps,
    mu,
    U,
    kf,
    dkf: p.forcing.halfWidth * kf,
    Lx,
    Ly,
    nx,
    ny,
    dx: Lx / nx,
    dy: Ly / ny,
    kMax,
    order: p.hyperviscosity.order,
    gridDampingTime: p.hyperviscosity.gridDampingTime,
    nu,
    runLength: p.runLength,
    cfl: p.cfl,
    derivations,
  };
}
