import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { canonicalJson, fnv1a64, runId } from '../../lib/run/runId';
import type { RunPlan } from '../../lib/run/runPlan';

describe('run ids', () => {
  // FNV-1a 64 test vectors of the algorithm's authors' reference list [published: Fowler, Noll, Vo].
  it('hashes with 64-bit FNV-1a', () => {
    expect(fnv1a64('')).toBe('cbf29ce484222325');
    expect(fnv1a64('a')).toBe('af63dc4c8601ec8c');
    expect(fnv1a64('foobar')).toBe('85944171f73967e8');
  });

  it('reads objects the same whatever their key order', () => {
    expect(canonicalJson({ b: 1, a: [{ d: true, c: 'x' }] })).toBe('{"a":[{"c":"x","d":true}],"b":1}');
    expect(() => canonicalJson({ a: NaN })).toThrow(RangeError);
  });

  it('depends on every parameter, the seed and the run plan, and on nothing else', () => {
    const plan: RunPlan = { stop: { kind: 'until', time: 10 }, average: 5, sampleEvery: 0.5 };
    const p = { ...DEFAULT_PARAMS };
    const id = runId(p, plan);
    expect(id).toMatch(/^r[0-9a-f]{16}$/);
    expect(
      runId(Object.fromEntries(Object.entries(p).reverse()) as typeof p, {
        sampleEvery: 0.5,
        average: 5,
        stop: { time: 10, kind: 'until' },
      }),
    ).toBe(id);
    expect(runId({ ...p, seed: 2 }, plan)).not.toBe(id);
    expect(runId({ ...p, beta: 10 + 1e-12 }, plan)).not.toBe(id);
    expect(runId(p, { ...plan, average: 4 })).not.toBe(id);
  });

  // Ids are stored in checkpoints and sweep records: a one-layer run keeps the id it had before the
  // two-layer keys existed (this value was computed by the code of that time), a two-layer run has its own.
  it('keeps the ids of one-layer runs from before the two-layer keys', () => {
    const plan: RunPlan = { stop: { kind: 'until', time: 10 }, average: 5, sampleEvery: 0.5 };
    expect(runId({ ...DEFAULT_PARAMS }, plan)).toBe('rcfb689369c32e1df');
    const two = runId({ ...DEFAULT_PARAMS, layers: 2, kd: 1 }, plan);
    expect(two).not.toBe(runId({ ...DEFAULT_PARAMS, kd: 1 }, plan));
    expect(runId({ ...DEFAULT_PARAMS, layers: 2, kd: 1, shear: 0.1 }, plan)).not.toBe(two);
  });
});
