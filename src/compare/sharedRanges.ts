import type { ZonalPayload } from '../../workers/diagnosticsApi';
import { logRange } from '../components/logScales';

/**
 * The axis ranges the two panes of a comparison share, so that a side-by-side reading is honest: the
 * same ū range on both profiles, the same k and E ranges on both spectra. Extents over everything
 * each pane draws; a plain object the charts' range functions read when they redraw.
 */
export interface SharedRanges {
  /** ū across the profile charts (latest and time mean), padded by 5 %. */
  ubar: [number, number] | null;
  /** Wavenumbers and spectral densities E/dk (positive values) of the spectra, as log ranges. */
  k: [number, number] | null;
  E: [number, number] | null;
}

export const emptyRanges = (): SharedRanges => ({ ubar: null, k: null, E: null });

function extent(arrays: ArrayLike<number | null | undefined>[], positive: boolean): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const a of arrays)
    for (let i = 0; i < a.length; i++) {
      const v = a[i];
      if (v == null || !Number.isFinite(v) || (positive && !(v > 0))) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  return lo <= hi ? [lo, hi] : null;
}

/**
 * The ranges both panes show: the union of their extents. `spectra` are the spectra charts' columns
 * (spectraFigure: k first, then every line drawn, references and fit included).
 */
export function sharedRanges(
  zonal: readonly (ZonalPayload | null)[],
  spectra: readonly (readonly ArrayLike<number | null | undefined>[] | null)[],
): SharedRanges {
  const z = zonal.filter((p): p is ZonalPayload => p !== null);
  const s = spectra.filter((c): c is readonly ArrayLike<number | null | undefined>[] => c !== null);
  const u = extent(
    z.flatMap((p) => [p.ubar, p.meanUbar]),
    false,
  );
  const pad = u ? 0.05 * Math.max(u[1] - u[0], 1e-12) : 0;
  const E = extent(
    s.flatMap((c) => c.slice(1)),
    true,
  );
  const k = extent(
    s.map((c) => c[0]),
    true,
  );
  return {
    ubar: u ? [u[0] - pad, u[1] + pad] : null,
    k: k ? logRange(k[0], k[1]) : null,
    E: E ? logRange(E[0], E[1]) : null,
  };
}
