import type { UserGrid, UserRecordSource, UserRole } from '../../lib/userfile/userData';

/** A UserRecordSource over arrays made by `make(r)` (one per role), for tests without files. */
export function arraySource(
  grid: Partial<UserGrid> & Pick<UserGrid, 'nx' | 'ny' | 'dx' | 'dy'>,
  roles: UserRole[],
  count: number,
  make: (r: number) => Partial<Record<UserRole, ArrayLike<number>>>,
): UserRecordSource & { reads: number } {
  const g: UserGrid = { x0: 0, y0: 0, lengthUnit: 'model', periodicX: true, periodicY: true, notes: [], ...grid };
  const s = {
    grid: g,
    roles,
    recordCount: count,
    timeUnits: 's',
    reads: 0,
    read(r: number, into: Partial<Record<UserRole, Float64Array>>) {
      s.reads++;
      const f = make(r);
      for (const role of roles) (into[role] as Float64Array).set(f[role] as ArrayLike<number>);
      return { time: 10 * r };
    },
  };
  return s;
}
