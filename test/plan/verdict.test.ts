import { describe, expect, it } from 'vitest';
import { RunMonitor } from '../../lib/analysis/runMonitor';
import { summarize, type RunSummary } from '../../lib/analysis/summary';
import { Model } from '../../lib/model/model';
import type { ModelParams } from '../../lib/model/params';
import { planInputFromModelParams } from '../../lib/plan/modelPlanInput';
import { predictPlan } from '../../lib/plan/predictions';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { judge, verdicts } from '../../lib/plan/verdict';

// A strongly damped stirred run reaches its steady state in a few time units, where the drag
// balance U = (ε/μ)^½ holds up to the hyperviscous share [derived] (CHECKS: budgets and forcing).
const RUN = { nx: 32, ny: 32, beta: 4, mu: 1, eps: 1, kf: 5, dkf: 1, nu: 1e-9, nu_order: 4, dt: 0.02, cfl: 0.5 };

function measured(): RunSummary {
  const model = new Model(RUN);
  const mon = new RunMonitor(model.params);
  let next = 0;
  while (model.time < 40) {
    mon.step(model.step());
    if (model.time >= next) {
      mon.sample(model.qHat, model.time);
      next += 0.1;
    }
  }
  return summarize(mon, model.time, model.steps);
}

const predictionsFor = (p: Partial<ModelParams>) => predictPlan(resolvePlan(planInputFromModelParams(p, 40).input));

describe('verdicts of a measured run against its predictions', () => {
  const m = measured();

  it('agree on the drag balance, and stop agreeing when a parameter is wrong by 2×', () => {
    expect(m.steady).toBe(true);
    const right = verdicts(predictionsFor(RUN), m);
    const row = (rows: ReturnType<typeof verdicts>, key: string) => rows.find((r) => r.key === key)!;
    expect(row(right, 'u_rms').verdict).toBe('agrees');
    expect(row(right, 'k_beta').verdict).toBe('agrees');
    // μ twice too large predicts U smaller by √2 and R_β by 2^{1/4}: beyond the scaling's scatter.
    const wrongMu = verdicts(predictionsFor({ ...RUN, mu: 2 * RUN.mu }), m);
    expect(row(wrongMu, 'u_rms').verdict).toBe('does not agree');
    expect(row(wrongMu, 'u_rms').note).toMatch(/check ε and μ/);
    // ε twice too large predicts U larger by √2 and k_β smaller by 2^{1/5}.
    const wrongEps = verdicts(predictionsFor({ ...RUN, eps: 2 * RUN.eps }), m);
    expect(row(wrongEps, 'u_rms').verdict).toBe('does not agree');
    expect(row(wrongEps, 'k_beta').verdict).toBe('does not agree');
  });

  it('cannot tell while the run spins up, or without a measurement', () => {
    const spinning = verdicts(predictionsFor(RUN), { ...m, steady: false, regime: 'spinning-up' });
    for (const r of spinning) expect(r.verdict).toBe('cannot tell');
    expect(judge('jet_spacing', 1, null, null, { missing: 'no jets' }).verdict).toBe('cannot tell');
  });

  it('compares logarithms within 2·((σ/m)² + r²)^½ [practice], alike for a factor too large or too small', () => {
    const v = judge('u_rms', 1, 1.25, 0.1);
    expect(v.tolerance).toBeCloseTo(2 * Math.hypot(0.1 / 1.25, 0.15), 14);
    expect(v.verdict).toBe('agrees');
    expect(judge('u_rms', 1, 1.5, 0.1).verdict).toBe('does not agree');
    expect(judge('u_rms', 1.5, 1, 0.1 / 1.5).verdict).toBe('does not agree');
    // No jets where some were predicted: compared directly.
    expect(judge('jet_count', 4, 0, 0).verdict).toBe('does not agree');
  });
});
