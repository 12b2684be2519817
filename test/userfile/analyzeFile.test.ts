import { describe, expect, it } from 'vitest';
import { AllocationMeter } from '../../lib/io/allocationMeter';
import { staircaseSpacing } from '../../lib/analysis/scales';
import { analyzeFile } from '../../lib/userfile/analyzeFile';
import { memorySource } from '../../lib/io/byteSource';
import { fileAnalysisText } from '../../lib/userfile/report';
import { cdl, type CdlVariable } from '../support/cdl';
import { eddy, staircaseProfile } from '../support/jetFields';
import { ncgen, runNcgen, type NcgenKind } from '../io/ncgenTool';

/**
 * End to end on files the NetCDF reference library wrote (ncgen): the ideal PV staircase of
 * Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008) [published] — steps of width L, ū =
 * (β/2)(η² − L²/12), ζ̄ = −βη, jets at the edges — with eddies that average out along x, recovered
 * as L, the jet count and spacing, and a staircase index of 1 (exact here: the vorticity steps and
 * the arcs between rows are sampled exactly; CHECKS asks ~1e-2 of gridded fields).
 */
const [nx, ny, nt] = [32, 128, 8];
const [Lx, Ly, jets] = [4e6, 8e6, 4]; // m
const beta = 1.6e-11;
const L = Ly / jets;
const [dx, dy] = [Lx / nx, Ly / ny];
const EDGE0 = 0.37 * dy + 1e5; // the jets fall between grid rows

function staircaseFile(storage: Record<string, string | number | number[]> = {}, withZeta = true) {
  const u: number[] = [];
  const v: number[] = [];
  const z: number[] = [];
  for (let t = 0; t < nt; t++) {
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const s = staircaseProfile(j * dy, L, beta, EDGE0);
        const e = eddy(i * dx, j * dy, 2e5, 3, 5, Lx, Ly, t);
        u.push(s.u + e.u);
        v.push(e.v);
        z.push(s.zeta + e.zeta);
      }
    }
  }
  const field = (name: string, sn: string | null, units: string, data: number[]): CdlVariable => ({
    name,
    type: 'double',
    dims: ['time', 'y', 'x'],
    attrs: { ...(sn ? { standard_name: sn } : {}), units, ...storage },
    data,
  });
  return cdl({
    dims: [
      { name: 'time', size: 'unlimited' },
      { name: 'y', size: ny },
      { name: 'x', size: nx },
    ],
    vars: [
      {
        name: 'time',
        type: 'double',
        dims: ['time'],
        attrs: { units: 'days since 2000-01-01' },
        data: [0, 1, 2, 3, 4, 5, 6, 7],
      },
      {
        name: 'y',
        type: 'double',
        dims: ['y'],
        attrs: { units: 'km', axis: 'Y' },
        data: Array.from({ length: ny }, (_, j) => (j * dy) / 1000),
      },
      {
        name: 'x',
        type: 'double',
        dims: ['x'],
        attrs: { units: 'km', axis: 'X' },
        data: Array.from({ length: nx }, (_, i) => (i * dx) / 1000),
      },
      field('U', 'eastward_wind', 'm s-1', u),
      field('V', 'northward_wind', 'm s-1', v),
      ...(withZeta ? [field('vort', null, 's-1', z)] : []),
    ],
  });
}

function expectStaircase(r: ReturnType<typeof analyzeFile>) {
  const a = r.analysis;
  expect(a.grid).toMatchObject({ periodicX: true, periodicY: true, lengthUnit: 'm' });
  expect(a.jets!.count).toBe(jets);
  expect(Math.abs(a.jets!.meanSpacing! / L - 1)).toBeLessThan(1e-12);
  a.jets!.jets.forEach((j, k) => expect(Math.abs(j.y - (EDGE0 + k * L))).toBeLessThan(dy));
  expect(a.staircase!.edges.length).toBe(jets);
  expect(Math.abs(a.staircase!.meanWidth! / L - 1)).toBeLessThan(1e-12);
  a.staircase!.jumps.forEach((h) => expect(Math.abs(h / (beta * L) - 1)).toBeLessThan(1e-10)); // jumps βL [published]
  expect(Math.abs(a.staircase!.index! - 1)).toBeLessThan(1e-2); // CHECKS: gridded fields at ~1e-2
  expect(Math.abs(a.staircase!.index! - 1)).toBeLessThan(1e-10); // and exact for these samples
}

describe.runIf(runNcgen)('stria analyze, the library: files written by ncgen', () => {
  for (const [kind, storage, label] of [
    ['nc3', {}, 'NetCDF-3 classic'],
    ['nc6', {}, 'NetCDF-3 64-bit offset'],
    ['nc4', {}, 'netCDF-4'],
    ['nc4', { _ChunkSizes: [1, 64, 32], _DeflateLevel: 1, _Shuffle: 'true' }, 'netCDF-4, deflate and chunks'],
  ] as [NcgenKind, Record<string, string | number | number[]>, string][]) {
    it(`recovers the ideal staircase: L, the jet count and spacing, index 1 (${label})`, () => {
      const r = analyzeFile(memorySource(ncgen(staircaseFile(storage), kind)), {
        beta,
        domain: { x: Lx / 1000, y: Ly / 1000 },
      });
      expect(r.file.fields).toMatchObject({ u: { variable: 'U' }, v: { variable: 'V' }, zeta: { variable: 'vort' } });
      expect(r.analysis.qtot?.source).toMatch(/^zonal mean of the PV anomaly q \(q = ζ − k_d²ψ\)/);
      expectStaircase(r);
      expect(r.analysis.spectra?.kind).toBe('pv');
    });
  }

  it('recovers the staircase from a zonal-mean wind on (time, y) alone, and L from U_rms', () => {
    // Jets on grid rows this time: the total PV from ū alone is then exact at every midpoint.
    const u = Array.from({ length: nt * ny }, (_, k) => staircaseProfile((k % ny) * dy, L, beta, 5 * dy).u);
    const text = cdl({
      dims: [
        { name: 'time', size: 'unlimited' },
        { name: 'y', size: ny },
      ],
      vars: [
        {
          name: 'y',
          type: 'double',
          dims: ['y'],
          attrs: { units: 'm', modulo: Ly },
          data: Array.from({ length: ny }, (_, j) => j * dy),
        },
        { name: 'ubar', type: 'float', dims: ['time', 'y'], attrs: { units: 'm s-1' }, data: u },
      ],
    });
    const r = analyzeFile(memorySource(ncgen(text, 'nc4')), { beta });
    const a = r.analysis;
    expect(r.file.layout).toBe('zonal-mean');
    expect(a.jets!.count).toBe(jets);
    expect(a.staircase!.edges.length).toBe(jets);
    expect(Math.abs(a.staircase!.meanWidth! / L - 1)).toBeLessThan(1e-12);
    expect(Math.abs(a.staircase!.index! - 1)).toBeLessThan(1e-6); // float32 ū
    // u_rms² = β²L⁴/720, so L = 720^{1/4}(U_rms/β)^½ [published] Dritschel & McIntyre 2008, factor [derived]; on a grid ~1e-2.
    expect(a.uRms!.kind).toBe('zonal mean');
    expect(Math.abs(staircaseSpacing(beta, a.uRms!.value) / L - 1)).toBeLessThan(1e-2);
    expect(a.skipped.map((s) => s.diagnostic)).toContain('spectra and spectral flux');
  });

  it('reads the eddy profiles stored beside ū, and takes U_rms from ū and EKE', () => {
    const ubar = Array.from({ length: nt * ny }, (_, k) => staircaseProfile((k % ny) * dy, L, beta, 5 * dy).u);
    const eke = Array.from({ length: nt * ny }, (_, k) => 0.5 + 0.25 * Math.cos((2 * Math.PI * (k % ny)) / ny));
    const upvp = Array.from({ length: nt * ny }, (_, k) => 0.1 * Math.sin((2 * Math.PI * (k % ny)) / ny));
    const profile = (name: string, units: string, data: number[]): CdlVariable => ({
      name,
      type: 'double',
      dims: ['time', 'y'],
      attrs: { units },
      data,
    });
    const text = cdl({
      dims: [
        { name: 'time', size: 'unlimited' },
        { name: 'y', size: ny },
      ],
      vars: [
        {
          name: 'y',
          type: 'double',
          dims: ['y'],
          attrs: { units: 'm', modulo: Ly },
          data: Array.from({ length: ny }, (_, j) => j * dy),
        },
        profile('ubar', 'm s-1', ubar),
        profile('upvp', 'm2 s-2', upvp),
        profile('eke', 'J kg-1', eke),
      ],
    });
    const r = analyzeFile(memorySource(ncgen(text, 'nc3')), { beta });
    const a = r.analysis;
    expect(Object.keys(r.file.fields).sort()).toEqual(['eke', 'ubar', 'upvp']);
    // ⟨u² + v²⟩ = ⟨ū²⟩ + 2⟨EKE⟩ with v̄ = 0 [derived]; the cosine averages out over whole periods.
    const u2 = ubar.slice(0, ny).reduce((s, x) => s + x * x, 0) / ny;
    expect(a.uRms!.kind).toBe('zonal mean and eddy kinetic energy');
    expect(a.uRms!.value).toBeCloseTo(Math.sqrt(u2 + 2 * 0.5), 12);
    expect(a.profiles.upvp![7]).toBeCloseTo(upvp[7], 15);
    expect(a.profiles.eke![3]).toBeCloseTo(eke[3], 15);
    expect(a.computed).toEqual(expect.arrayContaining(['eddy momentum flux u′v′', 'eddy kinetic energy']));
  });

  it('counts the jets of a longitude/latitude field on the tangent plane, and says the sphere is approximated', () => {
    // Five jets across 20°N–70°N, latitude stored north to south; u = cos(2π·5(φ − 20)/50)·10 m/s plus a wave in λ.
    const [nlon, nlat] = [72, 101];
    const lat = Array.from({ length: nlat }, (_, j) => 70 - 0.5 * j);
    const lon = Array.from({ length: nlon }, (_, i) => 5 * i);
    const u: number[] = [];
    for (const phi of lat)
      for (const lam of lon)
        u.push(10 * Math.cos((2 * Math.PI * 5 * (phi - 20)) / 50 + 0.3) + Math.sin((3 * lam * Math.PI) / 180));
    const text = cdl({
      dims: [
        { name: 'time', size: 1 },
        { name: 'lat', size: nlat },
        { name: 'lon', size: nlon },
      ],
      vars: [
        { name: 'lat', type: 'float', dims: ['lat'], attrs: { units: 'degrees_north' }, data: lat },
        { name: 'lon', type: 'float', dims: ['lon'], attrs: { units: 'degrees_east' }, data: lon },
        {
          name: 'ua',
          type: 'float',
          dims: ['time', 'lat', 'lon'],
          attrs: { units: 'm s-1', standard_name: 'eastward_wind' },
          data: u,
        },
      ],
    });
    const bytes = ncgen(text, 'nc4');
    const r = analyzeFile(memorySource(bytes), { planet: 'earth', lat0: 45 });
    // β(45°) = 2Ω cos 45°/R₁ = 1.6186774e-11 m⁻¹s⁻¹ [derived] from Ω and R₁ of GRS 1980 [published] (Moritz 2000).
    expect(Math.abs(r.parameters.beta!.value / 1.6186774e-11 - 1)).toBeLessThan(1e-7);
    expect(r.plane).toMatchObject({ lat0: 45 });
    const a = r.analysis;
    expect(a.grid.periodicX).toBe(true); // 72 × 5° = 360°
    expect(a.grid.periodicY).toBe(false);
    // Jets where the cosine peaks: φ = 20 + 10k − 0.3·10/(2π), inside (20°, 70°) for k = 0..4 (the
    // first is 0.48° from the southern edge, within the edge margin, so not counted).
    const R = 6_371_008.7714;
    const want = [1, 2, 3, 4]
      .map((k) => 20 + 10 * k - (0.3 * 50) / (2 * Math.PI * 5))
      .map((phi) => (R * (phi - 45) * Math.PI) / 180);
    expect(a.jets!.count).toBe(4);
    a.jets!.jets.forEach((j, k) => expect(Math.abs(j.y - want[k])).toBeLessThan(0.5 * a.grid.dy));
    expect(Math.abs(a.jets!.meanSpacing! / ((R * 10 * Math.PI) / 180) - 1)).toBeLessThan(0.02);
    const text2 = fileAnalysisText(r, 'winds.nc');
    expect(text2).toContain('This approximates the spherical geometry');
    expect(text2).toContain('x = R cos φ0 (λ − λ0), y = R (φ − φ0)');
    // Without a planet the same file stays in degrees and what needs lengths is skipped, with the reason.
    const deg = analyzeFile(memorySource(bytes), {});
    expect(deg.analysis.grid.lengthUnit).toBe('degrees');
    expect(deg.analysis.jets!.count).toBe(4);
    expect(deg.analysis.skipped.find((s) => s.diagnostic === 'Rhines scale, zonostrophy index')?.reason).toBe(
      'the grid is in degrees: lengths need the tangent plane',
    );
    // Its numbers are labelled in the file's own units: m/s for the wind, degrees for lengths.
    expect(deg.comparison.labels).toMatchObject({ velocity: 'm/s', length: '°', wavenumber: 'rad/°' });
    const degText = fileAnalysisText(deg, 'winds.nc');
    expect(degText).not.toContain('model');
    expect(degText).toMatch(/rms velocity U +\d[\d.e-]* +— +— +m\/s\n/);
    expect(degText).toMatch(/jet spacing vs the Rhines spacing +\d[\d.e-]* +— +— +°\n/);
  });

  it('masks fill values and missing_value, counts them, and never averages them in', () => {
    const n = 16;
    const u: (number | null)[] = [];
    for (let j = 0; j < n; j++)
      for (let i = 0; i < n; i++) u.push(j === 3 && i < 4 ? null : j === 5 && i === 7 ? -1e30 : j + i / 100);
    const text = cdl({
      dims: [
        { name: 'y', size: n },
        { name: 'x', size: n },
      ],
      vars: [
        {
          name: 'y',
          type: 'double',
          dims: ['y'],
          attrs: { units: 'km' },
          data: Array.from({ length: n }, (_, j) => j),
        },
        {
          name: 'x',
          type: 'double',
          dims: ['x'],
          attrs: { units: 'km' },
          data: Array.from({ length: n }, (_, i) => i),
        },
        {
          name: 'u',
          type: 'float',
          dims: ['y', 'x'],
          attrs: { units: 'm s-1', _FillValue: -999, missing_value: -1e30 },
          data: u,
        },
      ],
    });
    for (const kind of ['nc3', 'nc4'] as const) {
      const r = analyzeFile(memorySource(ncgen(text, kind)), { periodic: { x: false, y: false } });
      expect(r.masking.u).toMatchObject({ total: n * n, fill: 5, nonFinite: 0, outOfRange: 0, masked: 5 });
      const ub = r.analysis.profiles.ubar as number[];
      const rowMean = (j: number, skip: (i: number) => boolean) => {
        const xs = Array.from({ length: n }, (_, i) => i)
          .filter((i) => !skip(i))
          .map((i) => Math.fround(j + i / 100));
        return xs.reduce((a, b) => a + b, 0) / xs.length;
      };
      expect(ub[3]).toBeCloseTo(
        rowMean(3, (i) => i < 4),
        12,
      );
      expect(ub[5]).toBeCloseTo(
        rowMean(5, (i) => i === 7),
        12,
      );
      expect(fileAnalysisText(r)).toContain(
        'u     5 of 256 (1.95%): 5 fill or missing_value, 0 NaN/Inf, 0 outside the valid range',
      );
    }
  });

  it('refuses bad files with a message naming the problem', () => {
    const good = ncgen(staircaseFile({}, false), 'nc3');
    const good4 = ncgen(staircaseFile({}, false), 'nc4');
    expect(() => analyzeFile(memorySource(new TextEncoder().encode('time,u\n0,1\n')))).toThrow(
      /^not a NetCDF file: it starts with bytes 74 69 6d 65/,
    );
    expect(() => analyzeFile(memorySource(good.subarray(0, good.length - 1000)))).toThrow(
      /^truncated NetCDF file: record 7 of "\w+" ends at byte \d+ but the file has \d+ bytes$/,
    );
    expect(() => analyzeFile(memorySource(good4.subarray(0, good4.length - 1000)))).toThrow(
      /^truncated HDF5 file: its superblock says the file is \d+ bytes long/,
    );
    expect(() => analyzeFile(memorySource(good), { map: { zeta: 'vorticity' } })).toThrow(
      /^missing variable: the mapping names "vorticity" for zeta, but the file has "time", "y", "x", "U", "V"$/,
    );
    const bare = cdl({
      dims: [{ name: 'n', size: 3 }],
      vars: [{ name: 'temp', type: 'float', dims: ['n'], attrs: { units: 'K' }, data: [1, 2, 3] }],
    });
    expect(() => analyzeFile(memorySource(ncgen(bare, 'nc3')))).toThrow(/^missing variables: no field to analyse/);
    const irregular = staircaseFile({}, false).replace(
      /^ {2}y = 0,.*;$/m,
      `  y = ${Array.from({ length: ny }, (_, j) => (j * dy) / 1000 + (j === 77 ? 20 : 0)).join(', ')} ;`,
    );
    expect(() => analyzeFile(memorySource(ncgen(irregular, 'nc4')))).toThrow(
      'irregular grid: axis "y" is not regularly spaced — its worst deviation from a regular spacing of 62.5 is 20 at index 77 (32% of the spacing',
    );
  });

  it('keeps memory bounded: one record at a time, nothing retained per record, chunk buffers dropped', () => {
    const run = (text: string, kind: NcgenKind, records: string) => {
      const meter = new AllocationMeter();
      const r = analyzeFile(memorySource(ncgen(text, kind)), {
        beta,
        domain: { x: Lx / 1000, y: Ly / 1000 },
        records,
        meter,
      });
      return { meter, r };
    };
    const text = staircaseFile({ _ChunkSizes: [1, 32, 32], _DeflateLevel: 1 });
    const one = run(text, 'nc4', '0:1');
    const all = run(text, 'nc4', '0:3');
    expect(all.meter.retained).toBe(one.meter.retained);
    // Per record and field four chunks of 32·32 doubles are inflated one at a time: at most the
    // stored and the decoded copy of each, summed over the record's 12 chunks.
    const chunk = 32 * 32 * 8;
    expect(all.meter.peakTransient).toBeGreaterThan(0);
    expect(all.meter.peakTransient).toBeLessThanOrEqual(3 * 4 * 2 * chunk);
    const nc3 = run(staircaseFile(), 'nc3', '0:3');
    expect(nc3.meter.peakTransient).toBe(0); // classic files are read into one reused buffer
    expect(nc3.r.analysis.memory.retainedBytes).toBe(nc3.meter.retained);
  });
});
