import type { Planet } from './planets';

/**
 * The beta-plane tangent to a spherical planet at latitude φ (planetocentric, degrees, north
 * positive): f = 2Ω sin φ (s⁻¹, negative in the south) and β = 2Ω cos φ / R (m⁻¹ s⁻¹, the
 * northward gradient of f, positive in both hemispheres).
 */
export interface TangentPlane {
  latitudeDeg: number;
  /** Coriolis parameter f (s⁻¹). */
  f: number;
  /** Planetary vorticity gradient β (m⁻¹ s⁻¹). */
  beta: number;
}

/** Coriolis parameter f = 2Ω sin φ (s⁻¹) for Ω in rad/s and φ in degrees. */
export function coriolisParameter(omega: number, latitudeDeg: number): number {
  return 2 * omega * Math.sin(radians(latitudeDeg));
}

/** β = 2Ω cos φ / R (m⁻¹ s⁻¹) for Ω in rad/s, φ in degrees and R in m. */
export function betaParameter(omega: number, radius: number, latitudeDeg: number): number {
  return (2 * omega * Math.cos(radians(latitudeDeg))) / radius;
}

/** f and β of the plane tangent to `planet` at `latitudeDeg`. */
export function tangentPlane(planet: Pick<Planet, 'omega' | 'radius'>, latitudeDeg: number): TangentPlane {
  return {
    latitudeDeg,
    f: coriolisParameter(planet.omega, latitudeDeg),
    beta: betaParameter(planet.omega, planet.radius, latitudeDeg),
  };
}

function radians(deg: number): number {
  return (deg * Math.PI) / 180;
}
