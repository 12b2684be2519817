import { afterEach, describe, expect, it } from 'vitest';
import { RunMonitor } from '../../lib/analysis/runMonitor';
import { parseCsv } from '../../lib/io/csv';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { Model } from '../../lib/model/model';
import type { Snapshot } from '../../workers/simulationApi';
import { SimulationHost } from '../../workers/simulationHost';

// Small and fast; sampled every 4 fixed steps (binary fractions, so step sums hit the sample times exactly).
const SMALL = { nx: 32, ny: 32, kf: 6, dkf: 1, beta: 10, cfl: 0, dt: 1 / 128, eps: 0.1 };
const EVERY = 1 / 32;

async function stepsThenSnapshot(host: SimulationHost, n: number, after: number): Promise<Snapshot> {
  for (let i = 0; i < n; i++) await host.stepOnce();
  return host.nextSnapshot({ after });
}

describe('SimulationHost diagnostics', () => {
  let host: SimulationHost;
  afterEach(async () => {
    await host.dispose();
  });

  it('samples at equal model-time intervals and matches a RunMonitor driven directly', async () => {
    host = new SimulationHost();
    await host.init(SMALL, { sampleEvery: EVERY, meanSpan: 1 });
    const s = await stepsThenSnapshot(host, 20, 0);
    const st = s.diagnostics.status;
    expect(st.sampleEvery).toBe(EVERY);
    // Samples after steps 4, 8, …, 20.
    expect(st.samples).toBe(5);
    const direct = new Model(SMALL);
    const monitor = new RunMonitor(direct.params, { window: { kind: 'last', span: 1, cap: 256 } });
    let next = EVERY;
    let taken = 0;
    for (let i = 0; i < 20; i++) {
      monitor.step(direct.step(1));
      if (direct.time >= next) {
        taken++;
        next = (taken + 1) * EVERY;
        monitor.sample(direct.qHat, direct.time);
      }
    }
    monitor.meanProfiles();
    expect(st.jetCount).toBe(monitor.structure()!.jets.count);
    expect(st.lastSample).toBe(direct.time);
    expect(st.window?.count).toBe(5);
  });

  it('sends the payloads only of the diagnostics asked for, and only when they changed', async () => {
    host = new SimulationHost();
    await host.init(SMALL, { sampleEvery: EVERY });
    let s = await stepsThenSnapshot(host, 8, 0);
    expect([s.diagnostics.zonal, s.diagnostics.spectra, s.diagnostics.flux, s.diagnostics.hovmoller]).toEqual([
      null,
      null,
      null,
      null,
    ]);
    await host.setDiagnostics({ zonal: true, hovmoller: true, spectra: true, spectra2d: true, flux: true });
    s = await host.nextSnapshot({ after: s.version });
    const d = s.diagnostics;
    expect(d.zonal?.ubar.length).toBe(32);
    expect(d.zonal?.window.count).toBe(2);
    expect(d.zonal?.jets.every((j) => Number.isFinite(j.coreForcing))).toBe(true);
    expect(d.hovmoller?.columns).toBe(2);
    expect(d.hovmoller?.data.length).toBe(2 * 32);
    // Spectra and flux start from the state at once, one sample each.
    expect(d.spectra?.count).toBe(1);
    expect(d.spectra?.E2d?.length).toBe(d.spectra!.kx2d!.length * d.spectra!.ky2d!.length);
    expect(d.flux?.count).toBe(1);
    // Nothing new: nothing sent again.
    await host.setField('zeta');
    const again = await host.nextSnapshot({ after: s.version });
    expect(again.diagnostics.zonal).toBeNull();
    expect(again.diagnostics.spectra).toBeNull();
    // The next sample brings new ones (paused: sent at once, whatever the throttle).
    const later = await stepsThenSnapshot(host, 4, again.version);
    expect(later.diagnostics.zonal?.window.count).toBe(3);
    expect(later.diagnostics.spectra?.count).toBe(2);
    expect(later.diagnostics.flux?.conversion.length).toBe(2);
  });

  it('keeps the diagnostic history across a change of physical parameters, marks it, and restarts the means only when asked', async () => {
    host = new SimulationHost();
    await host.init(SMALL, { sampleEvery: EVERY });
    await host.setDiagnostics({ zonal: true, hovmoller: true, spectra: false, spectra2d: false, flux: false });
    const s0 = await stepsThenSnapshot(host, 8, 0);
    expect(s0.diagnostics.status.samples).toBe(2);
    expect(s0.changes).toEqual([]);
    const r = await host.reconfigure({ beta: 20 });
    expect(r).toMatchObject({ applied: true, how: 'inPlace', diagnostics: 'kept' });
    const s1 = await stepsThenSnapshot(host, 4, s0.version);
    // Same record: same epoch, the samples and the Hovmöller columns go on.
    expect(s1.diagnostics.status.epoch).toBe(s0.diagnostics.status.epoch);
    expect(s1.diagnostics.status.samples).toBe(3);
    expect(s1.diagnostics.hovmoller?.columns).toBe(3);
    expect(s1.diagnostics.zonal?.window.count).toBe(3);
    expect(s1.diagnostics.zonal?.beta).toBe(20);
    expect(s1.changes).toEqual([{ time: s0.time, steps: 8, keys: ['beta'], how: 'inPlace', diagnostics: 'kept' }]);
    // The steady-state test starts again at the change: new parameters move the steady state.
    expect(s1.diagnostics.status.summary.steady).toBe(false);
    // Asked to, the means start again; the record (samples, Hovmöller) stays.
    const st = await host.restartMeans();
    expect(st.samples).toBe(3);
    expect(st.window).toBeNull();
    const s2 = await stepsThenSnapshot(host, 4, s1.version);
    expect(s2.diagnostics.zonal?.window.count).toBe(1);
    expect(s2.diagnostics.hovmoller?.columns).toBe(4);
    await expect(host.setSampling({ sampleEvery: -1 })).rejects.toThrow(/sampleEvery/);
    await expect(host.setSampling({ spectralAverage: 2.5 })).rejects.toThrow(/spectralAverage/);
    // A new window keeps the samples count but starts the means again.
    const w = await host.setSampling({ meanSpan: 0.5 });
    expect(w.meanSpan).toBe(0.5);
    expect(w.epoch).toBe(s1.diagnostics.status.epoch);
  });

  it('restarts the diagnostics on a new grid, says so, and samples the new grid at once', async () => {
    host = new SimulationHost();
    await host.init(SMALL, { sampleEvery: EVERY });
    const s0 = await stepsThenSnapshot(host, 8, 0);
    const r = await host.reconfigure({ ny: 64 });
    expect(r).toMatchObject({ applied: true, how: 'regrid', diagnostics: 'restarted' });
    const s1 = await host.nextSnapshot({ after: s0.version });
    expect(s1.diagnostics.status.epoch).toBeGreaterThan(s0.diagnostics.status.epoch);
    expect(s1.diagnostics.status.samples).toBe(1);
    expect(s1.diagnostics.status.since).toBe(s0.time);
    expect(s1.changes).toEqual([{ time: s0.time, steps: 8, keys: ['ny'], how: 'regrid', diagnostics: 'restarted' }]);
  });

  it('shows a loaded state at once: its energies and CFL number as its next step reports them, and a first sample', async () => {
    host = new SimulationHost();
    await host.init(SMALL, { sampleEvery: EVERY });
    await stepsThenSnapshot(host, 10, 0);
    const cp = await host.checkpoint();
    const other = new SimulationHost();
    try {
      await other.restore(cp);
      await other.setDiagnostics({ zonal: true, hovmoller: true, spectra: false, spectra2d: false, flux: false });
      const s = await other.nextSnapshot({ after: 0 });
      expect(s.steps).toBe(10);
      expect(s.diagnostics.status.samples).toBe(1);
      expect(s.diagnostics.zonal?.window.count).toBe(1);
      expect(s.diagnostics.hovmoller?.columns).toBe(1);
      // The next step's report gives the same quantities at its start: grid means against spectral
      // sums, equal by Parseval to round-off [derived: lib/model/grid.ts normalisation].
      const next = await other.stepOnce();
      for (const [shown, stepped] of [
        [s.report.energy.value, next.energy.value],
        [s.report.kinetic, next.kinetic],
        [s.report.enstrophy.value, next.enstrophy.value],
        [s.report.cfl, next.cfl],
      ])
        expect(Math.abs(shown - stepped)).toBeLessThanOrEqual(1e-12 * Math.abs(stepped));
      expect(s.report.energy.value).toBeGreaterThan(0);
    } finally {
      await other.dispose();
    }
  });

  it('exports the state and the zonal means as files that read back', async () => {
    host = new SimulationHost();
    await host.init(SMALL, { sampleEvery: EVERY });
    await stepsThenSnapshot(host, 12, 0);
    const snap = await host.exportFile('snapshot');
    expect(Array.from(snap.bytes.subarray(0, 3), (b) => String.fromCharCode(b)).join('')).toBe('CDF');
    const nc = readNetcdf(snap.bytes);
    expect(nc.variable('u').shape).toEqual([1, 32, 32]);
    const direct = new Model(SMALL);
    direct.step(12);
    expect(Array.from(nc.readRecord('u', 0))).toEqual(Array.from(direct.field('u')));
    const zonal = readNetcdf((await host.exportFile('zonal-netcdf')).bytes);
    expect(zonal.numRecords).toBe(3);
    // The sample times: after steps 4, 8 and 12 of the same run.
    const sampleModel = new Model(SMALL);
    const times = [4, 8, 12].map(() => sampleModel.step(4).time);
    expect(Array.from(zonal.readVariable('time'))).toEqual(times);
    const csv = parseCsv((await host.exportFile('zonal-csv')).bytes);
    expect(csv.header).toEqual(['time', 'step', 'y', 'ubar', 'qbar', 'upvp', 'vpqp', 'eke']);
    expect(csv.rows.length).toBe(3 * 32);
  });
});
