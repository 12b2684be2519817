import type { AllocationMeter } from '../io/allocationMeter';
import type { DerivationPlan } from './derivedFields';
import { eddyDiffusivity } from '../analysis/eddyDiffusivity';
import { profileDerivative } from './gridDerivatives';
import type { HovmollerRecord } from '../analysis/hovmoller';
import { qtotFromUbar } from './qtotFromUbar';
import type { Regime, RhinesConvention } from '../analysis/scales';
import { userScales } from './scales';
import type { SpectraMean } from './spectraAccumulator';
import type { UserGrid } from './userData';
import {
  recordRows,
  userJets,
  userStaircase,
  type RecordSeries,
  type UserJets,
  type UserStaircase,
} from './userStructure';

/**
 * The result of analysing a user's file (gridAnalysis.ts), and the step from time-mean profiles to
 * the diagnostics. Numbers are in the grid's units (see userData.ts); values that could not be
 * formed are null, profiles hold null at invalid rows, so the object is valid JSON as it is.
 */
export interface UserAnalysis {
  grid: Omit<UserGrid, 'periodicX' | 'periodicY' | 'notes'> & { periodicX: boolean; periodicY: boolean };
  window: {
    start: number;
    end: number;
    count: number;
    timeStart: number | null;
    timeEnd: number | null;
    timeUnits: string | null;
  };
  /** Where each working field came from: 'file', or the field it was derived from; null: unavailable. */
  fields: Omit<DerivationPlan, 'reasons'>;
  profiles: {
    y: number[];
    ubar: (number | null)[];
    upvp: (number | null)[] | null;
    vpqp: (number | null)[] | null;
    eke: (number | null)[] | null;
  };
  /** Total zonal-mean PV q̄ + β(y − y0) at positions y (grid rows, or midpoints between them), and how it was formed. */
  qtot: { y: number[]; values: number[]; source: string } | null;
  /** By the one detector, judged against the records' own scatter (userStructure.ts). */
  jets: UserJets | null;
  staircase: UserStaircase | null;
  uRms: { value: number; kind: URmsKind } | null;
  scales: {
    beta: number | null;
    kRhines: number | null;
    rhinesConvention: RhinesConvention;
    rhinesLength: number | null;
    rhinesLengths: Record<RhinesConvention, number> | null;
    /** L = 720^{1/4}(U_rms/β)^½, the step width of the ideal staircase of this U_rms. */
    staircaseSpacing: number | null;
    kBeta: number | null;
    zonostrophyIndex: number | null;
    regime: Regime | null;
  };
  diffusivity: { Dfit: number | null; Dmean: number | null; Lmix: number | null; validRows: number } | null;
  spectra: SpectraMean | null;
  computed: string[];
  skipped: { diagnostic: string; reason: string }[];
  notes: string[];
  memory: { retainedBytes: number; peakTransientBytes: number; byLabel: Record<string, number> };
}

/**
 * What U_rms = ⟨u² + v²⟩^½ was formed from: both velocity components, u alone (a lower bound), ū
 * alone (the zonal part only), or ū and the stored EKE (⟨ū² + 2·EKE⟩, the whole of it when v̄ = 0).
 */
export type URmsKind = 'u and v' | 'u only' | 'zonal mean' | 'zonal mean and eddy kinetic energy';

export interface SummaryInput {
  grid: UserAnalysis['grid'] & { notes: string[] };
  window: { start: number; end: number; times: (number | null)[]; timeUnits: string | null };
  plan: DerivationPlan;
  profileLayout: boolean;
  means: {
    ubar: Float64Array;
    qbar: Float64Array | null;
    upvp: Float64Array;
    vpqp: Float64Array | null;
    eke: Float64Array;
  };
  qRecords: number;
  /** The records' ū and q̄ profiles (means of consecutive records, times in records): the detector's batch means. */
  records: { ubar: HovmollerRecord; qbar: HovmollerRecord | null };
  /** The first record's u and q as profiles along y, one per column x_i (i·ny + j), or null (zonal means only). */
  columns: { ubar: Float64Array; qbar: Float64Array | null } | null;
  /** Eddy profiles a zonal-mean file stores itself (read, not computed). */
  storedEddies: readonly ('upvp' | 'vpqp' | 'eke')[];
  uRms: number | null;
  uRmsKind: URmsKind;
  spectra: SpectraMean | null;
  spectralReason: string | null;
  options: { beta?: number; kd: number; eps?: number; mu?: number; rhines?: RhinesConvention };
  meter: AllocationMeter;
}

const orNull = (x: number) => (Number.isFinite(x) ? x : null);
const arr = (a: Float64Array | null) => (a ? Array.from(a, orNull) : null);
const complete = (a: Float64Array | null) => !!a && a.every(Number.isFinite);

export function summarizeUserAnalysis(s: SummaryInput): UserAnalysis {
  const { grid: g, means, options: o } = s;
  const computed: string[] = [];
  const skipped: { diagnostic: string; reason: string }[] = [];
  const skip = (diagnostic: string, reason: string) => skipped.push({ diagnostic, reason });
  const beta = o.beta ?? null;
  const y = Array.from({ length: g.ny }, (_, j) => g.y0 + j * g.dy);
  const hasV = !s.profileLayout && !!s.plan.v;
  const stored = (k: 'upvp' | 'vpqp' | 'eke') => s.storedEddies.includes(k);
  computed.push('zonal-mean zonal velocity ū');
  if (hasV) computed.push('eddy momentum flux u′v′', 'eddy kinetic energy');
  else if (s.profileLayout && (stored('upvp') || stored('eke'))) {
    if (stored('upvp')) computed.push('eddy momentum flux u′v′');
    if (stored('eke')) computed.push('eddy kinetic energy');
    if (!stored('upvp') || !stored('eke'))
      skip(stored('upvp') ? 'EKE' : 'eddy momentum flux u′v′', 'the file stores the other eddy profile only');
  } else
    skip(
      'eddy momentum flux u′v′ and EKE',
      s.profileLayout
        ? 'the file holds zonal means of u only (no u′v′ or EKE profile)'
        : 'the file has no northward velocity v (nor ψ)',
    );

  // The samples the means are judged against (userStructure.ts): the records when there are enough
  // of them, in the file's time unit when its times are evenly spaced; else the columns of the first
  // record along x, of which the zonal mean is the mean (a single snapshot's own sampling error).
  const samples = sampleSource(s, o.mu);
  if (samples.note) s.grid.notes.push(samples.note);

  // Jets, from ū over its valid rows: invalid rows may be cut off the ends, not from the middle.
  const span = validSpan(means.ubar);
  let jets: UserJets | null = null;
  if (!span) skip('jets', 'ū has no valid rows');
  else if (span.gaps)
    skip('jets', `ū is invalid at rows inside the domain (first at row ${span.gaps}): too few valid points there`);
  else {
    const periodic = g.periodicY && span.a === 0 && span.b === g.ny;
    const mean = means.ubar.slice(span.a, span.b);
    const bins = recordRows(samples.ubar, g.ny, span.a, span.b, mean);
    const geometry = { points: span.b - span.a, y0: g.y0 + span.a * g.dy, dy: g.dy, periodic };
    jets = userJets(geometry, mean, bins, samples.ubar.times, samples.mu);
    computed.push(`jets (positions, spacing, significance against ${samples.label})`);
    if (jets.verdict === 'too-short') s.grid.notes.push(`jets: ${jets.reason}`);
    if (span.b - span.a < g.ny)
      s.grid.notes.push(
        `ū is invalid on ${g.ny - (span.b - span.a)} rows at the edges: jets are sought on rows ${span.a}–${span.b - 1}, as a bounded profile`,
      );
  }

  // Total PV: from the file's own PV or vorticity when it has them (no derivative taken), else
  // from ū by differences between rows (qtotFromUbar.ts), which are exact on the arcs of a staircase
  // where a derivative of the 2D field at the rows would smear every jet's cusp. The samples' total
  // PV is formed the same way as the mean's.
  let qtot: UserAnalysis['qtot'] = null;
  let qtotBins: { bins: Float64Array; times: number[] } | null = null;
  const direct = s.plan.q === 'file' || (s.plan.q === 'zeta' && s.plan.zeta === 'file');
  if (beta === null) skip('PV staircase', 'needs β (give it, or a planet and a central latitude)');
  else if (s.profileLayout || !direct || !complete(means.qbar) || !samples.qbar) {
    if (direct)
      skip(
        'q̄ from the PV field',
        `q was formed in ${s.qRecords} records, too few or with invalid rows; q̄ is formed from ū instead`,
      );
    if (span && !span.gaps) {
      const u = means.ubar.subarray(span.a, span.b);
      const periodic = g.periodicY && span.a === 0 && span.b === g.ny;
      const q = qtotFromUbar(u, g.dy, periodic, beta, o.kd);
      qtot = { y: q.y.map((v) => v + g.y0 + span.a * g.dy), values: q.values, source: q.source };
      const rows = recordRows(samples.ubar, g.ny, span.a, span.b, u);
      const n = span.b - span.a;
      const bins = new Float64Array(samples.ubar.count * q.values.length);
      for (let r = 0; r < samples.ubar.count; r++)
        bins.set(
          qtotFromUbar(rows.subarray(r * n, (r + 1) * n), g.dy, periodic, beta, o.kd).values,
          r * q.values.length,
        );
      qtotBins = { bins, times: samples.ubar.times };
    }
  } else {
    qtot = {
      y,
      values: Array.from(means.qbar as Float64Array, (v, j) => v + beta * j * g.dy),
      source: `zonal mean of the PV anomaly q (${s.plan.q === 'file' ? 'from the file' : 'q = ζ − k_d²ψ'}) plus β(y − y0)`,
    };
    const bins = recordRows(samples.qbar, g.ny, 0, g.ny, means.qbar as Float64Array);
    for (let r = 0; r < samples.qbar.count; r++) for (let j = 0; j < g.ny; j++) bins[r * g.ny + j] += beta * j * g.dy;
    qtotBins = { bins, times: samples.qbar.times };
  }
  let staircase: UserStaircase | null = null;
  if (qtot && qtotBins && beta !== null) {
    if (!(beta > 0)) skip('PV staircase', `β = ${beta} must be > 0`);
    else {
      const periodic = g.periodicY && qtot.values.length === g.ny;
      const geometry = { points: qtot.values.length, y0: qtot.y[0], dy: g.dy, periodic };
      staircase = userStaircase(
        geometry,
        beta,
        Float64Array.from(qtot.values),
        qtotBins.bins,
        qtotBins.times,
        samples.mu,
      );
      computed.push('PV staircase (edges, widths, sharpness index, significance)');
    }
  } else if (beta !== null && !qtot) skip('PV staircase', 'the total PV cannot be formed: no valid ū or PV profile');

  // Eddy PV flux and diffusivity, on the grid rows.
  let diffusivity: UserAnalysis['diffusivity'] = null;
  if (stored('vpqp')) {
    computed.push('eddy PV flux v′q′');
    skip('eddy diffusivity', 'needs the zonal-mean PV anomaly, which a zonal-mean file does not give apart from βy');
  } else if (!hasV || !s.qRecords)
    skip(
      'eddy PV flux v′q′ and eddy diffusivity',
      !hasV ? 'needs v' : s.plan.reasons.join('; ') || 'q could not be formed',
    );
  else {
    computed.push('eddy PV flux v′q′');
    if (beta === null || !complete(means.qbar) || !complete(means.vpqp) || !complete(means.eke))
      skip('eddy diffusivity', beta === null ? 'needs β' : 'some rows of q̄, v′q′ or EKE are invalid');
    else {
      const anomaly = means.qbar as Float64Array;
      const dqdy = profileDerivative(anomaly, g.dy, g.periodicY, new Float64Array(g.ny)).map((d) => d + beta);
      const D = eddyDiffusivity(means.vpqp as Float64Array, dqdy, means.eke);
      diffusivity = { Dfit: D.Dfit, Dmean: D.Dmean, Lmix: D.Lmix, validRows: D.validCount };
      computed.push('eddy diffusivity of PV');
    }
  }

  const scales = userScales(
    {
      uRms: s.uRms,
      uRmsKind: s.uRmsKind,
      degrees: g.lengthUnit === 'degrees',
      beta,
      eps: s.options.eps,
      rhines: s.options.rhines,
    },
    skip,
    computed,
  );
  if (s.spectra && s.spectra.records > 0)
    computed.push(s.spectra.kind === 'pv' ? 'energy and enstrophy spectra, spectral flux' : 'kinetic-energy spectrum');
  else
    skip(
      'spectra and spectral flux',
      s.spectralReason ??
        (s.spectra?.refused
          ? `every record had missing values (${s.spectra.refused}); spectra need complete fields`
          : 'no field to transform'),
    );
  if (s.spectra?.kind === 'kinetic') skip('spectral flux', 'needs the PV (or vorticity)');
  for (const r of s.plan.reasons) s.grid.notes.push(r);
  const t = s.window.times;
  const { notes, ...grid } = g;
  return {
    grid,
    window: {
      start: s.window.start,
      end: s.window.end,
      count: s.window.end - s.window.start,
      timeStart: t[0] ?? null,
      timeEnd: t[t.length - 1] ?? null,
      timeUnits: s.window.timeUnits,
    },
    fields: { u: s.plan.u, v: s.plan.v, zeta: s.plan.zeta, psi: s.plan.psi, q: s.plan.q },
    profiles: {
      y,
      ubar: arr(means.ubar) as (number | null)[],
      upvp: hasV || stored('upvp') ? arr(means.upvp) : null,
      vpqp: (s.qRecords && hasV) || stored('vpqp') ? arr(means.vpqp) : null,
      eke: hasV || stored('eke') ? arr(means.eke) : null,
    },
    qtot,
    jets,
    staircase,
    uRms: s.uRms === null ? null : { value: s.uRms, kind: s.uRmsKind },
    scales,
    diffusivity,
    spectra: s.spectra && s.spectra.records > 0 ? s.spectra : null,
    computed,
    skipped,
    notes,
    memory: {
      retainedBytes: s.meter.retained,
      peakTransientBytes: s.meter.peakTransient,
      byLabel: Object.fromEntries(s.meter.byLabel),
    },
  };
}

/** The valid rows of a profile: [a, b) between the first and last finite value, and the first gap inside. */
function validSpan(p: Float64Array): { a: number; b: number; gaps: number | null } | null {
  let a = 0;
  while (a < p.length && !Number.isFinite(p[a])) a++;
  if (a === p.length) return null;
  let b = p.length;
  while (!Number.isFinite(p[b - 1])) b--;
  for (let j = a; j < b; j++) if (!Number.isFinite(p[j])) return { a, b, gaps: j };
  return { a, b, gaps: null };
}

/**
 * The spacing of the records' times in the file's unit, when the times are all known, increasing and
 * evenly spaced (to 1e-6); else one record per unit ('records').
 */
function uniformStep(times: (number | null)[]): { step: number; unit: 'file' | 'records' } {
  const n = times.length;
  if (n < 2 || times.some((t) => t === null || !Number.isFinite(t))) return { step: 1, unit: 'records' };
  const t = times as number[];
  const step = (t[n - 1] - t[0]) / (n - 1);
  const even = step > 0 && t.every((x, i) => Math.abs(x - (t[0] + i * step)) <= 1e-6 * Math.abs(step) * n);
  return even ? { step, unit: 'file' } : { step: 1, unit: 'records' };
}

/** Fewer records than this and a 2D file is judged against its first record's scatter along x. */
const MIN_RECORDS = 8;

/** The samples the detector judges the means against, and how they are described. */
function sampleSource(s: SummaryInput, mu: number | undefined) {
  const g = s.grid;
  const fromRecords = (rec: HovmollerRecord, step: number): RecordSeries => ({
    values: rec.data,
    count: rec.columns,
    times: Array.from(rec.t, (t) => t * step),
  });
  if (s.records.ubar.columns >= MIN_RECORDS || !s.columns) {
    const time = uniformStep(s.window.times);
    const useMu = time.unit === 'file' ? mu : undefined;
    return {
      label: `the scatter of ${s.window.end - s.window.start} records`,
      ubar: fromRecords(s.records.ubar, time.step),
      qbar: s.records.qbar ? fromRecords(s.records.qbar, time.step) : null,
      mu: useMu,
      note:
        mu !== undefined && useMu === undefined
          ? 'μ is not used to bound the independent records: the file has no evenly spaced times'
          : null,
    };
  }
  const columns = (values: Float64Array): RecordSeries => ({
    values,
    count: g.nx,
    times: Array.from({ length: g.nx }, (_, i) => i * g.dx),
  });
  return {
    label: `the scatter of record ${s.window.start} along x (fewer than ${MIN_RECORDS} records)`,
    ubar: columns(s.columns.ubar),
    qbar: s.columns.qbar ? columns(s.columns.qbar) : null,
    mu: undefined,
    note: `fewer than ${MIN_RECORDS} records: jets and staircase steps are judged against the scatter of ū along x in record ${s.window.start}, not over time`,
  };
}
