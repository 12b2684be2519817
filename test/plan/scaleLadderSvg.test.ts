import { describe, expect, it } from 'vitest';
import { predictPlan } from '../../lib/plan/predictions';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { escapeXml, ladderMarks, scaleLadderSvg } from '../../lib/plan/scaleLadderSvg';
import { goodModelPlan } from './quoted';

const of = (over: Record<string, unknown> = {}) => {
  const plan = resolvePlan(goodModelPlan(over));
  return { plan, pred: predictPlan(plan) };
};

describe('scale ladder', () => {
  it('marks every wavenumber of the plan, in increasing k, at k = 2π/L for lengths', () => {
    const { plan, pred } = of({
      deformation: { kind: 'radius', Ld: 0.25 },
      domain: { Lx: 4 * Math.PI, Ly: 2 * Math.PI },
    });
    const marks = ladderMarks(plan, pred);
    const byId = Object.fromEntries(marks.map((m) => [m.id, m.k]));
    expect(Object.keys(byId).sort()).toEqual(
      ['domainX', 'domainY', 'kBeta', 'kFric', 'kMax', 'kNu', 'kd', 'kf', 'rhines', 'staircase'].sort(),
    );
    expect(byId.domainY).toBe(1);
    expect(byId.domainX).toBe(0.5);
    expect(byId.rhines).toBeCloseTo(pred.kR.value, 12); // the k_R convention's length is 2π/k_R
    expect(byId.kd).toBe(4);
    expect(byId.kMax).toBe(plan.kMax);
    for (let i = 1; i < marks.length; i++) expect(marks[i].k).toBeGreaterThanOrEqual(marks[i - 1].k);
  });

  it('leaves out the deformation mark of a barotropic plan and a second domain mark of a square one', () => {
    const ids = ladderMarks(of().plan, of().pred).map((m) => m.id);
    expect(ids).not.toContain('kd');
    expect(ids).not.toContain('domainX');
  });

  it('draws self-contained SVG that names the regime and escapes its text', () => {
    const { plan, pred } = of();
    const svg = scaleLadderSvg(plan, pred);
    expect(svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(svg.trim().endsWith('</svg>')).toBe(true);
    expect(svg).toContain('regime: zonostrophic');
    expect(svg).not.toMatch(/<script|href|<image|url\(/i);
    for (const m of ladderMarks(plan, pred)) expect(svg).toContain(escapeXml(`${m.symbol} ${m.label}`));
    expect(scaleLadderSvg(plan, pred, { standalone: false })).not.toContain('xmlns');
    // Balanced elements: every <text> and <svg> closes.
    expect((svg.match(/<text/g) ?? []).length).toBe((svg.match(/<\/text>/g) ?? []).length);
    expect(escapeXml(`<&>"'`)).toBe('&lt;&amp;&gt;&quot;&#39;');
  });

  it('keeps labels at least 13 px apart even when marks coincide', () => {
    // k_d = k_R exactly: two marks at one place.
    const { plan, pred } = of({ deformation: { kind: 'radius', Ld: 1 / 5 } });
    const xs = [...scaleLadderSvg(plan, pred).matchAll(/rotate\(-90 ([0-9.]+) /g)].map((m) => Number(m[1]));
    expect(xs.length).toBe(ladderMarks(plan, pred).length);
    for (let i = 1; i < xs.length; i++) expect(xs[i] - xs[i - 1]).toBeGreaterThanOrEqual(13 - 0.01);
  });
});
