import { describe, expect, it } from 'vitest';
import type { Checkpoint } from '../../../lib/model/checkpoint';
import { Model } from '../../../lib/model/model';
import { copyCheckpoint, KEEP_EVERY_MS, keepDue, KeptCheckpoint } from '../../../src/keep/keptCheckpoint';

const SMALL = { nx: 32, ny: 32, kf: 6, dkf: 1 };

function checkpointAt(steps: number, changes = {}): Checkpoint {
  const m = new Model({ ...SMALL, ...changes });
  m.step(steps);
  return m.checkpoint();
}

describe('keepDue', () => {
  const p = checkpointAt(0).params;
  const mark = { epoch: 2, params: p, at: 1000 };

  it('is due with nothing kept, for another run or other parameters, and once the copy is KEEP_EVERY_MS old', () => {
    expect(keepDue(null, null, 0)).toBe(true);
    expect(keepDue(mark, { epoch: 2, params: { ...p } }, 1000 + KEEP_EVERY_MS - 1)).toBe(false);
    expect(keepDue(mark, { epoch: 2, params: p }, 1000 + KEEP_EVERY_MS)).toBe(true);
    expect(keepDue(mark, { epoch: 3, params: p }, 1001)).toBe(true);
    expect(keepDue(mark, { epoch: 2, params: { ...p, mu: p.mu * 2 } }, 1001)).toBe(true);
    expect(keepDue(mark, null, 1001)).toBe(false);
  });
});

describe('KeptCheckpoint', () => {
  it('keeps what it asked for, one request at a time', async () => {
    const k = new KeptCheckpoint();
    const cp = checkpointAt(3);
    let release: (c: Checkpoint) => void = () => undefined;
    let asked = 0;
    const take = () => (asked++, new Promise<Checkpoint>((r) => (release = r)));
    const first = k.refresh(
      take,
      () => 5,
      () => 100,
    );
    expect(k.due(null, 100)).toBe(false);
    await k.refresh(
      take,
      () => 5,
      () => 100,
    );
    expect(asked).toBe(1);
    release(cp);
    await first;
    expect(k.checkpoint).toBe(cp);
    expect(k.due({ epoch: 5, params: cp.params }, 100 + KEEP_EVERY_MS - 1)).toBe(false);
    expect(k.due({ epoch: 6, params: cp.params }, 101)).toBe(true);
  });

  it('drops a copy asked for before the run was replaced, and is due at once after', async () => {
    const k = new KeptCheckpoint();
    const old = checkpointAt(3);
    let release: (c: Checkpoint) => void = () => undefined;
    const pending = k.refresh(
      () => new Promise<Checkpoint>((r) => (release = r)),
      () => 1,
      () => 0,
    );
    k.forget();
    expect(k.due(null, 0)).toBe(true);
    release(old);
    await pending;
    expect(k.checkpoint).toBeNull();
  });

  it('takes a copy of a checkpoint offered by a save of the same run, not one asked before a new run', () => {
    const k = new KeptCheckpoint();
    const cp = checkpointAt(2);
    const g = k.generation;
    k.offer(cp, g, 1, 50);
    expect(k.checkpoint).not.toBe(cp);
    expect(k.checkpoint?.qHat).toEqual(cp.qHat);
    expect(k.checkpoint?.qHat.buffer).not.toBe(cp.qHat.buffer);
    k.forget();
    k.offer(checkpointAt(4), g, 1, 60);
    expect(k.checkpoint?.steps).toBe(2);
  });
});

describe('copyCheckpoint', () => {
  it('copies every part that could be transferred or changed, and restores to the same run', () => {
    const cp = checkpointAt(4);
    const c = copyCheckpoint(cp);
    expect(c).toEqual(cp);
    expect(c.qHat.buffer).not.toBe(cp.qHat.buffer);
    expect(c.params).not.toBe(cp.params);
    expect(c.rng).not.toBe(cp.rng);
    const a = Model.restore(cp);
    const b = Model.restore(c);
    a.step(3);
    b.step(3);
    expect(Array.from(b.qHat)).toEqual(Array.from(a.qHat));
  });
});
