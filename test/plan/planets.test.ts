import { describe, expect, it } from 'vitest';
import {
  JUPITER_SYSTEM_III_DEG_PER_DAY,
  omegaFromRotationRate,
  PLANETS,
  SECONDS_PER_DAY,
} from '../../lib/plan/planets';
import { expectQuoted } from './quoted';

describe('planets', () => {
  // Earth: Ω = 7.292115e-5 rad/s, mean radius R₁ = 6 371 008.7714 m [published] Moritz, Geodetic
  // Reference System 1980, J. Geodesy 74, 128 (2000).
  it('holds the GRS80 Earth constants exactly as published', () => {
    expect(PLANETS.earth.omega).toBe(7.292115e-5);
    expect(PLANETS.earth.radius).toBe(6_371_008.7714);
    expect(PLANETS.earth.sources.omega).toMatch(/Moritz.*J\. Geodesy 74, 128 \(2000\) \[published\]/);
  });

  // Jupiter: equatorial radius 7.1492e7 m [published] IAU 2015 Resolution B3.
  it('holds the IAU Jupiter radius', () => {
    expect(PLANETS.jupiter.radius).toBe(7.1492e7);
    expect(PLANETS.jupiter.sources.radius).toMatch(/IAU 2015 Resolution B3 \[published\]/);
  });

  // Rotation 870.536°/day (System III) [memory; Archinal et al., Celest. Mech. Dyn. Astr. 130:22 (2018)],
  // Ω = 1.7585323e-4 rad/s: the conversion °/day → rad/s is exact arithmetic, so Ω is held to the quoted
  // digits; the rate itself is from memory and the source string says so.
  it('derives Jupiter Ω from the System III rotation rate', () => {
    expect(JUPITER_SYSTEM_III_DEG_PER_DAY).toBe(870.536);
    expectQuoted(PLANETS.jupiter.omega, '1.7585323e-4');
    expect(PLANETS.jupiter.sources.omega).toMatch(/\[memory; Archinal et al\./);
  });

  it('converts a rotation rate with the 86 400 s day: 360°/day is 2π per day', () => {
    expect(SECONDS_PER_DAY).toBe(86_400);
    expect(omegaFromRotationRate(360)).toBe((2 * Math.PI) / 86_400);
    expect(omegaFromRotationRate(0)).toBe(0);
  });

  it('says the planet is a sphere with planetocentric latitude [practice]', () => {
    for (const p of Object.values(PLANETS))
      expect(p.sources.shape).toMatch(/spherical planet, planetocentric latitude \[practice\]/);
  });
});
