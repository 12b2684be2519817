import { REFERENCES } from './references';

/**
 * Planetary constants for the planner, from the project's check list only. SI units: Ω in rad/s,
 * R in m. The planet is a sphere of radius R and latitudes are planetocentric [practice]; the app
 * says so wherever a latitude is entered.
 */
export interface Planet {
  id: PlanetId;
  name: string;
  /** Rotation rate Ω (rad/s). */
  omega: number;
  /** Radius of the sphere standing in for the planet (m). */
  radius: number;
  /** Where Ω and R come from, with the check list's marks. */
  sources: { omega: string; radius: string; shape: string };
}

export type PlanetId = 'earth' | 'jupiter';

/** Seconds in the day of the IAU rotation elements (the SI day of 86 400 s). */
export const SECONDS_PER_DAY = 86_400;

/** Ω (rad/s) of a body turning `degreesPerDay` degrees per day of 86 400 s. */
export function omegaFromRotationRate(degreesPerDay: number): number {
  return (degreesPerDay * Math.PI) / 180 / SECONDS_PER_DAY;
}

/** Jupiter's System III rotation rate (degrees per day) [memory; Archinal et al. 2018]. */
export const JUPITER_SYSTEM_III_DEG_PER_DAY = 870.536;

const SPHERE = REFERENCES.tangentPlane;

export const PLANETS: Readonly<Record<PlanetId, Readonly<Planet>>> = Object.freeze({
  earth: Object.freeze({
    id: 'earth',
    name: 'Earth',
    omega: 7.292115e-5,
    radius: 6_371_008.7714,
    sources: {
      omega: 'Moritz, Geodetic Reference System 1980, J. Geodesy 74, 128 (2000) [published]',
      radius: 'mean radius R₁, Moritz, Geodetic Reference System 1980, J. Geodesy 74, 128 (2000) [published]',
      shape: SPHERE,
    },
  }),
  jupiter: Object.freeze({
    id: 'jupiter',
    name: 'Jupiter',
    omega: omegaFromRotationRate(JUPITER_SYSTEM_III_DEG_PER_DAY),
    radius: 7.1492e7,
    sources: {
      omega:
        'System III rotation 870.536°/day [memory; Archinal et al., Celest. Mech. Dyn. Astr. 130:22 (2018)], Ω = 1.7585323e-4 rad/s',
      radius: 'equatorial radius, IAU 2015 Resolution B3 [published]; used as the radius of the sphere',
      shape: SPHERE,
    },
  }),
});
