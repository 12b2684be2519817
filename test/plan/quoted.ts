import { expect } from 'vitest';

/**
 * Expect `actual` to round to the quoted decimal `quoted` (e.g. "1.6186774e-11"): the tolerance is
 * half a unit in the quoted value's last digit, the precision the source gives and no more.
 */
export function expectQuoted(actual: number, quoted: string, units = 1): void {
  const m = /^([+-]?)(\d+)(?:\.(\d+))?(?:e([+-]?\d+))?$/i.exec(quoted);
  if (!m) throw new Error(`not a decimal: ${quoted}`);
  const decimals = (m[3] ?? '').length;
  const exponent = m[4] ? Number(m[4]) : 0;
  const halfUlp = 0.5 * units * Math.pow(10, exponent - decimals);
  expect(Math.abs(actual - Number(quoted)), `${actual} vs quoted ${quoted} (± ${halfUlp})`).toBeLessThanOrEqual(
    halfUlp,
  );
}

/** A plan input of the test's own (not a source's), good on every check; override parts as needed. */
export function goodModelPlan(over: Record<string, unknown> = {}): Record<string, unknown> {
  // Model units. U = (ε/μ)^½ = 1; β = 50 → k_R = (β/2U)^½ = 5, R_β = √2 (β²ε/μ⁵)^{1/20} ≈ 4.6;
  // 2π/k_R ≈ 1.26 in a 2π domain: 5 jets. k_f = 40 (k_f/k_R = 8), k_max = 170 at 512² (k_max/k_f ≈ 4.3);
  // τ = 0.1 < η^{-1/3} ≈ 0.31, so the dissipation range lies inside the grid.
  return {
    units: 'model',
    title: 'good model-unit plan',
    rotation: { kind: 'beta', beta: 50 },
    deformation: { kind: 'none' },
    drive: { kind: 'injection', eps: 0.02 },
    dragTime: 50,
    forcing: { wavelength: (2 * Math.PI) / 40, halfWidth: 0.05 },
    domain: { Lx: 2 * Math.PI, Ly: 2 * Math.PI },
    grid: { kind: 'points', nx: 512, ny: 512 },
    hyperviscosity: { order: 4, gridDampingTime: 0.1 },
    runLength: 500,
    ...over,
  };
}
