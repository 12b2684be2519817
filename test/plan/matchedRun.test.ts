import { describe, expect, it } from 'vitest';
import { rhinesLength } from '../../lib/analysis/scales';
import { keptRadius, validateParams } from '../../lib/model/validateParams';
import { checkPlan } from '../../lib/plan/checks';
import { analysePlan } from '../../lib/plan/analysePlan';
import { MATCHED_DIGITS, roundSignificant } from '../../lib/plan/matchedRounding';
import { matchedRun } from '../../lib/plan/matchedRun';
import { planPreset } from '../../lib/plan/planPresets';
import { predictPlan } from '../../lib/plan/predictions';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { THRESHOLDS } from '../../lib/plan/thresholds';
import { goodModelPlan } from './quoted';

const rel = (a: number, b: number) => Math.abs(a / b - 1);
const matched = (over: Record<string, unknown>, opts = {}) => {
  const plan = resolvePlan(goodModelPlan(over));
  return { plan, pred: predictPlan(plan), m: matchedRun(plan, predictPlan(plan), opts) };
};
const ratio = (m: ReturnType<typeof matchedRun>, id: string) =>
  m.ratios.find((r) => r.id === id) as (typeof m.ratios)[number];

// A plan that is already cheap: 256², k_R = 5 (5 jets in 2π), k_f = 21.25 (k_f/k_R = 4.25),
// k_max = 85 (k_max/k_f = 4), run of 5 drag times.
const cheap = {
  grid: { kind: 'points', nx: 256, ny: 256 },
  forcing: { wavelength: (2 * Math.PI) / 21.25, halfWidth: 0.05 },
  runLength: 250,
};

describe('matched run', () => {
  it('keeps every ratio exactly when the planned run itself fits the target', () => {
    const { plan, m } = matched(cheap, { targetWallSeconds: 1e4 });
    expect([m.params.nx, m.params.ny]).toEqual([256, 256]);
    expect(m.gives).toBe('none');
    for (const r of m.ratios) expect(r.kept, `${r.id}: ${r.planned} → ${r.matched}`).toBe(true);
    expect(m.withinTarget).toBe(true);
    expect(() => validateParams(m.params)).not.toThrow();
    // Model units of the match: Lx = 2π, U = 1.
    expect(m.params.Lx).toBe(2 * Math.PI);
    expect(rel(m.predictions.U.value, 1)).toBeLessThan(4 * Number.EPSILON);
    expect(rel(m.params.kf, plan.kf)).toBeLessThan(1e-12); // the plan was already in these units
  });

  it('on a smaller grid keeps R_β and gives k_f/k_R first, within the grid constraint', () => {
    const { m, pred } = matched({}, { targetWallSeconds: 600 });
    expect(m.params.nx).toBeLessThan(512);
    expect(ratio(m, 'RBeta').kept).toBe(true);
    expect(rel(m.predictions.R_beta.value, pred.R_beta.value)).toBeLessThan(1e-12);
    expect(ratio(m, 'kfOverKR').kept).toBe(false);
    expect(ratio(m, 'kfOverKR').why).toMatch(/gives first|held at its floor/);
    // jets · (k_f/k_R) · (k_max/k_f) = k_max √2 Ly/γ on the matched grid.
    const [J, a, b] = ['jetsPerDomain', 'kfOverKR', 'kmaxOverKf'].map((id) => ratio(m, id).matched);
    const kMax = keptRadius(m.params);
    expect(rel(J * a * b, (kMax * Math.SQRT2 * m.params.Ly) / rhinesLength(1, 1, 'kR'))).toBeLessThan(1e-12);
    expect(m.withinTarget).toBe(true);
  });

  it('passes the scale-separation, jet-count and forcing checks when the plan does', () => {
    for (const target of [1, 600, 2000]) {
      const { m } = matched({}, { targetWallSeconds: target });
      for (const c of checkPlan(m.plan, m.predictions)) {
        if (
          [
            'scaleSeparation',
            'jetCount',
            'forcingNearGrid',
            'forcingAnnulus',
            'frictionDominated',
            'arrestInDomain',
          ].includes(c.id)
        )
          expect(c.severity, `${target} s, ${c.id}: ${c.message}`).toBe('ok');
      }
    }
  });

  it('lets the jet count give once k_f/k_R is at its floor, and reports it', () => {
    // 20 jets in a 4π × 4π domain at 1024², squeezed onto a few minutes' grid.
    const { m } = matched(
      {
        rotation: { kind: 'beta', beta: 200 },
        domain: { Lx: 4 * Math.PI, Ly: 4 * Math.PI },
        grid: { kind: 'points', nx: 1024, ny: 1024 },
        forcing: { wavelength: (2 * Math.PI) / 60, halfWidth: 0.05 },
      },
      { targetWallSeconds: 120 },
    );
    expect(['jetsPerDomain', 'kmaxOverKf']).toContain(m.gives);
    const a = ratio(m, 'kfOverKR');
    expect(a.why).toMatch(/held at its floor 4/);
    // L_jet/λ_f = k_f/k_R for k_R; at its floor up to the rounding of the parameters to 4 figures.
    expect(a.matched).toBeGreaterThanOrEqual(THRESHOLDS.minJetToForcing);
    expect(rel(a.matched, THRESHOLDS.minJetToForcing)).toBeLessThan(2e-3);
    expect(ratio(m, 'jetsPerDomain').kept).toBe(false);
    expect(ratio(m, 'jetsPerDomain').matched).toBeGreaterThanOrEqual(THRESHOLDS.minJets);
    expect(ratio(m, 'RBeta').kept).toBe(true);
  });

  it('keeps the secondary ratios: deformation, grid damping over turnover, aspect', () => {
    const { m } = matched(
      {
        deformation: { kind: 'radius', Ld: 0.5 },
        domain: { Lx: 4 * Math.PI, Ly: 2 * Math.PI },
        grid: { kind: 'points', nx: 1024, ny: 512 },
      },
      { targetWallSeconds: 120 },
    );
    for (const id of ['kdOverKR', 'gridDampingOverTurnover', 'aspect', 'RBeta'])
      expect(ratio(m, id).kept, id).toBe(true);
    expect(m.params.nx / m.params.ny).toBe(2);
  });

  it('shortens a long run to two steady-state times unless asked to keep it', () => {
    const long = matched({}, { targetWallSeconds: 1e5 }).m; // planned μT = 10
    expect(ratio(long, 'runDragTimes').matched).toBeCloseTo(THRESHOLDS.steadyMultiple, 12);
    expect(ratio(long, 'runDragTimes').why).toMatch(/steady state/);
    const kept = matched({}, { targetWallSeconds: 1e5, runLength: 'planned' }).m;
    expect(ratio(kept, 'runDragTimes').kept).toBe(true);
  });

  it('widens an annulus too thin for the matched grid and says so', () => {
    const { m } = matched(
      { forcing: { wavelength: (2 * Math.PI) / 40, halfWidth: 0.001 } },
      { targetWallSeconds: 120 },
    );
    const w = ratio(m, 'annulusHalfWidth');
    expect(w.kept).toBe(false);
    expect(w.why).toMatch(/widened/);
    expect(m.params.dkf).toBeGreaterThanOrEqual(0.5 - 1e-12); // half a grid wavenumber of a 2π domain
  });

  it('picks the largest grid within the target and flags a target no grid meets', () => {
    const { plan, pred, m } = matched({}, { targetWallSeconds: 2000 });
    expect(m.params.nx).toBe(256);
    const smaller = matchedRun(plan, pred, { targetWallSeconds: m.cost.wallSeconds * 0.999 });
    expect(smaller.params.nx).toBeLessThan(m.params.nx);
    const faster = matchedRun(plan, pred, { targetWallSeconds: 2000, speed: 16 });
    expect(faster.params.nx).toBeGreaterThan(m.params.nx);
    const none = matchedRun(plan, pred, { targetWallSeconds: 1e-3 });
    expect(none.withinTarget).toBe(false);
    expect(none.notes.join(' ')).toMatch(/no workable grid fits the target/);
  });

  it('rounds its parameters and run length to a few significant figures, keeping every check it passed', () => {
    const jupiter = analysePlan(planPreset('jupiter').input);
    const m = jupiter.matched!;
    // The Jupiter preset's match sits at the jet-count and k_f/k_R floors: 3 jets in Ly = π give
    // k_R = 6, β = 2k_R² = 72, k_f = 4k_R = 24 [derived]; unrounded they came out as 72.000000144.
    expect([m.params.beta, m.params.kf, m.params.dkf]).toEqual([72, 24, 2.4]);
    expect(m.digits).toBe(MATCHED_DIGITS);
    expect(m.plan.runLength).toBe(153.8);
    for (const k of ['beta', 'kd', 'mu', 'eps', 'kf', 'dkf', 'nu', 'dt'] as const)
      expect(Number(m.params[k].toPrecision(MATCHED_DIGITS)), k).toBe(m.params[k]);
    // μ = ε keeps U = 1 exactly, and the checks are those of the unrounded match.
    expect(m.params.mu).toBe(m.params.eps);
    expect(m.predictions.U.value).toBe(1);
    for (const c of jupiter.matchedChecks)
      if (['scaleSeparation', 'jetCount', 'forcingNearGrid', 'forcingAnnulus'].includes(c.id))
        expect(c.severity, c.id).toBe('ok');
  });

  it('rounds up or down to a number of significant figures, exactly', () => {
    expect(roundSignificant(72.000000144, 4)).toBe(72);
    expect(roundSignificant(72.000000144, 4, 'up')).toBe(72.01);
    expect(roundSignificant(72.000000144, 4, 'down')).toBe(72);
    expect(roundSignificant(0.003272492347489368, 4, 'down')).toBe(0.003272);
    expect(roundSignificant(0.003272492347489368, 4, 'up')).toBe(0.003273);
    expect(roundSignificant(9.9996, 4, 'up')).toBe(10);
    expect(roundSignificant(-1.23456, 3, 'down')).toBe(-1.24);
    expect(roundSignificant(0, 4, 'up')).toBe(0);
  });

  it('refuses a plan whose aspect no model grid can hold', () => {
    const plan = resolvePlan(
      goodModelPlan({
        domain: { Lx: 2048 * 2 * Math.PI, Ly: 2 * Math.PI },
        grid: { kind: 'points', nx: 65536, ny: 32 },
      }),
    );
    expect(() => matchedRun(plan)).toThrow(RangeError);
  });
});
