import { describe, expect, it } from 'vitest';
import { estimateRunMemory } from '../../lib/run/runMemory';
import { BUDGET_ROWS_MAX_BYTES, layerSpectraBytes, viewDiagnosticsBytes } from '../../workers/diagnosticsMemory';
import { LayerSpectralDiagnostics } from '../../workers/layerSpectralDiagnostics';
import { validateParams } from '../../lib/model/validateParams';
import { Model } from '../../lib/model/model';
import { MAX_SPECTRAL_AVERAGE } from '../../workers/diagnosticsPublisher';
import { SimulationHost } from '../../workers/simulationHost';
import { reachableArrayBytes } from '../support/reachableBytes';

// Private parts of the host, read only to count the arrays they hold.
interface HostParts {
  model: { params: Parameters<typeof estimateRunMemory>[0] };
  rows: unknown;
  diagnostics: unknown;
}

describe('memory of the views in the worker', () => {
  it("counts every typed array the diagnostics of a host with every view shown hold beyond the run's measurement, exactly", async () => {
    for (const [nx, ny, Lx, Ly] of [
      [32, 32, 2 * Math.PI, 2 * Math.PI],
      [64, 32, 4 * Math.PI, 2 * Math.PI],
      [32, 128, 2 * Math.PI, 8 * Math.PI],
      [128, 128, 2 * Math.PI, 2 * Math.PI],
      [256, 128, 3, 5],
    ]) {
      const host = new SimulationHost();
      await host.init(
        { nx, ny, Lx, Ly, kf: (6 * (2 * Math.PI)) / Math.min(Lx, Ly), dkf: (1.5 * (2 * Math.PI)) / Math.min(Lx, Ly) },
        { sampleEvery: 0.01, spectralAverage: MAX_SPECTRAL_AVERAGE },
      );
      await host.setDiagnostics({ zonal: true, hovmoller: true, spectra: true, spectra2d: true, flux: true });
      for (let i = 0; i < 3; i++) await host.stepOnce();
      const parts = host as unknown as HostParts;
      const run = estimateRunMemory(parts.model.params);
      const measurement = run.items[1].bytes;
      // The budget rows are counted at their largest; the host holds them as they are now.
      const rows = reachableArrayBytes(parts.rows).bytes;
      expect(viewDiagnosticsBytes({ nx, ny, Lx, Ly }) - BUDGET_ROWS_MAX_BYTES + rows, `${nx}×${ny}`).toBe(
        reachableArrayBytes(parts.diagnostics, parts.rows).bytes - measurement,
      );
      await host.dispose();
    }
  });

  it('counts every typed array the two-layer spectra hold while asked for, exactly', () => {
    for (const [nx, ny, Lx, Ly] of [
      [32, 32, 2 * Math.PI, 2 * Math.PI],
      [64, 32, 4 * Math.PI, 2 * Math.PI],
      [128, 64, 3, 5],
    ]) {
      const p = validateParams({ nx, ny, Lx, Ly, layers: 2, kd: 4, shear: 1, forcing: 'none', eps: 0 });
      const d = new LayerSpectralDiagnostics(p, MAX_SPECTRAL_AVERAGE);
      d.add(new Model(p).qHat, 0);
      expect(layerSpectraBytes({ nx, ny, Lx, Ly }), `${nx}×${ny}`).toBe(reachableArrayBytes(d).bytes);
    }
  });

  it('keeps one copy of the state as the rescue point (src/appMemory.ts counts it among the kept states)', async () => {
    const host = new SimulationHost();
    await host.init({ nx: 64, ny: 32, kf: 6, dkf: 1.5 });
    await host.stepOnce();
    const { rescue } = host as unknown as { rescue: unknown };
    expect(reachableArrayBytes(rescue).bytes).toBe(16 * 32 * (64 / 2 + 1));
    await host.dispose();
  });
});
