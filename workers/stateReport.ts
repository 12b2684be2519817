import type { SnapshotPlan } from '../lib/analysis/snapshot';
import { emptyReport, type StepReport } from '../lib/model/budget';
import type { Model } from '../lib/model/model';

/**
 * The readouts of a state no step has been taken from yet (a loaded run, a new one): what the next
 * step's report would say of it at its start. One layer: energy E = ½⟨u² + v²⟩ + ½k_d²⟨ψ²⟩, kinetic
 * energy ½⟨u² + v²⟩ and enstrophy ½⟨q²⟩ (domain means over the grid: the same quantities as the
 * stepper's spectral sums, by Parseval, to round-off), CFL = dt (max|u|/dx + max|v|/dy) with the
 * model's step in use. The rates are left at zero: a state has no step yet. Two layers are not
 * handled here (their energy needs both layers): null, and the caller keeps the step report.
 */
export function stateReport(model: Model, snap: SnapshotPlan): StepReport | null {
  if (model.layers !== 1 || !snap.fits(model.params)) return null;
  const f = snap.gridFields(model.qHat);
  const { nx, ny, Lx, Ly, kd } = model.params;
  const n = nx * ny;
  let ke = 0;
  let pe = 0;
  let z = 0;
  let maxU = 0;
  let maxV = 0;
  for (let i = 0; i < n; i++) {
    const u = f.u[i];
    const v = f.v[i];
    ke += u * u + v * v;
    pe += f.psi[i] * f.psi[i];
    z += f.q[i] * f.q[i];
    maxU = Math.max(maxU, Math.abs(u));
    maxV = Math.max(maxV, Math.abs(v));
  }
  const r = emptyReport();
  r.time = model.time;
  r.steps = model.steps;
  r.dt = model.dt;
  r.maxU = maxU;
  r.maxV = maxV;
  r.cfl = model.dt * (maxU / (Lx / nx) + maxV / (Ly / ny));
  r.kinetic = ke / (2 * n);
  r.energy.value = r.kinetic + (kd * kd * pe) / (2 * n);
  r.enstrophy.value = z / (2 * n);
  return r;
}
