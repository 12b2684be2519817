import { describe, expect, it } from 'vitest';
import { LayerSnapshotPlan } from '../../lib/analysis/layerSnapshot';
import { SnapshotPlan } from '../../lib/analysis/snapshot';
import { Model } from '../../lib/model/model';
import { modelMemory, forcedModesForCost } from '../../lib/plan/cost';
import { MonitoredRun } from '../../lib/run/monitoredRun';
import { resolveRunPlan } from '../../lib/run/runPlan';
import {
  accumulatorBytes,
  checkMemoryBudget,
  estimateRunMemory,
  formatBytes,
  MemoryBudgetError,
} from '../../lib/run/runMemory';
import { stateBytes } from '../../lib/run/dataState';
import { reachableArrayBytes } from '../support/reachableBytes';
import { striaHere } from '../cli/support/stria';

const sizes: [number, number][] = [
  [32, 32],
  [64, 32],
  [32, 128],
  [128, 128],
  [256, 256],
];

describe('memory estimate of a measured run', () => {
  it('counts every typed array a built model and its measurement hold, exactly', () => {
    for (const [nx, ny] of sizes) {
      const model = new Model({ nx, ny, kf: 8, dkf: 1.5 });
      const est = estimateRunMemory(model.params, { snapshots: true });
      const modelBytes = reachableArrayBytes(model).bytes;
      expect(est.items[0], `${nx}×${ny} model`).toEqual({ what: 'model', bytes: modelBytes });
      // The planner's cost model is the same count: lib/plan/cost.ts agrees with the model.
      expect(modelMemory(nx, ny, forcedModesForCost(model.params)).totalBytes).toBe(modelBytes);
      const run = new MonitoredRun(model, resolveRunPlan(model.params, { steps: 10 }));
      expect(est.items[1]).toEqual({ what: 'measurement', bytes: reachableArrayBytes(run).bytes - modelBytes });
      // The snapshot file's plan and fields, its record buffer (5 fields, a time and a step).
      const plan = new SnapshotPlan(model.params);
      const fields = plan.gridFields(model.qHat);
      const recordBytes = 5 * 8 * nx * ny + 12;
      expect(est.items[2]).toEqual({
        what: 'snapshot file',
        bytes: reachableArrayBytes(plan, fields).bytes + recordBytes,
      });
    }
  });

  it('counts every typed array of a two-layer model and its measurement, exactly', () => {
    for (const [nx, ny] of sizes) {
      const model = new Model({ nx, ny, kf: 8, dkf: 1.5, layers: 2, kd: 4, shear: 0.3 });
      const est = estimateRunMemory(model.params, { snapshots: true, zonal: true });
      const modelBytes = reachableArrayBytes(model).bytes;
      expect(est.items[0], `${nx}×${ny} model`).toEqual({ what: 'model', bytes: modelBytes });
      expect(modelMemory(nx, ny, forcedModesForCost(model.params), 2).totalBytes).toBe(modelBytes);
      // The snapshot file of both layers: a layer plan, their fields, a record of 10 fields, a time and a step.
      const layerPlan = new LayerSnapshotPlan(model.params);
      const up = layerPlan.gridFields(model.qHat, 'upper');
      const lo = layerPlan.gridFields(model.qHat, 'lower');
      expect(est.items[2]).toEqual({
        what: 'snapshot file',
        bytes: reachableArrayBytes(layerPlan, up, lo).bytes + 10 * 8 * nx * ny + 12,
      });
      // The zonal-mean file: five profiles of each layer and the heat flux.
      expect(est.items[3]).toEqual({ what: 'zonal-mean file', bytes: 11 * 8 * ny + 12 });
      const run = new MonitoredRun(model, resolveRunPlan(model.params, { steps: 10 }));
      expect(est.items[1]).toEqual({ what: 'measurement', bytes: reachableArrayBytes(run).bytes - modelBytes });
      const s = run.saveState();
      const acc =
        stateBytes(s.monitor.budget) +
        stateBytes(s.monitor.hovmoller) +
        stateBytes(s.monitor.means) +
        stateBytes(s.monitor.layers!.cycle) +
        stateBytes(s.monitor.layers!.means);
      expect(accumulatorBytes(ny, 2)).toBe(acc);
    }
    // About 440 bytes a point on a large square grid (lib/plan/cost.ts).
    expect(modelMemory(1024, 1024, 0, 2).bytesPerPoint).toBeGreaterThan(420);
    expect(modelMemory(1024, 1024, 0, 2).bytesPerPoint).toBeLessThan(460);
  });

  it('counts the accumulators as a saved measurement holds them (the retry checkpoint)', () => {
    const model = new Model({ nx: 64, ny: 64, kf: 8, dkf: 1.5 });
    const run = new MonitoredRun(model, resolveRunPlan(model.params, { steps: 10 }));
    const s = run.saveState();
    const acc = stateBytes(s.monitor.budget) + stateBytes(s.monitor.hovmoller) + stateBytes(s.monitor.means);
    expect(accumulatorBytes(64)).toBe(acc);
    expect(
      estimateRunMemory(model.params, { retry: true }).items.find((i) => i.what === 'retry checkpoint')!.bytes,
    ).toBe(acc + 8 * model.qHat.length);
  });

  it('refuses a run over its budget with the estimate, in the library and in stria run', async () => {
    const est = estimateRunMemory({ nx: 1024, ny: 1024, Lx: 2 * Math.PI, Ly: 2 * Math.PI, kf: 24, dkf: 2 });
    expect(est.bytesPerPoint).toBeGreaterThan(157); // the model alone is ≈ 157 B a point
    expect(() => checkMemoryBudget(est, 2 ** 28)).toThrow(MemoryBudgetError);
    expect(() => checkMemoryBudget(est, 2 ** 28)).toThrow(
      new RegExp(
        `a 1024 × 1024 run needs about ${formatBytes(est.totalBytes)} \\(model .* MiB, measurement .* MiB\\), more than the memory budget of 256 MiB`,
      ),
    );
    expect(checkMemoryBudget(est, 2 ** 31)).toBe(est);
    const r = await striaHere([
      'run',
      '--set',
      'nx=1024',
      '--set',
      'ny=1024',
      '--steps',
      '1',
      '--memory-budget',
      '256MiB',
    ]);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(
      /nx = 1024, ny = 1024: this run needs about [\d.]+ MiB \(model [\d.]+ MiB, measurement [\d.]+ MiB, runtime 128 MiB\), more than the memory budget of 256 MiB; give a smaller grid/,
    );
    const bad = await striaHere(['run', '--steps', '1', '--memory-budget', '2 gigs']);
    expect(bad.status).toBe(2);
    expect(bad.stderr).toMatch(/--memory-budget 2 gigs: needs a size/);
    expect(formatBytes(2 * 2 ** 30)).toBe('2.00 GiB');
  });
});
