/**
 * Linear Rossby waves of the one-layer QG beta-plane (Pedlosky 1987; Vallis 2017), K² = kx² + ky² + kd²:
 *   ω = −β kx / K²,
 *   c_gx = ∂ω/∂kx = β (kx² − ky² − kd²) / K⁴,   c_gy = ∂ω/∂ky = 2β kx ky / K⁴.
 * Units follow the inputs (β in 1/(length·time), k in 1/length → ω in 1/time, c in length/time).
 */
export function rossbyFrequency(beta: number, kx: number, ky: number, kd: number): number {
  return (-beta * kx) / (kx * kx + ky * ky + kd * kd);
}

/** Zonal phase speed ω/kx = −β/K². */
export function rossbyPhaseSpeed(beta: number, kx: number, ky: number, kd: number): number {
  return -beta / (kx * kx + ky * ky + kd * kd);
}

/** Group velocity [c_gx, c_gy]. */
export function rossbyGroupVelocity(beta: number, kx: number, ky: number, kd: number): [number, number] {
  const K2 = kx * kx + ky * ky + kd * kd;
  const K4 = K2 * K2;
  return [(beta * (kx * kx - ky * ky - kd * kd)) / K4, (2 * beta * kx * ky) / K4];
}
