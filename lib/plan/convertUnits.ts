import type { DeformationInput, DriveInput, GridInput, PlanInput, RotationInput } from './planInput';
import { resolvePlan } from './resolvePlan';
import { DIM, planScaling, toModel, toPhysical, type Dimension, type UnitScaling } from './units';

/**
 * A plan carried between unit systems with one scaling (units.ts), field by field: every number of
 * dimension L^a T^b is divided (to model units) or multiplied (to physical units) by ℓ^a t^b; pure
 * numbers (grid points, half-width, order, CFL number, depth ratio) stay. A planet's rotation and a
 * layer's depth and reduced gravity have no model-unit form, so they travel as the β, f and L_d they
 * give at the plan's latitude.
 */
function convertFields(p: PlanInput, units: PlanInput['units'], f: (x: number, d: Dimension) => number): PlanInput {
  const rotation = (r: RotationInput): RotationInput =>
    r.kind === 'beta'
      ? { kind: 'beta', beta: f(r.beta, DIM.beta), ...(r.f === undefined ? {} : { f: f(r.f, DIM.rate) }) }
      : r;
  const deformation = (d: DeformationInput): DeformationInput =>
    d.kind === 'radius' ? { kind: 'radius', Ld: f(d.Ld, DIM.length) } : d;
  const drive = (d: DriveInput): DriveInput =>
    d.kind === 'injection'
      ? { kind: 'injection', eps: f(d.eps, DIM.injection) }
      : d.kind === 'velocity'
        ? { kind: 'velocity', U: f(d.U, DIM.velocity) }
        : { ...d, shear: f(d.shear, DIM.velocity) };
  const grid = (g: GridInput): GridInput =>
    g.kind === 'spacing' ? { kind: 'spacing', dx: f(g.dx, DIM.length), dy: f(g.dy, DIM.length) } : { ...g };
  return {
    ...p,
    units,
    rotation: rotation(p.rotation),
    deformation: deformation(p.deformation),
    drive: drive(p.drive),
    dragTime: f(p.dragTime, DIM.time),
    forcing: { wavelength: f(p.forcing.wavelength, DIM.length), halfWidth: p.forcing.halfWidth },
    domain: { Lx: f(p.domain.Lx, DIM.length), Ly: f(p.domain.Ly, DIM.length) },
    grid: grid(p.grid),
    hyperviscosity: { order: p.hyperviscosity.order, gridDampingTime: f(p.hyperviscosity.gridDampingTime, DIM.time) },
    runLength: f(p.runLength, DIM.time),
  };
}

/** A physical plan in model units with its own scaling (ℓ = Lx/2π, t = ℓ/U); throws InputError when the plan is invalid. */
export function planToModelUnits(physical: PlanInput): { input: PlanInput; scaling: UnitScaling } {
  const resolved = resolvePlan(physical);
  const scaling = planScaling(resolved);
  // Planets and layers become the β, f and L_d they give, so that only dimensional numbers remain.
  const plain: PlanInput = {
    ...physical,
    rotation: { kind: 'beta', beta: resolved.beta, ...(resolved.f === null ? {} : { f: resolved.f }) },
    deformation: resolved.kd > 0 ? { kind: 'radius', Ld: resolved.Ld } : { kind: 'none' },
  };
  return { input: convertFields(plain, 'model', (x, d) => toModel(x, d, scaling)), scaling };
}

/** A model-unit plan in physical (SI) units, each model unit standing for the scaling's metres and seconds. */
export function planToPhysicalUnits(model: PlanInput, scaling: UnitScaling): PlanInput {
  return convertFields(model, 'physical', (x, d) => toPhysical(x, d, scaling));
}
