import { describe, expect, it } from 'vitest';
import { createZonalMeans } from '../../lib/analysis/zonalMean';
import { ZonalFrameStore } from '../../workers/zonalFrameStore';

function means(ny: number, value: number) {
  const z = createZonalMeans(ny);
  z.ubar.fill(value);
  z.qtot.fill(-value);
  return z;
}

describe('ZonalFrameStore', () => {
  it('keeps every sample until full, then every other one, so the frames stay equally spaced', () => {
    const ny = 4;
    // Room for exactly 4 frames.
    const store = new ZonalFrameStore(ny, 4 * (8 * 5 * ny + 16));
    expect(store.cap).toBe(4);
    for (let s = 0; s < 9; s++) store.add(s * 0.5, 10 * s, means(ny, s));
    const frames = store.frameList();
    // Samples 0, 2, 4, 6, 8 would be five; at cap 4 the stride doubles again to 4: samples 0, 4, 8.
    expect(frames.map((f) => f.time)).toEqual([0, 2, 4]);
    expect(store.samplesPerFrame).toBe(4);
    expect(frames.map((f) => f.steps)).toEqual([0, 40, 80]);
    // The file's qbar is the total PV (ZonalMeans.qtot).
    expect(Array.from(frames[1].fields.qbar)).toEqual([-4, -4, -4, -4]);
    expect(Array.from(frames[2].fields.ubar)).toEqual([8, 8, 8, 8]);
  });
});
