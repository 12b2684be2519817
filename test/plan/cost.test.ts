import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import measured from '../../lib/plan/measuredStep.json';
import {
  annulusModeCount,
  flopsPerStep,
  forcedModesForCost,
  MEASURED_STEP,
  modelMemory,
  parseMeasuredStep,
  runCost,
  stepSeconds,
} from '../../lib/plan/cost';

/** Bytes of every typed array reachable from an object (each buffer once). */
function typedArrayBytes(root: unknown): number {
  const seen = new Set<unknown>();
  const buffers = new Set<ArrayBufferLike>();
  const walk = (x: unknown) => {
    if (typeof x !== 'object' || x === null || seen.has(x)) return;
    seen.add(x);
    if (ArrayBuffer.isView(x)) {
      buffers.add(x.buffer);
      return;
    }
    for (const v of Object.values(x as Record<string, unknown>)) walk(v);
  };
  walk(root);
  let total = 0;
  for (const b of buffers) total += b.byteLength;
  return total;
}

const sizes: Array<[number, number, Partial<typeof DEFAULT_PARAMS>]> = [
  [64, 64, { kf: 10, dkf: 1.5 }],
  [128, 64, { kf: 12, dkf: 2, force_zonal: false }],
  [64, 256, { kf: 8, dkf: 0.7, Ly: 4 * Math.PI }],
  [256, 256, {}],
];

describe('cost', () => {
  // The count in cost.ts against the arrays a real Model holds: exact, byte for byte.
  it.each(sizes)('counts the memory of a %i × %i model exactly', (nx, ny, extra) => {
    const params = { ...DEFAULT_PARAMS, nx, ny, ...extra };
    const model = new Model(params);
    expect(annulusModeCount(params)).toBe(model.forcedModes);
    expect(modelMemory(nx, ny, model.forcedModes).totalBytes).toBe(typedArrayBytes(model));
  });

  it('tends to ≈ 157.8 bytes per grid point on large square grids', () => {
    // 8·(13 + 4 + 8/3) doubles per point + ½ byte of mask: the leading terms of the count in cost.ts.
    const limit = 8 * (13 + 4 + 8 / 3) + 0.5;
    // The remainder is O(1/n) (about 311/n bytes: the rows and columns beyond the leading terms).
    for (const n of [4096, 65536]) expect(Math.abs(modelMemory(n, n, 0).bytesPerPoint - limit)).toBeLessThan(320 / n);
    expect(modelMemory(64, 64, 0).bytesPerPoint).toBeGreaterThan(limit);
  });

  // The nominal count of 5 n log₂ n flops per complex FFT of length n is a convention of the trade [practice].
  it('counts the FFT work of a step: 4 stages × 2 pair transforms × 5 n log₂ n per complex FFT', () => {
    // 64 × 64: C = 2(⌊64/3⌋ + 1) = 44 columns of y FFTs, 64 rows of x FFTs, log₂ 64 = 6.
    expect(flopsPerStep(64, 64)).toBe(8 * 5 * (44 * 64 * 6 + 64 * 64 * 6));
    // c in c·n² log₂ n tends to 40·(1 + 2/3).
    const n = 16384;
    expect(Math.abs(flopsPerStep(n, n) / (n * n * Math.log2(n)) - 200 / 3)).toBeLessThan(0.01);
  });

  it('scales the measured step time as N² log N and divides by the machine speed', () => {
    const ref = { n: 256, ms_per_step: 16, measured_on: '2026-12-01', how: 'test' };
    expect(stepSeconds(256, 256, 1, ref)).toBe(0.016);
    // 512²: N grows 4×, log₂ N from 16 to 18.
    expect(stepSeconds(512, 512, 1, ref) / stepSeconds(256, 256, 1, ref)).toBeCloseTo((4 * 18) / 16, 13);
    expect(stepSeconds(128, 128, 1, ref) / stepSeconds(256, 256, 1, ref)).toBeCloseTo(14 / 16 / 4, 13);
    expect(stepSeconds(512, 256, 1, ref) / stepSeconds(256, 256, 1, ref)).toBeCloseTo((2 * 17) / 16, 13);
    expect(stepSeconds(1024, 1024, 2.5, ref)).toBeCloseTo(stepSeconds(1024, 1024, 1, ref) / 2.5, 15);
    expect(() => stepSeconds(256, 256, 0, ref)).toThrow(/machine-speed factor/);
    const c = runCost(512, 512, 1000, 10, 2, ref);
    expect(c.wallSeconds).toBe(1000 * c.secondsPerStep);
    expect(c.secondsPerStep).toBe(stepSeconds(512, 512, 2, ref));
  });

  it('ships a measured reference figure and refuses a broken one by field', () => {
    expect(MEASURED_STEP.n).toBe(256);
    // The shipped figure is the one in the file (refreshed from `npm run bench`), read unchanged.
    expect(MEASURED_STEP.ms_per_step).toBe((measured as { ms_per_step: number }).ms_per_step);
    expect(MEASURED_STEP.ms_per_step).toBeGreaterThan(0);
    expect((measured as { kind: string }).kind).toBe('measured');
    expect(MEASURED_STEP.measured_on).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(() => parseMeasuredStep({ ...measured, ms_per_step: -3 })).toThrow(/ms_per_step/);
    expect(() => parseMeasuredStep({ ...measured, version: 2 })).toThrow(/version/);
  });
});

describe('forced modes for a cost estimate', () => {
  it('counts small rings exactly and estimates huge ones by their area', () => {
    const small = { nx: 256, ny: 256, Lx: 2 * Math.PI, Ly: 2 * Math.PI, kf: 24, dkf: 2 };
    expect(forcedModesForCost(small)).toBe(annulusModeCount(small));
    // Half-plane area 2π k_f δk of a ring at k_f = 8000, δk = 7000 on a unit lattice: beyond counting.
    const huge = { nx: 65536, ny: 65536, Lx: 2 * Math.PI, Ly: 2 * Math.PI, kf: 8000, dkf: 7000 };
    expect(forcedModesForCost(huge)).toBe(Math.round(2 * Math.PI * 8000 * 7000));
    // The area is what the exact count tends to: within 1 % on a ring of some 60 000 modes.
    const mid = { nx: 4096, ny: 4096, Lx: 2 * Math.PI, Ly: 2 * Math.PI, kf: 500, dkf: 20 };
    expect(Math.abs(annulusModeCount(mid) / (2 * Math.PI * 500 * 20) - 1)).toBeLessThan(0.01);
  });
});
