import { describe, expect, it } from 'vitest';
import { Model } from '../../lib/model/model';
import { RESCUE_EVERY, RescuePoint } from '../../workers/rescuePoint';
import { stateChecksum } from '../../lib/io/digest';

const SMALL = { nx: 32, ny: 32, kf: 6, dkf: 1 };

describe('RescuePoint', () => {
  it('is empty until the first copy', () => {
    const r = new RescuePoint();
    expect(r.checkpoint()).toBeNull();
    expect(r.at).toBeNull();
  });

  it('keeps a state that restores bit for bit, unchanged by the steps after it', () => {
    const m = new Model(SMALL);
    m.step(5);
    const r = new RescuePoint();
    r.take(m);
    const sum = stateChecksum(m.qHat);
    m.step(7);
    const after = stateChecksum(m.qHat);
    const cp = r.checkpoint()!;
    expect(stateChecksum(cp.qHat)).toBe(sum);
    expect([cp.time, cp.steps]).toEqual([5 * m.params.dt, 5]);
    const back = Model.restore(cp);
    back.step(7);
    expect(stateChecksum(back.qHat)).toBe(after);
  });

  it('copies into the same buffer every time, a new one only for a new grid', () => {
    const m = new Model(SMALL);
    const r = new RescuePoint();
    r.take(m);
    const first = r.checkpoint()!;
    m.step(1);
    r.take(m);
    const second = r.checkpoint()!;
    expect(second.qHat).toBe(first.qHat);
    // Same parameters: the same copy of them.
    expect(second.params).toBe(first.params);
    expect(second.steps).toBe(1);
    const bigger = m.reconfigure({ nx: 64, ny: 64 });
    r.take(bigger);
    const third = r.checkpoint()!;
    expect(third.qHat).not.toBe(first.qHat);
    expect(third.qHat.length).toBe(bigger.qHat.length);
    expect(third.params.nx).toBe(64);
  });

  it('takes new parameters when they change in place, as a copy the model cannot alter', () => {
    const m = new Model(SMALL);
    const r = new RescuePoint();
    r.take(m);
    m.reconfigure({ mu: 0.05 });
    r.take(m);
    const cp = r.checkpoint()!;
    expect(cp.params.mu).toBe(0.05);
    expect(cp.params).not.toBe(m.params);
  });

  it('copies after a step only at multiples of RESCUE_EVERY', () => {
    const m = new Model(SMALL);
    const r = new RescuePoint();
    r.take(m);
    for (let i = 0; i < RESCUE_EVERY + 3; i++) {
      m.step(1);
      r.afterStep(m);
    }
    expect(r.at?.steps).toBe(RESCUE_EVERY);
  });
});
