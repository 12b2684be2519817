import { HovmollerAccumulator } from '../analysis/hovmoller';
import { AllocationMeter } from '../io/allocationMeter';
import { FieldDeriver, planDerivation, type DerivationPlan } from './derivedFields';
import type { FdGrid } from './gridDerivatives';
import { MaskedZonalMean, ProfileAccumulator } from './maskedZonalMean';
import { seamTest } from './periodicity';
import { isPow2 } from '../analysis/profileExtension';
import type { RhinesConvention } from '../analysis/scales';
import { SpectraAccumulator } from './spectraAccumulator';
import type { UserGrid, UserRecordSource, UserRole } from './userData';
import { UserSpectralPlan } from './spectral';
import { summarizeUserAnalysis, type UserAnalysis } from './summary';

/** Record profiles kept for the jet detector's noise estimate (pairs averaged beyond it). */
const RECORD_BINS = 256;

/**
 * The diagnostics of a user's own output over a window of records: what applies is computed, what
 * does not is listed with the reason (`skipped`). Per record: read, derive (derivedFields.ts),
 * zonal means and eddy fluxes over valid points (maskedZonalMean.ts), the mean square speed, and on
 * a doubly periodic 2^k grid without missing values the spectra and spectral flux. At the end, from
 * the time means: jets, PV staircase, eddy diffusivity, U_rms, Rhines scale, zonostrophy index
 * (summary.ts).
 *
 * Units are those of the record source (UserGrid): β in 1/(length·time), k_d in 1/length, ε in
 * length²/time³, μ in 1/time, all in the grid's length unit and the fields' time unit (m and s for
 * SI files and the tangent plane).
 *
 * Memory: buffers are allocated once, before the first record, through `meter` (allocationMeter.ts):
 * one per field read or derived (nx·ny doubles each), one derivative scratch, the spectral plans on a
 * periodic 2^k grid, and profile accumulators (a few × ny); reading a record allocates no further
 * retained memory (tested in test/userfile/gridAnalysis.test.ts).
 */
export interface UserAnalysisOptions {
  beta?: number;
  kd?: number;
  eps?: number;
  mu?: number;
  /** The file's q is the total PV, βy included. */
  qIncludesBeta?: boolean;
  /** Records [start, end) of the source; default all. */
  records?: { start: number; end: number };
  /** Least fraction of valid points for a row mean, and of records for a time mean; default 0.5. */
  minValidFraction?: number;
  rhines?: RhinesConvention;
  /** Overrides of the periodicity the coordinates state or the data show. */
  periodic?: { x?: boolean; y?: boolean };
  /** Compute spectra and spectral flux where they apply (default true). */
  spectra?: boolean;
  onProgress?: (p: { record: number; index: number; of: number; done: number; total: number }) => void;
  meter?: AllocationMeter;
}

export function analyzeUserRecords(source: UserRecordSource, options: UserAnalysisOptions = {}): UserAnalysis {
  const meter = options.meter ?? new AllocationMeter();
  const g = source.grid;
  const start = options.records?.start ?? 0;
  const end = options.records?.end ?? source.recordCount;
  if (!(Number.isInteger(start) && Number.isInteger(end) && start >= 0 && end <= source.recordCount && start < end)) {
    throw new RangeError(`records ${start}:${end} are not a window of the ${source.recordCount} records of the file`);
  }
  const frac = options.minValidFraction ?? 0.5;
  if (!(frac > 0 && frac <= 1)) throw new RangeError(`minValidFraction = ${frac} must be in (0, 1]`);
  const kd = options.kd ?? 0;
  const n = g.nx * g.ny;
  const profileLayout = source.roles.includes('ubar');
  const notes = g.notes.slice();

  // The file's fields, read before anything that depends on periodicity is built.
  const fileBuffers: Partial<Record<UserRole, Float64Array>> = {};
  for (const r of source.roles) fileBuffers[r] = meter.f64(profileLayout ? g.ny : n, 'fields');
  const progress = (index: number) => (done: number, total: number) =>
    options.onProgress?.({ record: index, index: index - start, of: end - start, done, total });
  const time0 = source.read(start, fileBuffers, progress(start)).time;
  const grid = resolvePeriodicity(g, fileBuffers, options.periodic, notes);
  const lengths = g.lengthUnit !== 'degrees';
  const spectralGrid =
    !profileLayout && lengths && grid.periodicX === true && grid.periodicY === true && isPow2(g.nx) && isPow2(g.ny);
  const spectral = spectralGrid
    ? new UserSpectralPlan({ nx: g.nx, ny: g.ny, Lx: g.nx * g.dx, Ly: g.ny * g.dy }, kd, meter)
    : null;
  const plan: DerivationPlan = profileLayout
    ? { u: null, v: null, zeta: null, psi: null, q: null, reasons: [] }
    : planDerivation(source.roles, kd, lengths, spectralGrid);
  const fd: FdGrid = {
    nx: g.nx,
    ny: g.ny,
    dx: g.dx,
    dy: g.dy,
    periodicX: grid.periodicX === true,
    periodicY: grid.periodicY === true,
  };
  const y = (j: number) => g.y0 + j * g.dy;
  const betaOff = options.qIncludesBeta && options.beta !== undefined ? { beta: options.beta, y0: g.y0, y } : null;
  const deriver = profileLayout ? null : new FieldDeriver(plan, fd, spectral, kd, betaOff, fileBuffers, meter);
  const zm = new MaskedZonalMean(g.nx, g.ny, Math.max(1, Math.ceil(frac * g.nx)), meter);
  const acc = {
    ubar: new ProfileAccumulator(g.ny, meter),
    qbar: new ProfileAccumulator(g.ny, meter),
    upvp: new ProfileAccumulator(g.ny, meter),
    vpqp: new ProfileAccumulator(g.ny, meter),
    eke: new ProfileAccumulator(g.ny, meter),
  };
  const spec = spectral && options.spectra !== false ? new SpectraAccumulator(spectral, meter) : null;
  // The records' own profiles (pairs averaged past RECORD_BINS): the scatter the jet detector judges against.
  const records = {
    ubar: new HovmollerAccumulator(g.ny, g.ny * g.dy, RECORD_BINS),
    qbar: new HovmollerAccumulator(g.ny, g.ny * g.dy, RECORD_BINS),
  };
  meter.external(2 * RECORD_BINS * g.ny * 8, 'record profiles');
  // The first record's u and q column by column (profiles along y), for files of too few records to judge over time.
  let columns: { ubar: Float64Array; qbar: Float64Array | null } | null = null;
  let speed2 = 0;
  let speed2Count = 0;
  let qRecords = 0;
  let spectralRoute = 0;
  const times: (number | null)[] = [time0];

  for (let r = start; r < end; r++) {
    if (r > start) times.push(source.read(r, fileBuffers, progress(r)).time);
    if (profileLayout) {
      const ub = fileBuffers.ubar as Float64Array;
      const eke = fileBuffers.eke ?? null;
      acc.ubar.add(ub);
      records.ubar.add(r - start, ub);
      if (eke) acc.eke.add(eke);
      if (fileBuffers.upvp) acc.upvp.add(fileBuffers.upvp);
      if (fileBuffers.vpqp) acc.vpqp.add(fileBuffers.vpqp);
      // u² + v² of a row, averaged along it: ū² + 2·EKE (with v̄ = 0, as in a beta-plane QG flow).
      for (let j = 0; j < g.ny; j++)
        if (Number.isFinite(ub[j]) && (!eke || Number.isFinite(eke[j]))) {
          speed2 += ub[j] * ub[j] + (eke ? 2 * eke[j] : 0);
          speed2Count++;
        }
    } else {
      const d = (deriver as FieldDeriver).derive();
      if (d.spectral) spectralRoute++;
      const f = (deriver as FieldDeriver).fields;
      const q = d.q ? (f.q ?? null) : null;
      if (q) qRecords++;
      const p = zm.compute(f.u ?? null, f.v ?? null, q);
      if (r === start && f.u)
        columns = { ubar: byColumn(f.u, g.nx, g.ny, meter), qbar: q ? byColumn(q, g.nx, g.ny, meter) : null };
      acc.ubar.add(p.ubar);
      acc.qbar.add(p.qbar);
      records.ubar.add(r - start, p.ubar);
      records.qbar.add(r - start, p.qbar);
      acc.upvp.add(p.upvp);
      acc.vpqp.add(p.vpqp);
      acc.eke.add(p.eke);
      speed2 += p.speed2Sum;
      speed2Count += p.speed2Count;
      spec?.add(q, f.u ?? null, f.v ?? null);
    }
    meter.endRecord();
  }
  if (spectralRoute > 0 && spectralRoute < end - start)
    notes.push(
      `derivatives were spectral in ${spectralRoute} of ${end - start} records; records with missing values used finite differences`,
    );
  const used = end - start;
  return summarizeUserAnalysis({
    grid: { ...g, periodicX: grid.periodicX === true, periodicY: grid.periodicY === true, notes },
    window: { start, end, times, timeUnits: source.timeUnits },
    plan,
    profileLayout,
    means: {
      ubar: acc.ubar.mean(Math.ceil(frac * used)),
      qbar: qRecords >= Math.ceil(frac * used) ? acc.qbar.mean(Math.ceil(frac * qRecords)) : null,
      upvp: acc.upvp.mean(Math.ceil(frac * used)),
      vpqp: qRecords || source.roles.includes('vpqp') ? acc.vpqp.mean(Math.ceil(frac * (qRecords || used))) : null,
      eke: acc.eke.mean(Math.ceil(frac * used)),
    },
    qRecords,
    records: { ubar: records.ubar.view(), qbar: qRecords ? records.qbar.view() : null },
    columns,
    storedEddies: profileLayout ? source.roles.filter((r) => r === 'upvp' || r === 'vpqp' || r === 'eke') : [],
    uRms: speed2Count ? Math.sqrt(speed2 / speed2Count) : null,
    uRmsKind: profileLayout
      ? source.roles.includes('eke')
        ? 'zonal mean and eddy kinetic energy'
        : 'zonal mean'
      : source.roles.includes('v') || plan.v
        ? 'u and v'
        : 'u only',
    spectra: spec?.result() ?? null,
    spectralReason: spectral
      ? options.spectra === false
        ? 'not asked for'
        : null
      : spectraReason(g, grid, lengths, profileLayout),
    options: { ...options, kd },
    meter,
  });
}

/** Periodicity of each axis: the user's word, else the coordinates', else the edge test on the first record. */
function resolvePeriodicity(
  g: UserGrid,
  fields: Partial<Record<UserRole, Float64Array>>,
  force: { x?: boolean; y?: boolean } | undefined,
  notes: string[],
): { periodicX: boolean | null; periodicY: boolean | null } {
  const probe = fields.u ?? fields.zeta ?? fields.psi ?? fields.q ?? fields.v ?? fields.ubar;
  const decide = (axis: 'x' | 'y', stated: boolean | null, forced: boolean | undefined): boolean | null => {
    if (forced !== undefined) {
      notes.push(`${axis}: taken as ${forced ? '' : 'not '}periodic, as asked`);
      return forced;
    }
    if (stated !== null) return stated;
    if ((axis === 'x' && g.nx === 1) || !probe) return null;
    const t = seamTest(probe, fields.ubar ? 1 : g.nx, g.ny, axis);
    if (!t) {
      notes.push(
        `${axis}: periodicity unknown (no period stated, too few points or values for the edge test): taken as not periodic; give the domain length or --periodic`,
      );
      return null;
    }
    notes.push(
      t.duplicated
        ? `${axis}: not periodic — the last ${axis === 'x' ? 'column' : 'row'} repeats the first (a grid that includes both ends); drop it to analyse the field as periodic`
        : `${axis}: ${t.periodic ? '' : 'not '}periodic by the edge test on the first record (seam difference ${t.ratio.toFixed(2)} × the rms neighbour difference; periodic up to 3)`,
    );
    return t.periodic;
  };
  return { periodicX: decide('x', g.periodicX, force?.x), periodicY: decide('y', g.periodicY, force?.y) };
}

function spectraReason(
  g: UserGrid,
  p: { periodicX: boolean | null; periodicY: boolean | null },
  lengths: boolean,
  profile: boolean,
): string {
  if (profile) return 'the file holds zonal-mean profiles only, not 2D fields';
  if (!lengths)
    return 'the grid is in degrees: map it onto the tangent plane (a planet and a central latitude) to get wavenumbers';
  if (p.periodicX !== true || p.periodicY !== true)
    return `the grid is not periodic in ${[p.periodicX !== true ? 'x' : '', p.periodicY !== true ? 'y' : ''].filter(Boolean).join(' and ')}: Fourier spectra of a bounded field would be dominated by its edges`;
  return `the grid is ${g.nx} × ${g.ny}: Stria's transforms need powers of two`;
}

export type { UserAnalysis };

/** A row-major field (point (i, j) at j·nx + i) as its columns: profile i along y at i·ny + j. */
function byColumn(f: Float64Array, nx: number, ny: number, meter: AllocationMeter): Float64Array {
  const out = meter.f64(nx * ny, 'record profiles');
  for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) out[i * ny + j] = f[j * nx + i];
  return out;
}
