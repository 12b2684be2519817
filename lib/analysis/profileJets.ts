import { JetFinder, type Jet } from './jets';
import { EDGE_MARGIN, extendProfile } from './profileExtension';

/**
 * Eastward jets of a time-mean ū(y) of any length, on a periodic or a bounded domain, by the jet
 * criterion of jets.ts (JetFinder): directly for a periodic profile of 2^k points (Stria's own
 * grids: the same numbers as the run's own diagnostics), else on the extension of
 * profileExtension.ts. Positions y in the profile's length units from its origin y0.
 */
export interface ProfileJets {
  count: number;
  jets: Pick<Jet, 'y' | 'speed' | 'width' | 'shearJump' | 'minSouth' | 'minNorth' | 'prominence'>[];
  /** Distances between neighbouring jets (periodic: the last wraps round; bounded: no wrap). */
  spacings: number[];
  meanSpacing: number | null;
  spacingStd: number | null;
  /** 'direct' or 'extended' (reflected and/or resampled); see profileExtension.ts. */
  method: 'direct' | 'extended';
}

export function profileJets(ubar: ArrayLike<number>, y0: number, dy: number, periodic: boolean): ProfileJets {
  const n = ubar.length;
  const ext = extendProfile(ubar, dy, periodic, 'even');
  const M = ext.values.length;
  const finder = new JetFinder(M, ext.period, { minSeparation: 3 * dy });
  const report = finder.find(ext.values);
  const Y = (n - 1) * dy;
  const kept = report.jets.filter((j) => periodic || (j.y >= EDGE_MARGIN * dy && j.y <= Y - EDGE_MARGIN * dy));
  const jets = kept.map((j) => ({
    y: y0 + j.y,
    speed: j.speed,
    width: j.width,
    shearJump: j.shearJump,
    minSouth: j.minSouth,
    minNorth: j.minNorth,
    prominence: j.prominence,
  }));
  let spacings: number[];
  if (periodic) spacings = report.spacings.slice();
  else spacings = jets.slice(1).map((j, i) => j.y - jets[i].y);
  const meanSpacing = spacings.length ? spacings.reduce((a, b) => a + b, 0) / spacings.length : null;
  const spacingStd =
    meanSpacing === null ? null : Math.sqrt(spacings.reduce((a, s) => a + (s - meanSpacing) ** 2, 0) / spacings.length);
  return { count: jets.length, jets, spacings, meanSpacing, spacingStd, method: ext.direct ? 'direct' : 'extended' };
}
