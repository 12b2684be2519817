import { describe, expect, it } from 'vitest';
import { ProfileTimeMean } from '../../lib/analysis/timeMean';
import { createZonalMeans } from '../../lib/analysis/zonalMean';
import { seededSigned } from '../support/random';

/** Profiles a(t)_j = t + j and b(t)_j = t² − j, so every mean is known in closed form. */
function sample(t: number, n: number): { a: Float64Array; b: Float64Array } {
  return {
    a: Float64Array.from({ length: n }, (_, j) => t + j),
    b: Float64Array.from({ length: n }, (_, j) => t * t - j),
  };
}

function meanOf(ts: number[], n: number): { a: Float64Array; b: Float64Array } {
  const out = { a: new Float64Array(n), b: new Float64Array(n) };
  for (const t of ts) {
    const s = sample(t, n);
    for (let j = 0; j < n; j++) {
      out.a[j] += s.a[j] / ts.length;
      out.b[j] += s.b[j] / ts.length;
    }
  }
  return out;
}

describe('running time means of profiles', () => {
  it("'since': averages every sample from tStart on and reports that window", () => {
    const tm = new ProfileTimeMean(['a', 'b'], 3, { kind: 'since', tStart: 3.5 });
    for (let t = 0; t < 10; t++) tm.add(t, sample(t, 3));
    const out = { a: new Float64Array(3), b: new Float64Array(3) };
    expect(tm.mean(out)).toEqual({ tStart: 4, tEnd: 9, count: 6, stored: 6 });
    // mean of t over 4..9 is 6.5; of t² is (16+25+36+49+64+81)/6 = 271/6
    expect(out.a[2]).toBeCloseTo(8.5, 14);
    expect(out.b[1]).toBeCloseTo(271 / 6 - 1, 13);
  });

  it("'last': keeps the samples of the last span, first sample ≥ t − span", () => {
    const tm = new ProfileTimeMean(['a', 'b'], 2, { kind: 'last', span: 3, cap: 16 });
    for (let t = 0; t < 10; t++) tm.add(t, sample(t, 2));
    const out = { a: new Float64Array(2), b: new Float64Array(2) };
    expect(tm.mean(out)).toEqual({ tStart: 6, tEnd: 9, count: 4, stored: 4 });
    expect(out.a[0]).toBeCloseTo(7.5, 14);
  });

  it("'last': pairs bins when the ring is full, keeping the exact mean of the samples held", () => {
    const tm = new ProfileTimeMean(['a', 'b'], 2, { kind: 'last', span: 100, cap: 4 });
    for (let t = 0; t < 10; t++) tm.add(t, sample(t, 2));
    // bins [0–3] [4–7] [8–9] after two pairings
    expect(tm.window).toEqual({ tStart: 0, tEnd: 9, count: 10, stored: 3 });
    expect(tm.binSize).toBe(4);
    const out = { a: new Float64Array(2), b: new Float64Array(2) };
    tm.mean(out);
    const ref = meanOf([0, 1, 2, 3, 4, 5, 6, 7, 8, 9], 2);
    expect(out.a[1]).toBeCloseTo(ref.a[1], 13);
    expect(out.b[0]).toBeCloseTo(ref.b[0], 12);
  });

  it('for random caps, spans and sampling: the mean is that of the samples in the reported window, inside [t − span, t]', () => {
    const next = seededSigned(42);
    let paired = 0;
    for (let trial = 0; trial < 40; trial++) {
      const cap = 2 * (1 + Math.floor(4 * (next() + 1)));
      const span = 1 + 5 * (next() + 1);
      const dt = 0.05 + 0.2 * (next() + 1);
      const nSamples = 5 + Math.floor(100 * (next() + 1));
      const tm = new ProfileTimeMean(['a', 'b'], 4, { kind: 'last', span, cap });
      const ts: number[] = [];
      for (let s = 0; s < nSamples; s++) {
        const t = 10 + s * dt;
        ts.push(t);
        tm.add(t, sample(t, 4));
      }
      const out = { a: new Float64Array(4), b: new Float64Array(4) };
      const w = tm.mean(out);
      const tNow = ts[ts.length - 1];
      const held = ts.filter((t) => t >= w.tStart && t <= w.tEnd);
      expect(w.tEnd).toBe(tNow);
      expect(w.tStart).toBeGreaterThanOrEqual(tNow - span);
      expect(w.count).toBe(held.length);
      expect(w.stored).toBeLessThanOrEqual(cap);
      // The window start lags the ideal start (t − span, or the first sample) by less than one bin.
      expect(w.tStart - Math.max(tNow - span, ts[0])).toBeLessThan(tm.binSize * dt * (1 + 1e-12));
      const ref = meanOf(held, 4);
      for (let j = 0; j < 4; j++) {
        expect(Math.abs(out.a[j] - ref.a[j])).toBeLessThan(1e-13 * Math.abs(ref.a[j]));
        expect(Math.abs(out.b[j] - ref.b[j])).toBeLessThan(1e-13 * Math.abs(ref.b[j]) + 1e-13 * 4);
      }
      if (tm.binSize > 1) paired++;
    }
    expect(paired).toBeGreaterThan(10); // the trials do exercise the downsampling
  });

  it('takes ZonalMeans records directly, averaging only the named profiles', () => {
    const tm = new ProfileTimeMean(['ubar', 'convUpvp'] as const, 8, { kind: 'since', tStart: 0 });
    const z = createZonalMeans(8);
    z.ubar.fill(2);
    tm.add(0, z);
    z.ubar.fill(4);
    tm.add(1, z);
    const out = { ubar: new Float64Array(8), convUpvp: new Float64Array(8) };
    expect(tm.mean(out).count).toBe(2);
    expect(out.ubar[5]).toBe(3);
  });

  it('refuses decreasing times, wrong lengths, odd caps, and an empty window', () => {
    const tm = new ProfileTimeMean(['a', 'b'], 2, { kind: 'last', span: 1 });
    expect(() => tm.mean({ a: new Float64Array(2), b: new Float64Array(2) })).toThrow(RangeError);
    tm.add(1, sample(1, 2));
    expect(() => tm.add(0.5, sample(0.5, 2))).toThrow(RangeError);
    expect(() => tm.add(2, sample(2, 3))).toThrow(RangeError);
    expect(() => new ProfileTimeMean(['a'], 2, { kind: 'last', span: 1, cap: 5 })).toThrow(RangeError);
    tm.reset();
    expect(tm.window.count).toBe(0);
  });
});
