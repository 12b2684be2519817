import { keptRadius } from '../model/validateParams';
import { PLAN_SIZE_MAX } from './planInput';

/** A grid of nx × ny points (powers of two) on a domain Lx × Ly. */
export interface GridSize {
  nx: number;
  ny: number;
}

/**
 * The smallest grid that keeps the plan's spacing ratio (both sizes doubled together) and whose
 * 2/3-rule kept radius reaches `kNeeded` (1/length, the domain's units). Null when that needs more
 * than PLAN_SIZE_MAX points in either direction.
 */
export function gridReaching(nx: number, ny: number, Lx: number, Ly: number, kNeeded: number): GridSize | null {
  let mx = nx;
  let my = ny;
  while (keptRadius({ nx: mx, ny: my, Lx, Ly }) < kNeeded) {
    mx *= 2;
    my *= 2;
    if (mx > PLAN_SIZE_MAX || my > PLAN_SIZE_MAX) return null;
  }
  return { nx: mx, ny: my };
}

/** "raise nx, ny to 1024 × 512" or the reason it cannot be done. */
export function growthText(g: GridSize | null): string {
  return g ? `raise nx × ny to ${g.nx} × ${g.ny}` : `a grid beyond ${PLAN_SIZE_MAX} points would be needed`;
}
