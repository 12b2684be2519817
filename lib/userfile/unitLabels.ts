import type { Quantity } from '../plan/predictions';
import type { UserGrid } from './userData';
import type { UnitReading } from './unitsText';

/**
 * The unit of each kind of quantity in a user's file, as the analysis holds its numbers: lengths in
 * metres (SI axes and the tangent plane), in degrees (an unmapped longitude/latitude grid) or in the
 * file's own units; velocities in m/s when the file's velocity has SI units (they were converted),
 * as the file writes them when Stria does not know its units (taken as they are), else in the file's
 * own units; times in seconds with SI velocities or lengths. A wind in m/s on a longitude/latitude
 * grid is labelled m/s and its jet spacings degrees, never model units.
 */
export type UnitLabels = Readonly<Record<Quantity, string>>;

export function fileUnitLabels(lengthUnit: UserGrid['lengthUnit'], velocity: UnitReading | null): UnitLabels {
  const length = lengthUnit === 'm' ? 'm' : lengthUnit === 'degrees' ? '°' : 'model length';
  const si = velocity?.kind === 'si' || (lengthUnit === 'm' && velocity?.kind !== 'unknown');
  const time = si ? 's' : 'model time';
  const speed =
    velocity?.kind === 'unknown' ? velocity.text : si ? 'm/s' : lengthUnit === 'model' ? 'model length/time' : '';
  return {
    velocity: speed || 'model length/time',
    length,
    wavenumber: `rad/${length}`,
    time,
    rate: `1/${time}`,
    enstrophyRate: `1/${time}³`,
    count: '',
    ratio: '',
  };
}
