/**
 * The total zonal-mean PV from the zonal-mean flow alone, for files without vorticity or PV:
 * q̄ + β(y − y0) = −∂y ū − k_d²ψ̄ + β(y − y0), with ψ̄ = −∫ū dy. The derivative is taken between
 * neighbouring rows and placed at their midpoint, y_{j+½}: (ū_{j+1} − ū_j)/dy is exactly ∂yū there
 * for a ū that is quadratic between the rows, so the parabolic arcs of an ideal PV staircase give
 * exact steps at every midpoint whose interval holds no jet cusp (a centred difference at the rows
 * would put a point halfway up the step at every cusp). ψ̄ by the trapezoidal rule (any constant).
 * On a periodic axis n midpoints (the last between row n−1 and row 0), on a bounded one n − 1.
 */
export function qtotFromUbar(
  u: ArrayLike<number>,
  dy: number,
  periodic: boolean,
  beta: number,
  kd: number,
): { y: number[]; values: number[]; source: string } {
  const n = u.length;
  const m = periodic ? n : n - 1;
  const y: number[] = [];
  const values: number[] = [];
  let psi = 0;
  const k2 = kd * kd;
  for (let j = 0; j < m; j++) {
    const a = u[j];
    const b = u[(j + 1) % n];
    const psiNext = psi - (dy * (a + b)) / 2;
    const mid = (j + 0.5) * dy;
    y.push(mid);
    values.push(-(b - a) / dy - k2 * 0.5 * (psi + psiNext) + beta * mid);
    psi = psiNext;
  }
  return { y, values, source: `from ū: −∂yū${kd ? ' − k_d²ψ̄' : ''} + β(y − y0), at the midpoints between rows` };
}
