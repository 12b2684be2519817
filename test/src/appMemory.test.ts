import { describe, expect, it } from 'vitest';
import { SIZE_MAX, SIZE_MIN } from '../../lib/model/params';
import { validateParams } from '../../lib/model/validateParams';
import { DEMO_SCENARIOS } from '../../lib/plan/demoScenarios';
import { estimateRunMemory } from '../../lib/run/runMemory';
import {
  APP_BUDGET_CAP,
  APP_BUDGET_FLOOR,
  APP_RUNTIME_BYTES,
  appMemoryBudget,
  estimateAppMemory,
  memoryRefusal,
  roughBytes,
} from '../../src/appMemory';
import { layerSpectraBytes, viewDiagnosticsBytes } from '../../workers/diagnosticsMemory';

const MiB = 1024 ** 2;
const GiB = 1024 ** 3;
// A forcing annulus every grid keeps (k_f + δk ≤ 10 at 32²).
const grid = (nx: number, ny: number) => validateParams({ nx, ny, kf: 6, dkf: 1 });

describe('the app memory budget', () => {
  it('is a quarter of the device memory the browser reports, between 256 MiB and 1 GiB', () => {
    expect(APP_BUDGET_CAP).toBe(GiB);
    expect(APP_BUDGET_FLOOR).toBe(256 * MiB);
    // navigator.deviceMemory takes the values 0.25, 0.5, 1, 2, 4, 8 in Chromium (Device Memory API).
    expect(appMemoryBudget(0.25)).toEqual({ bytes: 256 * MiB, reason: 'its least; this device has 0.25 GiB' });
    expect(appMemoryBudget(1)).toEqual({ bytes: 256 * MiB, reason: 'its least; this device has 1 GiB' });
    expect(appMemoryBudget(2)).toEqual({ bytes: 512 * MiB, reason: "a quarter of this device's 2 GiB" });
    expect(appMemoryBudget(4)).toEqual({ bytes: GiB, reason: '' });
    expect(appMemoryBudget(8)).toEqual({ bytes: GiB, reason: '' });
    // A browser that does not say (Firefox, Safari; Node here) gets the cap.
    for (const d of [undefined, NaN, 0, -1, Infinity]) expect(appMemoryBudget(d).bytes, String(d)).toBe(GiB);
  });
});

describe('the memory of a run in the app', () => {
  it('adds the views, the fields on screen, the runtime and the larger transient to the run itself', () => {
    const p = grid(256, 128);
    const e = estimateAppMemory(p);
    const run = estimateRunMemory(p);
    const N = 256 * 128;
    expect(e.items).toEqual([
      run.items[0],
      run.items[1],
      { what: 'views', bytes: viewDiagnosticsBytes(p) },
      { what: 'kept states', bytes: 3 * 16 * 128 * 129 },
      { what: 'fields on screen', bytes: 24 * N },
      { what: 'runtime', bytes: APP_RUNTIME_BYTES },
      { what: 'exporting a snapshot', bytes: 160 * N },
    ]);
    expect(e.totalBytes).toBe(e.items.reduce((s, i) => s + i.bytes, 0));
    // Replacing a small run costs less than an export; replacing a large one more, and it is named.
    expect(estimateAppMemory(grid(512, 256), grid(32, 32)).items[6].what).toBe('exporting a snapshot');
    const big = estimateAppMemory(grid(512, 512), grid(512, 512));
    expect(big.items[6].what).toBe('the 512 × 512 run it replaces');
    expect(big.items[6].bytes).toBe(
      big.items[0].bytes + big.items[1].bytes + big.items[2].bytes + big.items[3].bytes / 3,
    );
  });

  it('grows with the grid', () => {
    let last = 0;
    for (let n = SIZE_MIN; n <= SIZE_MAX; n *= 2) {
      const t = estimateAppMemory(grid(n, n)).totalBytes;
      expect(t).toBeGreaterThan(last);
      last = t;
    }
  });

  it('lets every grid the model accepts run at the cap, and every scenario at the floor', () => {
    const cap = appMemoryBudget(8);
    expect(memoryRefusal(grid(SIZE_MAX, SIZE_MAX), grid(SIZE_MAX, SIZE_MAX), cap)).toBeNull();
    const floor = appMemoryBudget(0.25);
    for (const s of DEMO_SCENARIOS)
      expect(memoryRefusal(validateParams(s.params), validateParams(s.params), floor), s.id).toBeNull();
  });

  it('refuses what exceeds the budget with the estimate and the budget', () => {
    const two = appMemoryBudget(2);
    const p = grid(1024, 1024);
    const total = estimateAppMemory(p).totalBytes;
    expect(total).toBeGreaterThan(512 * MiB);
    expect(memoryRefusal(p, null, two)).toBe(
      `1024 × 1024 needs ≈ ${roughBytes(total)}; the app's budget is 512 MiB (a quarter of this device's 2 GiB)`,
    );
    expect(memoryRefusal(p, null, two)).toMatch(/^1024 × 1024 needs ≈ 6\d\d MiB;/);
    // With the run it replaces, when that is the larger moment.
    const replacing = grid(1024, 512);
    expect(memoryRefusal(p, replacing, two)).toBe(
      `1024 × 1024 needs ≈ ${roughBytes(estimateAppMemory(p, replacing).totalBytes)} with the 1024 × 512 run it replaces; the app's budget is 512 MiB (a quarter of this device's 2 GiB)`,
    );
    expect(memoryRefusal(p, null, { bytes: total - 1, reason: '' })).toMatch(/; the app's budget is [\d.]+ MiB$/);
    expect(memoryRefusal(p, null, { bytes: total, reason: '' })).toBeNull();
  });

  it('writes sizes without trailing zeros', () => {
    expect(roughBytes(GiB)).toBe('1 GiB');
    expect(roughBytes(512 * MiB)).toBe('512 MiB');
    expect(roughBytes(1.5 * GiB)).toBe('1.5 GiB');
    expect(roughBytes(1.25 * MiB)).toBe('1.25 MiB');
    expect(roughBytes(10.5 * MiB)).toBe('10.5 MiB');
    expect(roughBytes(100)).toBe('100 B');
  });
});

describe('the app memory estimate of a two-layer run', () => {
  it('counts the two-layer model, the layered zonal frames and the two-layer spectra: more than the same grid in one layer', () => {
    const one = grid(128, 128);
    const two = validateParams({ ...one, layers: 2, kd: 4 });
    expect(estimateAppMemory(two).totalBytes).toBeGreaterThan(estimateAppMemory(one).totalBytes);
    // The zonal frames of a two-layer run hold 11 profiles of ny a frame instead of 5 (both layers of
    // ū, q̄, u′v′, v′q′, EKE and the heat flux), 1024 frames of 128 rows (both fit the store's 16 MiB):
    // 6 × 1024 × 128 × 8 bytes more; and the barotropic and baroclinic spectra (test/workers/diagnosticsMemory.test.ts).
    expect(viewDiagnosticsBytes(two) - viewDiagnosticsBytes(one)).toBe(6 * 1024 * 128 * 8 + layerSpectraBytes(two));
  });
});
