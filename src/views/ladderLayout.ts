import type { Rung } from '../runScales';

/** A log-wavenumber axis mapped onto [x0, x1] (SVG units). */
export interface LogAxis {
  kMin: number;
  kMax: number;
  x0: number;
  x1: number;
}

/** An axis spanning all `ks` with some room either side, snapped outwards to half decades. */
export function logAxisFor(ks: readonly number[], x0: number, x1: number): LogAxis {
  const finite = ks.filter((k) => Number.isFinite(k) && k > 0);
  const lo = finite.length ? Math.min(...finite) : 1;
  const hi = finite.length ? Math.max(...finite) : 10;
  const snap = (x: number, dir: 'down' | 'up') =>
    Math.pow(10, (dir === 'down' ? Math.floor : Math.ceil)(2 * Math.log10(x)) / 2);
  let kMin = snap(lo / 1.2, 'down');
  let kMax = snap(hi * 1.2, 'up');
  if (kMax / kMin < 10) {
    kMin /= 2;
    kMax *= 2;
  }
  return { kMin, kMax, x0, x1 };
}

export function xOf(axis: LogAxis, k: number): number {
  return (
    axis.x0 + ((Math.log(k) - Math.log(axis.kMin)) / (Math.log(axis.kMax) - Math.log(axis.kMin))) * (axis.x1 - axis.x0)
  );
}

/** Ticks of the axis: every 1, 2 and 5 × 10ⁿ inside it; `major` marks the powers of ten. */
export function logTicks(axis: LogAxis): { k: number; major: boolean }[] {
  const out: { k: number; major: boolean }[] = [];
  for (let e = Math.floor(Math.log10(axis.kMin)); e <= Math.ceil(Math.log10(axis.kMax)); e++) {
    for (const m of [1, 2, 5]) {
      const k = m * Math.pow(10, e);
      if (k >= axis.kMin * 0.999 && k <= axis.kMax * 1.001) out.push({ k, major: m === 1 });
    }
  }
  return out;
}

/** A rung placed on the axis, with the label level that keeps it clear of its neighbours. */
export interface PlacedRung extends Rung {
  x: number;
  level: number;
}

/** Place rungs and lift a label one level whenever it would overlap the previous one on its level. */
export function placeRungs(axis: LogAxis, rungs: readonly Rung[], minGap = 84, levels = 3): PlacedRung[] {
  const placed = rungs.map((r) => ({ ...r, x: xOf(axis, r.k), level: 0 })).sort((a, b) => a.x - b.x);
  const lastX = new Array<number>(levels).fill(-Infinity);
  for (const r of placed) {
    let level = lastX.findIndex((x) => r.x - x >= minGap);
    if (level < 0) level = lastX.indexOf(Math.min(...lastX));
    r.level = level;
    lastX[level] = r.x;
  }
  return placed;
}
