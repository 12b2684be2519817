import { describe, expect, it } from 'vitest';
import { AllocationMeter } from '../../lib/io/allocationMeter';
import { StructureDetector } from '../../lib/analysis/jetDetector';
import { ProfileFFT } from '../../lib/analysis/profileFFT';
import { analyzeUserRecords } from '../../lib/userfile/gridAnalysis';
import { ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import type { GridFields } from '../../lib/analysis/snapshot';
import { maxAbsDiff } from '../support/random';
import { randomGridFields } from '../support/randomFields';
import { staircaseProfile } from '../support/jetFields';
import { arraySource } from '../support/userSource';

const [nx, ny, Lx, Ly, beta] = [32, 64, 2 * Math.PI, 2 * Math.PI, 8];
const dx = Lx / nx;
const dy = Ly / ny;

/**
 * Record r: a four-jet staircase flow (ū, ζ̄ = −∂yū) plus random eddies of record r, all consistent;
 * the eddies are scaled by `eddies` (their zonal means, part of the random field, are the noise of ū).
 */
function fields(r: number, kd = 0, eddies = 1): GridFields {
  const raw = randomGridFields({ nx, ny, Lx, Ly, kd, maxIx: 8, maxM: 8, seed: 100 + r });
  const e = Object.fromEntries(
    Object.entries(raw).map(([k, v]) => [k, v instanceof Float64Array ? v.map((x) => eddies * x) : v]),
  ) as unknown as GridFields;
  const out = { ...e, u: e.u.slice(), zeta: e.zeta.slice(), q: e.q.slice() };
  for (let j = 0; j < ny; j++) {
    const s = staircaseProfile(j * dy, Ly / 4, beta, 0.2);
    for (let i = 0; i < nx; i++) {
      out.u[j * nx + i] += s.u;
      out.zeta[j * nx + i] += s.zeta;
      out.q[j * nx + i] += s.zeta; // kd = 0: q = ζ
    }
  }
  return out;
}

describe("analysis of a user's records", () => {
  it("gives Stria's own diagnostics for Stria-like fields: zonal means, jets, staircase, U_rms", () => {
    const R = 10;
    // Eddies whose zonal means wander by a few per cent of the jets: four jets stand out of ten records.
    const recs = Array.from({ length: R }, (_, r) => fields(r, 0, 0.05));
    const a = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['u', 'v', 'q'], R, (r) => recs[r]),
      { beta },
    );
    // Direct: ZonalMeanPlan per record, time mean, and the one detector on the records' zonal means
    // (the route of a Stria run: lib/analysis/jetDetector.ts).
    const zm = new ZonalMeanPlan({ nx, ny, Lx, Ly }, { beta });
    const perRecord = (k: 'ubar' | 'qtot' | 'upvp' | 'vpqp') => recs.map((f) => zm.compute(f)[k].slice());
    const mean = (k: 'ubar' | 'qtot' | 'upvp' | 'vpqp') =>
      perRecord(k).reduce((s, p) => s.map((x, j) => x + p[j] / R), new Float64Array(ny));
    expect(maxAbsDiff(a.profiles.ubar as number[], mean('ubar'))).toBeLessThan(1e-14);
    expect(maxAbsDiff(a.profiles.upvp as number[], mean('upvp'))).toBeLessThan(1e-14);
    expect(maxAbsDiff(a.profiles.vpqp as number[], mean('vpqp'))).toBeLessThan(1e-13);
    expect(maxAbsDiff(a.qtot!.values, mean('qtot'))).toBeLessThan(1e-13);
    const series = (k: 'ubar' | 'qtot') => ({
      mean: mean(k),
      bins: Float64Array.from(perRecord(k).flatMap((p) => Array.from(p))),
      count: R,
      interval: 1,
      span: R,
      samples: R,
    });
    const detector = new StructureDetector({ points: ny, y0: 0, dy, periodic: true }, { beta });
    const jets = detector.jets(series('ubar'));
    expect(jets.count).toBe(4);
    expect(a.jets!.count).toBe(4);
    expect(
      maxAbsDiff(Float64Array.from(a.jets!.jets.map((j) => j.y)), Float64Array.from(jets.jets.map((j) => j.y))),
    ).toBeLessThan(1e-12);
    const st = detector.staircase(series('qtot'));
    // The two routes form q̄ with different round-off (1e-13 above), so the edges agree to round-off.
    expect(a.staircase!.edges.length).toBe(st.edges.length);
    expect(maxAbsDiff(Float64Array.from(a.staircase!.edges), Float64Array.from(st.edges))).toBeLessThan(1e-12);
    expect(Math.abs(a.staircase!.index! - st.index!)).toBeLessThan(1e-12);
    let s2 = 0;
    for (const f of recs) for (let k = 0; k < nx * ny; k++) s2 += f.u[k] ** 2 + f.v[k] ** 2;
    expect(Math.abs(a.uRms!.value / Math.sqrt(s2 / (R * nx * ny)) - 1)).toBeLessThan(1e-14);
    expect(a.spectra?.kind).toBe('pv');
    expect(a.window).toMatchObject({ start: 0, end: R, count: R, timeStart: 0 });
  });

  it('inverts a vorticity-only record for ψ, u and v on a doubly periodic grid', () => {
    const f = randomGridFields({ nx, ny, Lx, Ly, kd: 0, maxIx: 8, maxM: 8, seed: 11 });
    const direct = new ZonalMeanPlan({ nx, ny, Lx, Ly }, { beta }).compute(f);
    const a = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['zeta'], 1, () => f),
      { beta },
    );
    expect(a.fields).toEqual({ u: 'psi', v: 'psi', zeta: 'file', psi: 'inversion', q: 'zeta' });
    // u = −ψ_y, v = ψ_x of ψ = ∇⁻²ζ, exact for a band-limited field (the mean of ψ does not enter).
    expect(maxAbsDiff(a.profiles.ubar as number[], direct.ubar)).toBeLessThan(1e-12);
    expect(maxAbsDiff(a.profiles.upvp as number[], direct.upvpPlain)).toBeLessThan(1e-12);
    expect(maxAbsDiff(a.profiles.eke as number[], direct.ekePlain)).toBeLessThan(1e-12);
    let s2 = 0;
    for (let k = 0; k < nx * ny; k++) s2 += f.u[k] ** 2 + f.v[k] ** 2;
    expect(a.uRms!.kind).toBe('u and v');
    expect(Math.abs(a.uRms!.value / Math.sqrt(s2 / (nx * ny)) - 1)).toBeLessThan(1e-12);
    // A bounded grid cannot be inverted: u and v stay unavailable, and the report says why.
    const bounded = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy, periodicY: false }, ['zeta'], 1, () => f),
      { beta },
    );
    expect(bounded.fields.u).toBeNull();
    expect(bounded.uRms).toBeNull();
  });

  it('derives ζ from u and v, and ψ by inversion when k_d ≠ 0, to form q', () => {
    const kd = 2;
    const f = randomGridFields({ nx, ny, Lx, Ly, kd, maxIx: 8, maxM: 8, seed: 7 });
    const direct = new ZonalMeanPlan({ nx, ny, Lx, Ly }, { beta }).compute(f);
    const a = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['u', 'v'], 1, () => f),
      { beta, kd },
    );
    expect(a.fields).toEqual({ u: 'file', v: 'file', zeta: 'uv', psi: 'inversion', q: 'zeta' });
    // v′q′ is blind to the mean of ψ, which the inversion cannot know.
    expect(maxAbsDiff(a.profiles.vpqp as number[], direct.vpqp)).toBeLessThan(1e-12);
    const p = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['psi'], 1, () => f),
      { beta, kd },
    );
    expect(p.fields).toEqual({ u: 'psi', v: 'psi', zeta: 'psi', psi: 'file', q: 'zeta' });
    expect(maxAbsDiff(p.profiles.ubar as number[], direct.ubar)).toBeLessThan(1e-12);
    // No PV or vorticity in the file: q̄ comes from ū by differences between rows, at the midpoints;
    // for modes up to |m| = 8 on 64 rows their second-order error is below (k dy)²/24 ≈ 3% of the
    // anomaly [derived: Taylor expansion of the centred difference], checked against the exact
    // profile interpolated to the midpoints.
    expect(p.qtot!.source).toMatch(/^from ū/);
    const exact = new ProfileFFT(ny, Ly).evaluate(
      direct.qtot.map((q, j) => q - beta * j * dy),
      p.qtot!.y,
    );
    const anomaly = p.qtot!.values.map((q, j) => q - beta * p.qtot!.y[j]);
    const offset = anomaly[0] - exact[0]; // ψ̄ is known up to a constant, so q̄ up to k_d² times it
    const scale = Math.max(...exact.map(Math.abs));
    anomaly.forEach((q, j) => expect(Math.abs(q - offset - exact[j])).toBeLessThan(0.05 * scale));
  });

  it('leaves missing values out of every mean and says which diagnostics they stopped', () => {
    const f = fields(0);
    const u = f.u.slice();
    for (let i = 0; i < nx; i += 4) u[10 * nx + i] = NaN; // a quarter of row 10
    for (let i = 0; i < nx; i++) u[40 * nx + i] = NaN; // all of row 40
    const a = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['u', 'v'], 2, () => ({ u, v: f.v })),
      { beta },
    );
    let s = 0;
    for (let i = 0; i < nx; i++) if (i % 4) s += u[10 * nx + i];
    expect(a.profiles.ubar[10]).toBeCloseTo(s / (nx - nx / 4), 14);
    expect(a.profiles.ubar[40]).toBeNull();
    expect(a.jets).toBeNull();
    expect(a.skipped).toContainEqual({
      diagnostic: 'jets',
      reason: 'ū is invalid at rows inside the domain (first at row 40): too few valid points there',
    });
    expect(a.skipped).toContainEqual({
      diagnostic: 'spectra and spectral flux',
      reason: 'every record had missing values (2); spectra need complete fields',
    });
  });

  it('cuts invalid rows off the edges of a bounded domain and works on what is left', () => {
    const f = fields(0);
    const u = f.u.slice();
    for (let i = 0; i < nx; i++) u[i] = u[(ny - 1) * nx + i] = NaN; // the polar rows, say
    const a = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy, periodicY: false }, ['u', 'v'], 1, () => ({ u, v: f.v })),
      { beta },
    );
    expect(a.jets).not.toBeNull();
    expect(a.notes.some((n) => n.startsWith('ū is invalid on 2 rows at the edges'))).toBe(true);
    expect(a.skipped).toContainEqual({
      diagnostic: 'spectra and spectral flux',
      reason: 'the grid is not periodic in y: Fourier spectra of a bounded field would be dominated by its edges',
    });
  });

  it('skips with reasons what needs β, ε, lengths or a power-of-two grid', () => {
    const f = fields(0);
    const none = analyzeUserRecords(arraySource({ nx, ny, dx, dy }, ['u', 'v'], 1, () => f));
    expect(none.skipped.map((s) => s.diagnostic)).toEqual(
      expect.arrayContaining(['PV staircase', 'Rhines scale, zonostrophy index']),
    );
    const noEps = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['u', 'v'], 1, () => f),
      { beta },
    );
    expect(noEps.scales.kRhines).not.toBeNull();
    expect(noEps.skipped).toContainEqual({
      diagnostic: 'zonostrophy index R_β',
      reason: 'needs the energy injection rate ε (files rarely carry it: give it)',
    });
    const withEps = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy }, ['u', 'v'], 1, () => f),
      { beta, eps: 1e-3 },
    );
    expect(withEps.scales.zonostrophyIndex).toBeCloseTo(
      Math.pow(beta ** 3 / 1e-3, 0.2) / (withEps.scales.kRhines as number),
      12,
    );
    const deg = analyzeUserRecords(
      arraySource({ nx, ny, dx: 1, dy: 1, lengthUnit: 'degrees', periodicY: false }, ['u', 'v'], 1, () => f),
      { beta },
    );
    expect(deg.fields.zeta).toBeNull();
    expect(deg.skipped.find((s) => s.diagnostic === 'spectra and spectral flux')?.reason).toMatch(
      /^the grid is in degrees/,
    );
    const odd = analyzeUserRecords(
      arraySource({ nx: 24, ny: 20, dx, dy }, ['u'], 1, () => ({
        u: new Float64Array(480).map((_, k) => Math.cos((2 * Math.PI * Math.floor(k / 24)) / 20)),
      })),
      { beta },
    );
    expect(odd.skipped.find((s) => s.diagnostic === 'spectra and spectral flux')?.reason).toBe(
      "the grid is 24 × 20: Stria's transforms need powers of two",
    );
    expect(odd.jets?.count).toBe(1);
  });

  it('decides an unstated periodicity by the edge test on the first record', () => {
    const f = fields(0);
    const a = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy, periodicX: null, periodicY: null }, ['u', 'v'], 1, () => f),
      { beta },
    );
    expect(a.grid.periodicX && a.grid.periodicY).toBe(true);
    expect(a.notes.filter((n) => n.includes('periodic by the edge test')).length).toBe(2);
    const forced = analyzeUserRecords(
      arraySource({ nx, ny, dx, dy, periodicX: null, periodicY: null }, ['u', 'v'], 1, () => f),
      { beta, periodic: { y: false } },
    );
    expect(forced.grid.periodicY).toBe(false);
  });

  it('reads one record at a time into buffers allocated once: memory does not grow with the records', () => {
    const recs = [0, 1, 2, 3].map((r) => fields(r));
    const run = (count: number) => {
      const meter = new AllocationMeter();
      const src = arraySource({ nx, ny, dx, dy }, ['u', 'v', 'zeta'], count, (r) => recs[r % 4]);
      const a = analyzeUserRecords(src, { beta, meter });
      expect(src.reads).toBe(count);
      return { meter, a };
    };
    const three = run(3);
    const twelve = run(12);
    expect(twelve.meter.retained).toBe(three.meter.retained);
    expect(twelve.meter.records).toBe(12);
    // The stated bound (docs/user-files.md): (fields read + derived + 1 scratch) × 8·nx·ny, plus the
    // spectral plans on a 2^k grid (≤ 32 × 8·nx·ny; 28 measured at 128²), plus ≤ 16 profiles of ny doubles.
    const N = 8 * nx * ny;
    const b = twelve.meter.byLabel;
    expect(b.get('fields')).toBe((3 + 1) * N); // u, v, ζ read; q derived (ζ from the file: no scratch)
    expect(
      (b.get('spectral plans') ?? 0) +
        (b.get('spectral scratch') ?? 0) +
        (b.get('spectral flux plan') ?? 0) +
        (b.get('spectra') ?? 0),
    ).toBeLessThanOrEqual(32 * N);
    expect((b.get('profiles') ?? 0) + (b.get('accumulators') ?? 0)).toBeLessThanOrEqual(16 * 8 * ny);
    expect(twelve.a.memory.retainedBytes).toBe(twelve.meter.retained);
  });

  it('takes the window of records asked for', () => {
    const recs = [0, 1, 2, 3, 4].map((r) => fields(r));
    const src = arraySource({ nx, ny, dx, dy }, ['u', 'v'], 5, (r) => recs[r]);
    const a = analyzeUserRecords(src, { beta, records: { start: 2, end: 4 } });
    expect(a.window).toMatchObject({ start: 2, end: 4, count: 2, timeStart: 20, timeEnd: 30 });
    expect(src.reads).toBe(2);
    expect(() => analyzeUserRecords(src, { records: { start: 4, end: 6 } })).toThrow(
      'records 4:6 are not a window of the 5 records of the file',
    );
  });
});
