import { describe, expect, it } from 'vitest';
import { AllocationMeter } from '../../lib/io/allocationMeter';
import { memorySource } from '../../lib/io/byteSource';
import { analyzeFile, type AnalyzeFileOptions } from '../../lib/userfile/analyzeFile';
import { UserFileMemoryError } from '../../lib/userfile/userFileMemory';
import { cdl, type CdlVariable } from '../support/cdl';
import { staircaseProfile } from '../support/jetFields';
import { ncgen, runNcgen, type NcgenKind } from '../io/ncgenTool';

/**
 * The memory of a user-file analysis, estimated from the file's dimensions before a value is read:
 * refused over the budget with the estimate and a subsample that fits; an estimate that bounds the
 * buffers the analysis then allocates (counted by the AllocationMeter); and the subsample itself,
 * which reads every K-th point one row at a time.
 */
const MiB = 2 ** 20;

/** A doubly periodic (y, x) file in metres of `jets` zonal jets plus a wave, with the fields asked for. */
function gridFile(n: number, roles: ('u' | 'v' | 'zeta')[], extra: Record<string, string | number | number[]> = {}) {
  const L = 4e6;
  const d = L / n;
  const value = (role: string, i: number, j: number) =>
    role === 'u'
      ? staircaseProfile(j * d, L / 4, 1e-11, 0.3 * d).u + 0.1 * Math.sin((2 * Math.PI * 3 * i) / n)
      : role === 'v'
        ? 0.1 * Math.cos((2 * Math.PI * 3 * i) / n)
        : 1e-6 * Math.cos((2 * Math.PI * 4 * j) / n);
  const field = (role: string): CdlVariable => ({
    name: role,
    type: 'double',
    dims: ['time', 'y', 'x'],
    attrs: { units: role === 'zeta' ? 's-1' : 'm s-1', ...extra },
    data: Array.from({ length: 2 * n * n }, (_, k) => value(role, k % n, Math.floor(k / n) % n)),
  });
  const axis = (name: string): CdlVariable => ({
    name,
    type: 'double',
    dims: [name],
    attrs: { units: 'm', modulo: L },
    data: Array.from({ length: n }, (_, k) => k * d),
  });
  return cdl({
    dims: [
      { name: 'time', size: 'unlimited' },
      { name: 'y', size: n },
      { name: 'x', size: n },
    ],
    vars: [axis('y'), axis('x'), ...roles.map(field)],
  });
}

function refusal(bytes: Uint8Array, options: AnalyzeFileOptions): UserFileMemoryError {
  try {
    analyzeFile(memorySource(bytes), options);
  } catch (e) {
    if (e instanceof UserFileMemoryError) return e;
    throw e;
  }
  throw new Error('the analysis was not refused');
}

describe.runIf(runNcgen)('the memory of a user-file analysis', () => {
  it('is refused over the budget before a buffer is allocated, with the estimate and a subsample that fits', () => {
    const bytes = ncgen(gridFile(256, ['u', 'v']), 'nc4');
    const meter = new AllocationMeter();
    const e = refusal(bytes, { memoryBudget: 12 * MiB, meter });
    // Nothing of the grid's size: the chunk index (64 bytes a chunk) is all that was read.
    expect(meter.retained).toBeLessThan(1024);
    expect(e.estimate.totalBytes).toBeGreaterThan(12 * MiB);
    expect(e.fitsAt).toBe(2);
    expect(e.message).toMatch(
      /^"u" and "v" on 256 × 256 points need about \d+\.?\d* MiB \(file in memory .*fields .*\), more than the memory budget of 12\.0 MiB; every 2nd point \(128 × 128\) would fit$/,
    );
    // The subsample it names fits, and runs.
    const r = analyzeFile(memorySource(bytes), { memoryBudget: 12 * MiB, subsample: 2 });
    expect(r.analysis.grid).toMatchObject({ nx: 128, ny: 128 });
  });

  it('bounds what the analysis allocates, within a quarter of it', () => {
    for (const [n, roles, kind, spectra] of [
      [64, ['u', 'v'], 'nc3', true],
      [128, ['u', 'v'], 'nc4', true],
      [128, ['zeta'], 'nc3', true],
      [128, ['u', 'v'], 'nc3', false],
      [96, ['u', 'v'], 'nc4', true], // not a power of two: no spectral plans
    ] as [number, ('u' | 'v' | 'zeta')[], NcgenKind, boolean][]) {
      const bytes = ncgen(gridFile(n, roles), kind);
      const meter = new AllocationMeter();
      const r = analyzeFile(memorySource(bytes), { meter, spectra, memoryBudget: 2 ** 40 });
      const used = meter.retained + meter.peakTransient + bytes.length;
      const estimate = r.file.memoryEstimate.totalBytes;
      expect(estimate, `${n} ${roles} ${kind} ${spectra}`).toBeGreaterThanOrEqual(used);
      expect(estimate, `${n} ${roles} ${kind} ${spectra}`).toBeLessThan(1.25 * used);
    }
  });

  it('reads every K-th point, one row at a time, and finds the same jets', () => {
    for (const kind of ['nc3', 'nc4'] as NcgenKind[]) {
      const bytes = ncgen(
        gridFile(128, ['u', 'v'], kind === 'nc4' ? { _ChunkSizes: [1, 16, 16], _DeflateLevel: 1 } : {}),
        kind,
      );
      const whole = analyzeFile(memorySource(bytes), { beta: 1e-11 });
      const meter = new AllocationMeter();
      const half = analyzeFile(memorySource(bytes), { beta: 1e-11, subsample: 2, meter });
      expect(half.analysis.grid).toMatchObject({ nx: 64, ny: 64, periodicX: true, periodicY: true });
      expect(half.analysis.grid.dy).toBe(2 * whole.analysis.grid.dy);
      expect(half.analysis.jets!.count).toBe(whole.analysis.jets!.count);
      expect(Math.abs(half.analysis.jets!.meanSpacing! / whole.analysis.jets!.meanSpacing! - 1)).toBeLessThan(1e-9);
      // ū of the subsample is ū of the full grid at every other row (the wave averages out along x).
      const ub = whole.analysis.profiles.ubar as number[];
      (half.analysis.profiles.ubar as number[]).forEach((x, j) => expect(x).toBeCloseTo(ub[2 * j], 12));
      expect(half.analysis.notes.join(' ')).toMatch(/every 2nd point in x and y/);
      // Nothing of the full grid is held: a row is read at a time.
      expect(meter.retained).toBeLessThan(whole.analysis.memory.retainedBytes / 3);
    }
  });

  it('refuses a subsample that is not a whole number ≥ 1', () => {
    const bytes = ncgen(gridFile(16, ['u']), 'nc3');
    expect(() => analyzeFile(memorySource(bytes), { subsample: 0 })).toThrow(/subsample 0 must be a whole number ≥ 1/);
    expect(() => analyzeFile(memorySource(bytes), { subsample: 1.5 })).toThrow(/subsample 1.5 must be/);
  });
});
