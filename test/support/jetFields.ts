/**
 * Test fields with known jets, from the ideal PV staircase of Dritschel & McIntyre, J. Atmos. Sci. 65,
 * 855 (2008) [published]: steps of width L, inside a step (η the distance from its centre, |η| < L/2)
 *   ū = (β/2)(η² − L²/12),   ζ̄ = −∂yū = −βη,   q̄ + βy = β·(step centre) (PV mixed on the step),
 * periodic in L, eastward jets (cusps) at the step edges. `edge0` places the first edge.
 */
export function staircaseProfile(
  y: number,
  L: number,
  beta: number,
  edge0: number,
): { u: number; zeta: number; centre: number } {
  const k = Math.floor((y - edge0) / L + 1e-12);
  const centre = edge0 + (k + 0.5) * L;
  const eta = y - centre;
  return { u: (beta / 2) * (eta * eta - (L * L) / 12), zeta: -beta * eta, centre };
}

/**
 * An eddy streamfunction that averages to zero along every row of a periodic x grid:
 * ψ′ = a·sin(2π m x/Lx + φ)·sin(2π l y/Ly), with u′ = −ψ′_y, v′ = ψ′_x, ζ′ = −(kx² + ky²)ψ′.
 */
export function eddy(x: number, y: number, a: number, m: number, l: number, Lx: number, Ly: number, phase: number) {
  const kx = (2 * Math.PI * m) / Lx;
  const ky = (2 * Math.PI * l) / Ly;
  const sx = Math.sin(kx * x + phase);
  const cx = Math.cos(kx * x + phase);
  const sy = Math.sin(ky * y);
  const cy = Math.cos(ky * y);
  return { psi: a * sx * sy, u: -a * sx * ky * cy, v: a * kx * cx * sy, zeta: -(kx * kx + ky * ky) * a * sx * sy };
}
