import { describe, expect, it } from 'vitest';
import { MEAN_PROFILES, RunMonitor, structureOf } from '../../lib/analysis/runMonitor';
import { summarize } from '../../lib/analysis/summary';
import { ProfileTimeMean, type TimeWindow } from '../../lib/analysis/timeMean';
import { Model } from '../../lib/model/model';

// The jet detector on real runs (docs/significance.md). Without β no jets form: isotropic 2D
// turbulence builds domain-size vortices, whose zonal means wander but are no jets [practice]. From
// rest no jet exists before the flow has spun up (energy e-folds at 2μ under linear drag [derived]).
const ISOTROPIC = { nx: 64, ny: 64, beta: 0, mu: 0.05, eps: 0.02, kf: 12, dkf: 2, nu: 1e-21, nu_order: 8, cfl: 0.8 };
const JETS = { ...ISOTROPIC, beta: 40 };

/** Run `params` to `until`, sampling every 0.25; at each check time the counts of every window's jets. */
function counts(params: Record<string, unknown>, until: number, windows: TimeWindow[], checks: number[]) {
  const model = new Model(params);
  const mon = new RunMonitor(model.params);
  const means = windows.map((w) => new ProfileTimeMean(MEAN_PROFILES, model.params.ny, w));
  const out = { ubar: new Float64Array(model.params.ny), qtot: new Float64Array(model.params.ny) };
  const found: { t: number; window: number; count: number | null }[] = [];
  let next = 0.25;
  let check = 0;
  while (model.time < until) {
    mon.step(model.step());
    if (model.time >= next) {
      next += 0.25;
      const z = mon.sample(model.qHat, model.time);
      for (const m of means) m.add(model.time, z);
    }
    if (check < checks.length && model.time >= checks[check]) {
      means.forEach((m, i) =>
        found.push({ t: checks[check], window: i, count: structureOf(mon.detector, m, out)?.jets.count ?? null }),
      );
      check++;
    }
  }
  return { found, summary: summarize(mon, model.time, model.steps) };
}

describe('the jet detector on real runs', () => {
  it('finds no jets without β, at several seeds and windows', () => {
    const windows: TimeWindow[] = [
      { kind: 'last', span: 20 },
      { kind: 'last', span: 40 },
      { kind: 'since', tStart: 20 },
    ];
    let judged = 0;
    for (const seed of [1, 2, 3]) {
      const { found } = counts({ ...ISOTROPIC, seed }, 100, windows, [40, 60, 80, 100]);
      for (const f of found) {
        expect([0, null], `seed ${seed}, window ${f.window}, t = ${f.t}`).toContain(f.count);
        if (f.count === 0) judged++;
      }
    }
    // Most windows were long enough to judge, and none saw a jet.
    expect(judged).toBeGreaterThan(20);
  });

  it('claims no jets before the spin-up time, and calls the run spinning up', () => {
    const spinUp = 1 / (2 * JETS.mu);
    const { found, summary } = counts(
      JETS,
      spinUp,
      [
        { kind: 'last', span: 20 },
        { kind: 'since', tStart: 0 },
      ],
      [2, 5, 10, spinUp],
    );
    for (const f of found) expect([0, null]).toContain(f.count);
    expect(summary.regime).toBe('spinning-up');
    expect(summary.steady).toBe(false);
    expect(summary.jet_count === null || summary.jet_count === 0).toBe(true);
  });
});

describe('the same run with β', () => {
  it('does find jets once they have formed: the detector is not blind', () => {
    const { found, summary } = counts(JETS, 150, [{ kind: 'last', span: 40 }], [150]);
    expect(found[0].count).toBeGreaterThanOrEqual(2);
    expect(summary.jet_verdict).toBe('jets');
  });
});
