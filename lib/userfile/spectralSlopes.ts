import { fitPowerLaw } from '../analysis/powerLawFit';
import type { SpectraMean } from './spectraAccumulator';

/** One fitted slope of the energy spectrum E(k) ∝ k^slope over a band, or why none was fitted. */
export interface SpectralSlope {
  range: 'inverse cascade' | 'enstrophy cascade';
  /** The slope the range has in theory: −5/3 (Kraichnan 1967) and −3 (Kraichnan 1967; Batchelor 1969). */
  expected: number;
  kLo: number;
  kHi: number;
  slope: number | null;
  slopeStdErr: number | null;
  points: number;
  /** Why no slope, or null. */
  reason: string | null;
}

/**
 * The slopes of the time-mean energy spectrum in the two ranges of forced 2D turbulence, each in a
 * band where its law can apply: the inverse-cascade range between the arrest scale and the forcing,
 * [max(k_R, 2 k_1), k_f/1.5], and the enstrophy-cascade range above the forcing and below the
 * dissipation range, [1.5 k_f, k_max/2] (the factor 1.5 keeps the forcing annulus out, k_max/2 keeps the
 * hyperviscous range out [practice]). k_f is the forcing wavenumber the file records (stria_kf) or,
 * failing that, where the energy flux Π_E is most negative (the inverse cascade leaves the forcing
 * there). k_1 is the first shell; k_R the measured Rhines wavenumber when known.
 * Wavenumbers in the file's units (1/length).
 */
export function spectralSlopes(s: SpectraMean, kForcing: number | null, kRhines: number | null): SpectralSlope[] {
  const k = s.k;
  const kf = kForcing ?? fluxForcing(s);
  const kMax = k[k.length - 1];
  const bands: [SpectralSlope['range'], number, number, number][] = kf
    ? [
        ['inverse cascade', -5 / 3, Math.max(kRhines ?? 0, 2 * k[0]), kf / 1.5],
        ['enstrophy cascade', -3, 1.5 * kf, kMax / 2],
      ]
    : [];
  if (!kf)
    return (['inverse cascade', 'enstrophy cascade'] as const).map((range) => ({
      range,
      expected: range === 'inverse cascade' ? -5 / 3 : -3,
      kLo: NaN,
      kHi: NaN,
      slope: null,
      slopeStdErr: null,
      points: 0,
      reason: 'no forcing wavenumber: the file records no stria_kf and the energy flux never turns negative',
    }));
  return bands.map(([range, expected, kLo, kHi]) => {
    if (!(kLo < kHi))
      return {
        range,
        expected,
        kLo,
        kHi,
        slope: null,
        slopeStdErr: null,
        points: 0,
        reason:
          range === 'inverse cascade'
            ? 'no room between the arrest scale and the forcing (k_f/1.5 ≤ max(k_R, 2 k_1))'
            : 'no room between the forcing and the dissipation range on this grid (1.5 k_f ≥ k_max/2)',
      };
    try {
      const f = fitPowerLaw(k, s.E, kLo, kHi);
      return { range, expected, kLo, kHi, slope: f.slope, slopeStdErr: f.slopeStdErr, points: f.n, reason: null };
    } catch (e) {
      const why = e instanceof RangeError ? e.message.replace(/^fitPowerLaw: /, '') : String(e);
      return { range, expected, kLo, kHi, slope: null, slopeStdErr: null, points: 0, reason: why };
    }
  });
}

/** The shell edge where Π_E is most negative, or null when it never is (or there is no flux). */
function fluxForcing(s: SpectraMean): number | null {
  if (!s.PiE) return null;
  let best = -1;
  for (let i = 0; i < s.PiE.length; i++) if (s.PiE[i] < 0 && (best < 0 || s.PiE[i] < s.PiE[best])) best = i;
  return best < 0 ? null : s.kEdge[best];
}
