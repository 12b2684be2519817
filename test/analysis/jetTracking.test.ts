import { describe, expect, it } from 'vitest';
import { HovmollerAccumulator, type HovmollerRecord } from '../../lib/analysis/hovmoller';
import { trackJets } from '../../lib/analysis/jetTracking';

const ny = 256;
const Ly = 2 * Math.PI;
const y = Float64Array.from({ length: ny }, (_, j) => (j * Ly) / ny);

/** A Hovmöller record of ū(y, t) sampled at times t_k = k·dt. */
function record(u: (y: number, t: number) => number, nt: number, dt: number, cap = 1024): HovmollerRecord {
  const h = new HovmollerAccumulator(ny, Ly, cap);
  for (let k = 0; k < nt; k++)
    h.add(
      k * dt,
      y.map((s) => u(s, k * dt)),
    );
  return h.snapshot();
}

/** Periodic Gaussian jet. */
const jet = (s: number, y0: number, w: number) =>
  [-Ly, 0, Ly].reduce((a, img) => a + Math.exp(-((s - y0 - img) ** 2) / (2 * w * w)), 0);

/** Two jets at 2 ∓ sep/2 with sep shrinking at 0.1 per unit time from 1.2, and a fixed jet at 5. */
const merging = (s: number, t: number) => {
  const sep = Math.max(1.2 - 0.1 * t, 0);
  return jet(s, 2 - sep / 2, 0.2) + jet(s, 2 + sep / 2, 0.2) + jet(s, 5, 0.2);
};

describe('jet tracking', () => {
  for (const c of [0.15, -0.4]) {
    it(`follows jets drifting at dy/dt = ${c} across the periodic seam`, () => {
      // Three cosine jets; over t ∈ [0, 20) each moves 20|c| ≥ 3, crossing y = 0 on the way.
      const r = trackJets(record((s, t) => Math.cos(3 * (s - c * t)), 200, 0.1));
      expect(r.tracks.length).toBe(3);
      expect(r.mergers).toEqual([]);
      expect(r.splits).toEqual([]);
      for (const tr of r.tracks) {
        expect(tr.t.length).toBe(200);
        expect(tr.start).toBe('record');
        expect(tr.end).toBe('record');
        // Parabolic refinement on a cosine of k = 3 errs by < 0.25·(k²/12)·dy³ ≈ 1e-6 (jets.test.ts).
        expect(Math.abs(tr.drift! - c)).toBeLessThan(1e-5);
        expect(Math.abs(tr.y[tr.y.length - 1] - tr.y[0])).toBeGreaterThan(2.9); // unwrapped
      }
    });
  }

  it('tracks through a record whose columns were averaged in pairs (bounded Hovmöller)', () => {
    const rec = record((s, t) => Math.cos(2 * (s - 0.2 * t)), 300, 0.05, 64);
    expect(rec.samplesPerColumn).toBeGreaterThan(1);
    const r = trackJets(rec);
    expect(r.tracks.length).toBe(2);
    // The mean of cosines shifted uniformly in time is a cosine at the mean shift: the drift survives.
    for (const tr of r.tracks) expect(Math.abs(tr.drift! - 0.2)).toBeLessThan(1e-5);
  });

  it('reports a merger: time, place and the two tracks, leaving the distant jet alone', () => {
    const r = trackJets(record(merging, 160, 0.1));
    expect(r.mergers.length).toBe(1);
    expect(r.splits).toEqual([]);
    const m = r.mergers[0];
    // Two equal Gaussians of width w are one crest once sep ≤ 2w = 0.4, i.e. by t = 8 [derived]; the
    // prominence criterion (0.2 of the range) separates them until the dip is shallower than that,
    // which happens later than sep = 0.8 (t = 4).
    expect(m.t).toBeGreaterThan(4);
    expect(m.t).toBeLessThanOrEqual(8 + 0.1);
    // The merged jet is the surviving crest: within half the separation of the centre (overlap pulls
    // the crests inward), and at the centre once sep ≤ 2w.
    const dy = Ly / ny;
    expect(Math.abs(m.y - 2)).toBeLessThanOrEqual(Math.max(1.2 - 0.1 * m.t, 0) / 2 + dy);
    const [ending, surviving] = m.tracks.map((id) => r.tracks[id]);
    expect(ending.end).toBe('merger');
    expect(surviving.end).toBe('record');
    expect(r.tracks.length).toBe(3);
    const fixed = r.tracks.find((tr) => Math.abs(tr.y[0] - 5) < 0.1)!;
    expect(fixed.t.length).toBe(160);
    expect(Math.abs(fixed.drift!)).toBeLessThan(1e-9);
    // Before the merger the two crests approach each other: drifts of opposite sign.
    expect(Math.sign(ending.drift!)).toBe(-Math.sign(ending.y[0] - 2));
  });

  it('reports a split: the time-reverse of the merger', () => {
    const r = trackJets(record((s, t) => merging(s, 16 - t), 160, 0.1));
    expect(r.splits.length).toBe(1);
    expect(r.mergers).toEqual([]);
    const sp = r.splits[0];
    expect(sp.t).toBeGreaterThanOrEqual(8 - 0.1);
    expect(sp.t).toBeLessThan(12);
    // The parent is the crest seen the column before: within half the separation then of the centre.
    const dy = Ly / ny;
    expect(Math.abs(sp.y - 2)).toBeLessThanOrEqual(Math.max(1.2 - 0.1 * (16 - sp.t + 0.1), 0) / 2 + dy);
    const [parent, child] = sp.tracks.map((id) => r.tracks[id]);
    expect(parent.start).toBe('record');
    expect(child.start).toBe('split');
    expect(child.t[0]).toBe(sp.t);
  });

  it('tells a jet that fades from one that merges, and one that emerges from a split', () => {
    // A jet at 4 dies out in amplitude by t = 5 and another grows at 1 from t = 5: far from the jet at 2.5.
    const u = (s: number, t: number) =>
      jet(s, 2.5, 0.2) + Math.max(1 - t / 5, 0) * jet(s, 4.5, 0.2) + Math.max(t / 5 - 1, 0) * jet(s, 0.5, 0.2);
    const r = trackJets(record(u, 100, 0.1));
    expect(r.mergers).toEqual([]);
    expect(r.splits).toEqual([]);
    expect(r.tracks.some((tr) => tr.end === 'faded')).toBe(true);
    expect(r.tracks.some((tr) => tr.start === 'emerged')).toBe(true);
  });
});
