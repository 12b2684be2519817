import { describe, expect, it } from 'vitest';
import { PLANETS } from '../../lib/plan/planets';
import { betaParameter, coriolisParameter, tangentPlane } from '../../lib/plan/tangentPlane';
import { expectQuoted } from './quoted';

describe('tangent plane', () => {
  // β(45°) = 2Ω cos 45°/R₁ = 1.6186774e-11 m⁻¹s⁻¹ and f(45°) = 1.0312608e-4 s⁻¹ [derived] from the
  // GRS80 constants of Moritz, J. Geodesy 74, 128 (2000) [published].
  it('gives the published-constant values of f and β at 45° on Earth', () => {
    const p = tangentPlane(PLANETS.earth, 45);
    expectQuoted(p.beta, '1.6186774e-11');
    expectQuoted(p.f, '1.0312608e-4');
  });

  it('has f odd and β even in latitude, f = 0 at the equator and β = 2Ω/R there', () => {
    const { omega, radius } = PLANETS.jupiter;
    for (const phi of [5, 30, 60, 89]) {
      expect(coriolisParameter(omega, -phi)).toBe(-coriolisParameter(omega, phi));
      expect(betaParameter(omega, radius, -phi)).toBe(betaParameter(omega, radius, phi));
    }
    expect(coriolisParameter(omega, 0)).toBe(0);
    expect(betaParameter(omega, radius, 0)).toBe((2 * omega) / radius);
  });

  it('satisfies (f/2Ω)² + (βR/2Ω)² = 1 to round-off', () => {
    const { omega, radius } = PLANETS.earth;
    for (const phi of [-80, -33.3, 1, 12.5, 45, 71]) {
      const p = tangentPlane(PLANETS.earth, phi);
      const s = (p.f / (2 * omega)) ** 2 + ((p.beta * radius) / (2 * omega)) ** 2;
      expect(Math.abs(s - 1)).toBeLessThan(4 * Number.EPSILON);
    }
  });
});
