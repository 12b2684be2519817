import type { AllocationMeter } from '../io/allocationMeter';
import type { DatasetReader } from '../io/datasetReader';
import { scalarStandardError } from '../analysis/noiseReference';
import type { Discovery } from './fieldDiscovery';
import { userFieldSource } from './fieldSource';

/**
 * The eddy heat (interface) flux of a user's two-layer file (docs/two-layer.md): the zonal mean
 * (v₁′τ′)‾(y) of the upper layer's meridional velocity and the interface streamfunction τ = ψ₁ − ψ₂,
 * time-averaged over the records of the window, and its domain mean ⟨v₁′τ′⟩ (v of either layer gives
 * the same domain mean, since ⟨(v₁ − v₂)τ⟩ = ⟨τ∂xτ⟩ = 0 on a periodic x). Worked out from the
 * gridded ψ and v of the two levels of a file with a layer dimension of length 2, or read from a
 * `heat_flux` profile stored beside ū (Stria's two-layer zonal-mean files). In the fields' units
 * (length³/time² when ψ and v are in consistent units). Primes are deviations from the mean along x.
 */
export interface UserHeatFlux {
  /** Time-mean profile over the file's y rows, in Stria's row order (y ascending). */
  profile: number[];
  /** Its mean over y, the domain mean ⟨v′τ′⟩. */
  mean: number;
  /** Standard error of the time mean of the records' domain means (noiseReference.ts), null when too few. */
  stderr: number | null;
  records: number;
  /** 'fields': from ψ and v of both layers; 'profile': the file's own heat_flux profile. */
  from: 'fields' | 'profile';
  variable: string;
}

export interface HeatFluxOptions {
  records: { start: number; end: number };
  subsample?: number;
  meter?: AllocationMeter;
}

/** The heat flux of a two-layer file, or null when the file has neither two layers of ψ and v nor a heat_flux profile. */
export function userHeatFlux(reader: DatasetReader, d: Discovery, o: HeatFluxOptions): UserHeatFlux | null {
  if (d.layout === 'zonal-mean') return profileHeatFlux(reader, d, o);
  const level = d.level;
  const psi = d.fields.psi;
  const v = d.fields.v;
  if (!level || level.count !== 2 || !psi || !v) return null;
  const upper = userFieldSource(
    reader,
    { ...d, fields: { psi, v }, level: { ...level, index: 0 } },
    { meter: o.meter, subsample: o.subsample },
  );
  const lower = userFieldSource(
    reader,
    { ...d, fields: { psi }, level: { ...level, index: 1 } },
    { meter: o.meter, subsample: o.subsample },
  );
  const { nx, ny } = upper.grid;
  const f64 = (n: number) => (o.meter ? o.meter.f64(n, 'heat flux') : new Float64Array(n));
  const psi1 = f64(nx * ny);
  const v1 = f64(nx * ny);
  const psi2 = f64(nx * ny);
  const profile = f64(ny);
  const series: number[] = [];
  const times: (number | null)[] = [];
  for (let r = o.records.start; r < o.records.end; r++) {
    times.push(upper.read(r, { psi: psi1, v: v1 }).time);
    lower.read(r, { psi: psi2 });
    let total = 0;
    for (let j = 0; j < ny; j++) {
      let sv = 0;
      let st = 0;
      for (let i = 0; i < nx; i++) {
        sv += v1[j * nx + i];
        st += psi1[j * nx + i] - psi2[j * nx + i];
      }
      const vb = sv / nx;
      const tb = st / nx;
      let s = 0;
      for (let i = 0; i < nx; i++) s += (v1[j * nx + i] - vb) * (psi1[j * nx + i] - psi2[j * nx + i] - tb);
      profile[j] += s / nx;
      total += s / nx;
    }
    series.push(total / ny);
  }
  return finish(profile, series, times, 'fields', `${psi.variable} and ${v.variable}`);
}

/** The time mean of a stored heat_flux profile on (records, y) beside ū. */
function profileHeatFlux(reader: DatasetReader, d: Discovery, o: HeatFluxOptions): UserHeatFlux | null {
  if (!reader.has('heat_flux')) return null;
  const h = reader.variable('heat_flux');
  const ydim = d.y.dimension;
  const rec = d.records.dimension;
  const shapeOk =
    h.dimensions[h.dimensions.length - 1] === ydim &&
    h.dimensions.slice(0, -1).every((dim, k) => dim === rec || h.shape[k] === 1);
  if (!shapeOk) return null;
  const ny = d.y.n;
  const row = o.meter ? o.meter.f64(ny, 'heat flux') : new Float64Array(ny);
  const profile = o.meter ? o.meter.f64(ny, 'heat flux') : new Float64Array(ny);
  const series: number[] = [];
  const times: (number | null)[] = [];
  const t = d.records.variable ? reader.readAll(d.records.variable) : null;
  for (let r = o.records.start; r < o.records.end; r++) {
    if (rec !== null) reader.readRecord('heat_flux', r, { out: row });
    else reader.readAll('heat_flux', { out: row });
    let total = 0;
    for (let j = 0; j < ny; j++) {
      const x = row[d.y.reversed ? ny - 1 - j : j];
      profile[j] += x;
      total += x;
    }
    series.push(total / ny);
    times.push(t ? t[r] : null);
  }
  return finish(profile, series, times, 'profile', 'heat_flux');
}

function finish(
  profile: Float64Array,
  series: number[],
  times: (number | null)[],
  from: UserHeatFlux['from'],
  variable: string,
): UserHeatFlux {
  const n = series.length;
  for (let j = 0; j < profile.length; j++) profile[j] /= Math.max(n, 1);
  const mean = series.reduce((s, x) => s + x, 0) / Math.max(n, 1);
  const t0 = times[0];
  const t1 = times[n - 1];
  const interval = n > 1 && t0 !== null && t1 !== null && t1 > t0 ? (t1 - t0) / (n - 1) : 1;
  const err = scalarStandardError(series, interval, n * interval);
  return { profile: Array.from(profile), mean, stderr: err ? err.stderr : null, records: n, from, variable };
}
