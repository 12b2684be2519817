import { SnapshotPlan, type GridFields } from '../../lib/analysis/snapshot';
import { validateParams } from '../../lib/model/validateParams';
import { QUIET } from './modelFixtures';
import { seededSigned } from './random';

export interface RandomFieldSpec {
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
  kd: number;
  /** Largest |kx index| and |ky index| carried (both at most the 2/3-rule limits of the grid). */
  maxIx: number;
  maxM: number;
  seed: number;
}

/**
 * Gridded fields (u, v, q, ζ, ψ, all consistent: q = ∇²ψ − k_d²ψ) of a seeded random PV anomaly with
 * a flat spectrum on the modes |ix| ≤ maxIx, |m| ≤ maxM, the mean excluded; periodic by construction.
 */
export function randomGridFields(s: RandomFieldSpec): GridFields {
  const params = validateParams({ ...QUIET, nx: s.nx, ny: s.ny, Lx: s.Lx, Ly: s.Ly, kd: s.kd });
  const plan = new SnapshotPlan(params);
  const g = plan.grid;
  if (s.maxIx > g.Kx || s.maxM > g.Ky) throw new RangeError('randomGridFields: band beyond the kept modes');
  const next = seededSigned(s.seed);
  const qHat = new Float64Array(2 * g.spectralSize);
  for (let jy = 0; jy < g.ny; jy++) {
    const m = g.rowIndex(jy);
    for (let ix = 0; ix <= s.maxIx; ix++) {
      if (Math.abs(m) > s.maxM || (ix === 0 && m === 0)) continue;
      const k = jy * g.nkx + ix;
      qHat[2 * k] = next();
      qHat[2 * k + 1] = next();
    }
  }
  // The kx = 0 column of a real field is Hermitian in ky.
  for (let jy = 1; jy < g.ny / 2; jy++) {
    const a = 2 * jy * g.nkx;
    const b = 2 * (g.ny - jy) * g.nkx;
    qHat[b] = qHat[a];
    qHat[b + 1] = -qHat[a + 1];
  }
  return plan.gridFields(qHat);
}
