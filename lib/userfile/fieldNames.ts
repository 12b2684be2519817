import type { DatasetVariable } from '../io/datasetReader';
import {
  accelerationUnits,
  rateUnits,
  streamfunctionUnits,
  velocitySquaredUnits,
  velocityUnits,
  type UnitReading,
} from './unitsText';
import { printable } from '../io/fileErrors';

/**
 * How Stria recognises the fields of a user's file. By CF standard_name first — these names are
 * recalled from the CF standard name table [memory], not checked against it at run time — then by
 * the names models commonly give (case-insensitive) [practice]. A name match is taken only when the
 * variable's units fit the role (or are absent/"1", model units) and it carries no standard_name
 * saying it is something else: `q` is specific humidity in many atmospheric files, `zeta` the free
 * surface in some ocean models.
 */
export type FieldRole = 'u' | 'v' | 'zeta' | 'psi' | 'q' | 'ubar' | 'upvp' | 'vpqp' | 'eke';
export const FIELD_ROLES: readonly FieldRole[] = ['u', 'v', 'zeta', 'psi', 'q', 'ubar', 'upvp', 'vpqp', 'eke'];
/** The roles of 2D fields (…, y, x); the others are zonal-mean profiles (…, y), read beside ū. */
export const GRID_ROLES: readonly FieldRole[] = ['u', 'v', 'zeta', 'psi', 'q'];
export const PROFILE_ROLES: readonly FieldRole[] = ['ubar', 'upvp', 'vpqp', 'eke'];

export const ROLE_LABELS: Readonly<Record<FieldRole, string>> = {
  u: 'eastward velocity u',
  v: 'northward velocity v',
  zeta: 'relative vorticity ζ',
  psi: 'streamfunction ψ',
  q: 'potential vorticity anomaly q (QG, without βy unless stated)',
  ubar: 'zonal-mean zonal velocity ū',
  upvp: 'eddy momentum flux u′v′ (zonal mean)',
  vpqp: 'eddy PV flux v′q′ (zonal mean)',
  eke: 'eddy kinetic energy ½(u′² + v′²) (zonal mean)',
};

export const STANDARD_NAMES: Readonly<Record<FieldRole, readonly string[]>> = {
  u: ['eastward_wind', 'eastward_sea_water_velocity', 'x_wind', 'sea_water_x_velocity'],
  v: ['northward_wind', 'northward_sea_water_velocity', 'y_wind', 'sea_water_y_velocity'],
  zeta: ['atmosphere_relative_vorticity'],
  psi: ['atmosphere_horizontal_streamfunction'],
  q: [],
  ubar: [],
  upvp: [],
  vpqp: [],
  eke: [],
};

export const COMMON_NAMES: Readonly<Record<FieldRole, readonly string[]>> = {
  u: ['u', 'ua', 'uwnd', 'uvel', 'uo', 'ucomp', 'u_velocity'],
  v: ['v', 'va', 'vwnd', 'vvel', 'vo', 'vcomp', 'v_velocity'],
  zeta: ['zeta', 'vort', 'vorticity', 'vor', 'relvort', 'rvort'],
  psi: ['psi', 'streamfunction', 'stream_function', 'strf', 'sf'],
  q: ['q', 'pv', 'qgpv', 'qpv'],
  ubar: ['ubar', 'u_bar', 'umean', 'u_mean', 'uzm', 'u_zm', 'zonal_mean_u'],
  // Stria's own zonal-mean files (docs/file-formats.md) and the obvious spellings.
  upvp: ['upvp', 'uv_eddy', 'eddy_momentum_flux'],
  vpqp: ['vpqp', 'vq_eddy', 'eddy_pv_flux'],
  eke: ['eke', 'eddy_kinetic_energy'],
};

/** The units family of a role: what its values must be measured in. */
export function roleUnits(role: FieldRole, units: string | undefined): UnitReading {
  if (role === 'zeta' || role === 'q') return rateUnits(units);
  if (role === 'psi') return streamfunctionUnits(units);
  if (role === 'upvp' || role === 'eke') return velocitySquaredUnits(units);
  if (role === 'vpqp') return accelerationUnits(units);
  return velocityUnits(units);
}

export type MatchHow = 'mapping' | 'standard_name' | 'name';

/** How `v` matches `role`, or null; `why` collects the reasons a name match was turned down. */
export function matchRole(
  v: DatasetVariable,
  role: FieldRole,
  why: string[],
): { how: MatchHow; detail: string } | null {
  const sn = typeof v.attributes.standard_name === 'string' ? v.attributes.standard_name : undefined;
  if (sn && STANDARD_NAMES[role].includes(sn)) return { how: 'standard_name', detail: `standard_name "${sn}"` };
  if (!COMMON_NAMES[role].includes(v.name.toLowerCase())) return null;
  if (sn) {
    why.push(`"${v.name}" was not taken as ${ROLE_LABELS[role]}: its standard_name is "${sn}"`);
    return null;
  }
  const units = typeof v.attributes.units === 'string' ? v.attributes.units : undefined;
  if (roleUnits(role, units).kind === 'unknown') {
    why.push(
      `"${v.name}" was not taken as ${ROLE_LABELS[role]}: its units "${printable(units ?? '')}" are not those of ${ROLE_LABELS[role]}`,
    );
    return null;
  }
  return { how: 'name', detail: `its name "${v.name}"` };
}
