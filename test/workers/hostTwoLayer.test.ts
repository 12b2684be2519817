import { afterEach, describe, expect, it } from 'vitest';
import { LayerSpectraPlan } from '../../lib/analysis/layerSpectra';
import { RunMonitor } from '../../lib/analysis/runMonitor';
import { parseCsv } from '../../lib/io/csv';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { Model } from '../../lib/model/model';
import { SimulationHost } from '../../workers/simulationHost';

// A small two-layer run sampled every 4 fixed steps (binary fractions: the step sums hit the sample times).
const TWO = {
  nx: 32,
  ny: 32,
  layers: 2,
  kd: 4,
  shear: 1,
  beta: 0.5,
  mu: 0.1,
  forcing: 'none',
  eps: 0,
  kf: 3,
  dkf: 1,
  init_energy: 1e-3,
  cfl: 0,
  dt: 1 / 128,
} as const;
const EVERY = 1 / 32;

describe('SimulationHost with two layers', () => {
  let host: SimulationHost;
  afterEach(async () => {
    await host.dispose();
  });

  it('sends the layers payload: per-layer zonal means, heat flux and energy cycle as a RunMonitor driven directly has them', async () => {
    host = new SimulationHost();
    await host.init(TWO, { sampleEvery: EVERY, meanSpan: 1 });
    await host.setDiagnostics({
      zonal: true,
      hovmoller: false,
      spectra: false,
      spectra2d: false,
      flux: false,
      layers: true,
    });
    for (let i = 0; i < 16; i++) await host.stepOnce();
    const s = await host.nextSnapshot({ after: 0 });
    const L = s.diagnostics.layers!;
    expect(L).not.toBeNull();
    const direct = new Model(TWO);
    const monitor = new RunMonitor(direct.params, { window: { kind: 'last', span: 1, cap: 256 } });
    let next = EVERY;
    let taken = 0;
    for (let i = 0; i < 16; i++) {
      monitor.step(direct.step(1));
      if (direct.time >= next) {
        taken++;
        next = (taken + 1) * EVERY;
        monitor.sample(direct.qHat, direct.time);
      }
    }
    const m = monitor.layers!;
    expect(Array.from(L.ubar1)).toEqual(Array.from(m.latest.upper.ubar));
    expect(Array.from(L.ubar2)).toEqual(Array.from(m.latest.lower.ubar));
    expect(Array.from(L.heat)).toEqual(Array.from(m.latest.heatFlux));
    expect(L.window?.count).toBe(4);
    // The cycle over the window of the profiles' time means (sample times), as CycleSeries has it.
    const whole = m.cycle.timeMean(L.window!.tStart, L.window!.tEnd);
    expect(L.series.terms.generation.length).toBe(m.cycle.length);
    expect(L.windowCycle!.terms.generation).toBeCloseTo(whole.mean.generation, 12);
    // The Q_i of the layers: β ± F_i (U₁ − U₂) with F₁ = F₂ = k_d²/2 at δ = 1 [derived, docs/two-layer.md].
    expect(L.Q1).toBeCloseTo(0.5 + 8, 12);
    expect(L.Q2).toBeCloseTo(0.5 - 8, 12);
  });

  it('sends the barotropic and baroclinic spectra only when asked, the mean of LayerSpectraPlan over the samples', async () => {
    host = new SimulationHost();
    await host.init(TWO, { sampleEvery: EVERY, meanSpan: 1, spectralAverage: 2 });
    const none = { zonal: false, hovmoller: false, spectra: false, spectra2d: false, flux: false };
    await host.setDiagnostics({ ...none, flux: true });
    for (let i = 0; i < 4; i++) await host.stepOnce();
    expect((await host.nextSnapshot({ after: 0 })).diagnostics.layerSpectra).toBeNull();
    await host.setDiagnostics({ ...none, layerSpectra: true });
    for (let i = 0; i < 8; i++) await host.stepOnce();
    const s = await host.nextSnapshot({ after: 0 });
    const P = s.diagnostics.layerSpectra!;
    // Asked for at step 4 (sampled at once), then the samples at steps 8 and 12: the last two are averaged.
    expect(P.count).toBe(2);
    const direct = new Model(TWO);
    const plan = new LayerSpectraPlan(direct.params);
    const states: Float64Array[] = [];
    for (let i = 1; i <= 12; i++) {
      direct.step(1);
      if (i === 8 || i === 12) states.push(direct.qHat.slice());
    }
    const [a, b] = states.map((q) => plan.compute(q));
    const mean = (x: Float64Array, y: Float64Array) => Array.from(x, (v, i) => (v + y[i]) / 2);
    expect(Array.from(P.kineticBaroclinic)).toEqual(mean(a.kineticBaroclinic, b.kineticBaroclinic));
    expect(Array.from(P.exchange)).toEqual(mean(a.exchange, b.exchange));
    expect(Array.from(P.fluxBarotropic)).toEqual(mean(a.fluxBarotropic, b.fluxBarotropic));
    expect(P.netExchange).toBe((a.netExchange + b.netExchange) / 2);
    expect([P.tStart, P.tEnd]).toEqual([8 / 128, 12 / 128]);
    // Once no view asks, the plan is let go; asked again, the average starts from the state as it is.
    await host.setDiagnostics({ ...none, flux: true });
    await host.setDiagnostics({ ...none, layerSpectra: true });
    const again = (await host.nextSnapshot({ after: 0 })).diagnostics.layerSpectra!;
    expect(again.count).toBe(1);
    expect(Array.from(again.exchange)).toEqual(Array.from(b.exchange));
  });

  it('exports the state of both layers as the layered snapshot file, each layer as the model has it', async () => {
    host = new SimulationHost();
    await host.init(TWO);
    for (let i = 0; i < 3; i++) await host.stepOnce();
    const file = await host.exportFile('snapshot');
    expect(file.description).toMatch(/of both layers on 32 × 32/);
    const nc = readNetcdf(file.bytes);
    expect(nc.variable('u').shape).toEqual([1, 2, 32, 32]);
    const direct = new Model(TWO);
    direct.step(3);
    const u = nc.readRecord('u', 0);
    expect(Array.from(u.slice(0, 32 * 32))).toEqual(Array.from(direct.field('u', undefined, 'upper')));
    expect(Array.from(u.slice(32 * 32))).toEqual(Array.from(direct.field('u', undefined, 'lower')));
  });

  it('exports the zonal means as the layered file and CSV: each layer and the heat flux, as the monitor samples them', async () => {
    host = new SimulationHost();
    await host.init(TWO, { sampleEvery: EVERY });
    for (let i = 0; i < 8; i++) await host.stepOnce();
    const nc = readNetcdf((await host.exportFile('zonal-netcdf')).bytes);
    expect(nc.numRecords).toBe(2);
    expect(nc.variable('ubar').shape).toEqual([2, 2, 32]);
    expect(nc.variable('heat_flux').shape).toEqual([2, 32]);
    const direct = new Model(TWO);
    const monitor = new RunMonitor(direct.params);
    for (let i = 0; i < 8; i++) monitor.step(direct.step(1));
    monitor.sample(direct.qHat, direct.time);
    const z = monitor.layers!.latest;
    const ubar = nc.readRecord('ubar', 1);
    expect(Array.from(ubar.slice(0, 32))).toEqual(Array.from(z.upper.ubar));
    expect(Array.from(ubar.slice(32))).toEqual(Array.from(z.lower.ubar));
    expect(Array.from(nc.readRecord('heat_flux', 1))).toEqual(Array.from(z.heatFluxPlain));
    const csv = parseCsv((await host.exportFile('zonal-csv')).bytes);
    expect(csv.header).toEqual([
      'time',
      'step',
      'y',
      'ubar1',
      'ubar2',
      'qbar1',
      'qbar2',
      'upvp1',
      'upvp2',
      'vpqp1',
      'vpqp2',
      'eke1',
      'eke2',
      'heat_flux',
    ]);
    expect(csv.rows.length).toBe(2 * 32);
    expect(Number(csv.rows[32 + 5][4])).toBe(z.lower.ubar[5]);
  });

  it('resumes a two-layer checkpoint bit for bit, with the layers diagnosed from there', async () => {
    host = new SimulationHost();
    await host.init(TWO, { sampleEvery: EVERY });
    for (let i = 0; i < 4; i++) await host.stepOnce();
    const cp = await host.checkpoint();
    for (let i = 0; i < 4; i++) await host.stepOnce();
    const goneOn = await host.nextSnapshot({ after: 0 });
    await host.restore(cp);
    await host.setDiagnostics({
      zonal: false,
      hovmoller: false,
      spectra: false,
      spectra2d: false,
      flux: false,
      layers: true,
    });
    for (let i = 0; i < 4; i++) await host.stepOnce();
    const resumed = await host.nextSnapshot({ after: 0 });
    expect(resumed.params.layers).toBe(2);
    expect(resumed.checksum).toBe(goneOn.checksum);
    expect(resumed.diagnostics.layers?.ubar1.length).toBe(32);
  });

  it('averages over the flow memory 1/(μh₂) by default: the drag acts on the lower layer only [derived, docs/two-layer.md]', async () => {
    host = new SimulationHost();
    await host.init({ ...TWO, depth_ratio: 0.25 });
    await host.stepOnce();
    const s = await host.nextSnapshot({ after: 0 });
    // h₂ = 1/(1 + δ) = 0.8, so 1/(μh₂) = 1/(0.1 × 0.8) = 12.5.
    expect(s.diagnostics.status.meanSpan).toBeCloseTo(12.5, 12);
  });

  it('shows the field of the chosen layer view, and a new number of layers starts a new run', async () => {
    host = new SimulationHost();
    await host.init(TWO);
    await host.stepOnce();
    await host.setLayerView('upper');
    let s = await host.nextSnapshot({ after: 0 });
    expect(s.layerView).toBe('upper');
    const direct = new Model(TWO);
    direct.step();
    expect(Array.from(s.values)).toEqual(Array.from(direct.field('u', undefined, 'upper')));
    await host.setLayerView('baroclinic');
    s = await host.nextSnapshot({ after: s.version });
    expect(Array.from(s.values)).toEqual(Array.from(direct.field('u', undefined, 'baroclinic')));
    await expect(host.setLayerView('middle' as 'upper')).rejects.toThrow(RangeError);
    const epoch = s.epoch;
    const r = await host.reconfigure({ layers: 1, shear: 0, depth_ratio: 1 });
    expect(r.applied && r.how).toBe('fresh');
    s = await host.nextSnapshot({ after: s.version });
    expect(s.epoch).toBe(epoch + 1);
    expect(s.time).toBe(0);
  });
});
