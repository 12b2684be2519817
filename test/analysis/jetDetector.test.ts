import { describe, expect, it } from 'vitest';
import { FALSE_ALARM, StructureDetector } from '../../lib/analysis/jetDetector';
import { JetFinder } from '../../lib/analysis/jets';
import { normalQuantileUpper } from '../../lib/analysis/quantiles';
import { staircaseProfile } from '../support/jetFields';
import { noisySeries } from '../support/meanSeries';

// Ideal staircase flow [published] Dritschel & McIntyre, J. Atmos. Sci. 65, 855 (2008): jets (cusps)
// at the step edges, spacing L; total PV constant on steps of width L with jumps βL; u_max = βL²/12
// [derived] (docs/staircase.md). The significance rule and its derivation: docs/significance.md.
const beta = 2;
const periodic = (ny: number, Ly: number, y0 = 0) => ({ points: ny, y0, dy: Ly / ny, periodic: true });

function stairs(ny: number, Ly: number, steps: number, edge0: number) {
  const dy = Ly / ny;
  const L = Ly / steps;
  const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, beta, edge0).u);
  const q = Float64Array.from({ length: ny }, (_, j) => beta * staircaseProfile(j * dy, L, beta, edge0).centre);
  return { u, q, L, dy, umax: (beta * L * L) / 12 };
}

describe('the significance rule', () => {
  it('bounds a flat profile’s noise at all n points with the union bound: c = Φ⁻¹(1 − α/(2n)) [derived]', () => {
    const d = new StructureDetector(periodic(128, 1));
    expect(d.threshold).toBe(normalQuantileUpper(FALSE_ALARM / 256));
    // [published] Φ⁻¹(1 − 1e-5) = 4.264891 (Abramowitz & Stegun, table 26.1 [memory for the table]).
    expect(new StructureDetector(periodic(50, 1), { falseAlarm: 1e-3 }).threshold).toBeCloseTo(4.264891, 5);
  });

  it('finds the ideal staircase’s jets and steps without noise, and with noise well below the jets', () => {
    const [ny, Ly] = [256, 2 * Math.PI];
    const s = stairs(ny, Ly, 4, 0.3);
    const d = new StructureDetector(periodic(ny, Ly), { beta });
    for (const noise of [0, 0.1 * s.umax]) {
      const jets = d.jets(noisySeries(s.u, 64, { noise, r: 0.5, seed: 3 }));
      expect(jets.verdict).toBe('jets');
      expect(jets.count).toBe(4);
      jets.jets.forEach((j, k) => expect(Math.abs(j.y - (0.3 + k * s.L))).toBeLessThan(2 * s.dy));
      const steps = d.staircase(noisySeries(s.q, 64, { noise: noise * 0.5, r: 0.5, seed: 4 }));
      expect(steps.verdict).toBe('steps');
      expect(steps.edges.length).toBe(4);
      expect(steps.index as number).toBeGreaterThan(0.9);
    }
  });

  it('gives the same jets as the plain finder on a noise-free periodic profile of 2^k points', () => {
    const [ny, Ly] = [256, 2 * Math.PI];
    const s = stairs(ny, Ly, 5, 0.41);
    const ref = new JetFinder(ny, Ly).find(s.u);
    const got = new StructureDetector(periodic(ny, Ly, 5)).jets(noisySeries(s.u, 16));
    expect(got.count).toBe(ref.count);
    expect(got.jets.map((j) => j.y)).toEqual(ref.jets.map((j) => j.y + 5));
    expect(got.spacings).toEqual(ref.spacings);
  });

  it('claims no jets in noise alone, at several seeds, correlations and windows', () => {
    const [ny, Ly] = [128, 2 * Math.PI];
    const d = new StructureDetector(periodic(ny, Ly));
    const flat = new Float64Array(ny);
    let tested = 0;
    for (const seed of [1, 2, 3, 4, 5, 6])
      for (const [bins, r] of [
        [32, 0],
        [128, 0.7],
        [256, 0.9],
      ])
        for (const corr of [1, 4]) {
          const jets = d.jets(noisySeries(flat, bins, { noise: 1, r, corr, seed }));
          expect(jets.count).toBe(0);
          expect(jets.verdict).toBe('no-jets');
          tested += jets.candidates;
        }
    expect(tested).toBeGreaterThan(100); // many maxima were tested and none passed
  });

  it('says too short to tell with fewer than 8 batch means or a window shorter than the flow’s memory', () => {
    const [ny, Ly] = [128, 2 * Math.PI];
    const s = stairs(ny, Ly, 4, 0.3);
    expect(new StructureDetector(periodic(ny, Ly)).jets(noisySeries(s.u, 7)).verdict).toBe('too-short');
    const d = new StructureDetector(periodic(ny, Ly), { memory: 100 });
    const short = d.jets(noisySeries(s.u, 50));
    expect(short.verdict).toBe('too-short');
    expect(short.count).toBeNull();
    expect(short.reason).toMatch(/shorter than the flow's memory/);
    expect(d.jets(noisySeries(s.u, 100)).count).toBe(4);
  });

  it('lets the flow’s memory bound the independent samples: N_eff ≤ window/memory', () => {
    const [ny, Ly] = [128, 2 * Math.PI];
    const s = stairs(ny, Ly, 4, 0.3);
    const series = noisySeries(s.u, 200, { noise: 0.2 * s.umax, seed: 9 });
    const free = new StructureDetector(periodic(ny, Ly)).jets(series);
    const bound = new StructureDetector(periodic(ny, Ly), { memory: 50 }).jets(series);
    expect(free.effectiveSamples as number).toBeGreaterThan(50);
    expect(bound.effectiveSamples).toBe(4);
  });

  it('gives a standard error of the spacing that shrinks as the window grows, about as 1/√T [derived]', () => {
    const [ny, Ly] = [256, 2 * Math.PI];
    const s = stairs(ny, Ly, 4, 0.3);
    const d = new StructureDetector(periodic(ny, Ly));
    const err = (bins: number) => {
      const all: number[] = [];
      for (const seed of [11, 12, 13, 14]) {
        const j = d.jets(noisySeries(s.u, bins, { noise: 0.3 * s.umax, r: 0.3, seed }));
        expect(j.count).toBe(4);
        all.push(j.spacingStderr as number);
      }
      return all.reduce((a, b) => a + b, 0) / all.length;
    };
    const [e1, e4, e16] = [err(32), err(128), err(512)];
    expect(e4).toBeLessThan(e1);
    expect(e16).toBeLessThan(e4);
    // Four times the window: the error falls by about 2 (between 1.4 and 3 with four seeds).
    expect(e1 / e4).toBeGreaterThan(1.4);
    expect(e1 / e4).toBeLessThan(3);
    expect(e4 / e16).toBeGreaterThan(1.4);
    expect(e4 / e16).toBeLessThan(3);
  });
});

describe('profiles of any length, periodic or bounded', () => {
  it('find the jets of a periodic profile of 96 points (resampled), within the grid spacing', () => {
    const [ny, Ly, n] = [96, 3, 3];
    const dy = Ly / ny;
    const L = Ly / n;
    const e0 = 0.37 * dy + 0.2;
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, beta, e0).u);
    const p = new StructureDetector({ points: ny, y0: 0, dy, periodic: true }).jets(noisySeries(u, 16));
    expect(p.count).toBe(n);
    p.jets.forEach((j, k) => expect(Math.abs(j.y - (e0 + k * L))).toBeLessThan(dy));
    expect(Math.abs((p.meanSpacing as number) - L)).toBeLessThan(1e-12);
    for (const j of p.jets) expect(Math.abs(j.speed / ((beta * L * L) / 12) - 1)).toBeLessThan(0.05); // the cusp is cut by the sampling
  });

  it('on a bounded domain count only interior jets and measure spacings without wrapping', () => {
    const [ny, dy, L] = [181, 0.01, 0.37];
    const e0 = 0.113;
    const u = Float64Array.from({ length: ny }, (_, j) => staircaseProfile(j * dy, L, beta, e0).u);
    const p = new StructureDetector({ points: ny, y0: -0.9, dy, periodic: false }).jets(noisySeries(u, 16));
    const truth = [0, 1, 2, 3, 4].map((k) => e0 + k * L).filter((y) => y > 1.5 * dy && y < (ny - 1 - 1.5) * dy);
    expect(p.count).toBe(truth.length);
    p.jets.forEach((j, k) => expect(Math.abs(j.y - (-0.9 + truth[k]))).toBeLessThan(dy));
    expect(p.spacings.length).toBe(truth.length - 1);
    for (const sp of p.spacings) expect(Math.abs(sp - L)).toBeLessThan(dy);
  });

  it('does not call a maximum at the edge of a bounded domain a jet', () => {
    const u = Float64Array.from({ length: 50 }, (_, j) => Math.cos((Math.PI * j) / 49)); // highest at the south wall
    expect(new StructureDetector({ points: 50, y0: 0, dy: 1, periodic: false }).jets(noisySeries(u, 16)).count).toBe(0);
  });

  it('find steps, widths and index 1 on a bounded profile that does not span whole steps', () => {
    const b = 3;
    const [ny, dy, L] = [300, 0.01, 0.55];
    const e0 = 0.2037;
    const q = Float64Array.from({ length: ny }, (_, j) => b * staircaseProfile(j * dy, L, b, e0).centre);
    const p = new StructureDetector({ points: ny, y0: 10, dy, periodic: false }, { beta: b }).staircase(
      noisySeries(q, 16),
    );
    // Edges e0 + k·L inside the domain [0, 2.99], away from its ends by the 1.5-spacing margin.
    const truth = [0, 1, 2, 3, 4, 5, 6].map((k) => e0 + k * L).filter((e) => e > 1.5 * dy && e < (ny - 1 - 1.5) * dy);
    expect(truth.length).toBe(6);
    expect(p.edges.length).toBe(truth.length);
    p.edges.forEach((e, k) => expect(Math.abs(e - (10 + e0 + k * L))).toBeLessThanOrEqual(dy / 2 + dy / 8));
    for (const w of p.widths) expect(Math.abs(w - L)).toBeLessThan(dy + dy / 4);
    p.jumps.forEach((h) => expect(Math.abs(h / (b * L) - 1)).toBeLessThan(1e-12));
    // Levels are exact on every step, the two cut at the ends too: S = 1 to round-off.
    expect(Math.abs((p.index as number) - 1)).toBeLessThan(1e-12);
  });

  it('give index 0 and no steps for the plain gradient βy on a bounded profile', () => {
    const q = Float64Array.from({ length: 100 }, (_, j) => 3 * j * 0.1 + 7);
    const p = new StructureDetector({ points: 100, y0: 0, dy: 0.1, periodic: false }, { beta: 3 }).staircase(
      noisySeries(q, 16),
    );
    expect(p.edges).toEqual([]);
    expect(Math.abs(p.index as number)).toBeLessThan(1e-13);
  });
});
