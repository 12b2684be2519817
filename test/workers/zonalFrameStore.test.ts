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

describe('ZonalFrameStore with two layers', () => {
  it('keeps each frame of the layered file whole: both layers of each profile and the heat flux', () => {
    const ny = 4;
    const store = new ZonalFrameStore(ny, undefined, 2);
    const frame = (v: number) => ({
      ubar: Float64Array.from({ length: 2 * ny }, (_, i) => v + i),
      qbar: new Float64Array(2 * ny).fill(-v),
      upvp: new Float64Array(2 * ny),
      vpqp: new Float64Array(2 * ny),
      eke: new Float64Array(2 * ny),
      heat_flux: new Float64Array(ny).fill(10 * v),
    });
    for (let s = 0; s < 3; s++) store.addFrame(s, s, () => frame(s));
    const f = store.frameList()[2];
    expect(Array.from(f.fields.ubar)).toEqual([2, 3, 4, 5, 6, 7, 8, 9]);
    expect(Array.from(f.fields.heat_flux)).toEqual([20, 20, 20, 20]);
    expect(() => store.addFrame(3, 3, () => ({ ...frame(3), heat_flux: new Float64Array(2 * ny) }))).toThrow(
      /heat_flux holds 8 values, not 1 × 4/,
    );
  });
});
