/**
 * A user's own gridded output as the analysis sees it, whatever file it came from: a regular grid,
 * and records of fields on it with missing values already masked as NaN. lib/userfile/fieldSource.ts
 * builds this from a NetCDF file; tests build it directly.
 *
 * Conventions: row-major, y slow — point (i, j) at index j·nx + i, x_i = x0 + i·dx eastward,
 * y_j = y0 + j·dy northward (both ascending). Lengths in metres (SI files and the tangent plane), in
 * the file's own units ('model'), or in degrees for an unmapped longitude/latitude grid; velocities,
 * vorticity and streamfunction in the matching units (m/s, 1/s, m²/s for SI).
 */
export type UserRole = 'u' | 'v' | 'zeta' | 'psi' | 'q' | 'ubar' | 'upvp' | 'vpqp' | 'eke';

export interface UserGrid {
  /** Points in x (1 for zonal-mean profiles) and y. */
  nx: number;
  ny: number;
  x0: number;
  y0: number;
  dx: number;
  dy: number;
  lengthUnit: 'm' | 'model' | 'degrees';
  /** Periodicity from the coordinates or the user; null: undecided, the data decide (periodicity.ts). */
  periodicX: boolean | null;
  periodicY: boolean | null;
  /** How periodicity and geometry were established, in words. */
  notes: string[];
}

export interface UserRecordInfo {
  /** The record's time in the file's time units, null when the file has no time coordinate. */
  time: number | null;
}

export interface UserRecordSource {
  readonly grid: UserGrid;
  /** The fields the source provides. */
  readonly roles: readonly UserRole[];
  readonly recordCount: number;
  /** Units of `time`, as the file gives them. */
  readonly timeUnits: string | null;
  /**
   * Reads record r into `into[role]` for each provided role (length nx·ny; ny for ubar), missing
   * values as NaN. `onProgress(done, total)` in bytes of the record. Profiles (ubar, upvp, vpqp, eke)
   * have ny values.
   */
  read(
    r: number,
    into: Partial<Record<UserRole, Float64Array>>,
    onProgress?: (done: number, total: number) => void,
  ): UserRecordInfo;
}
