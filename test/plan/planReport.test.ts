import { describe, expect, it } from 'vitest';
import { analysePlan } from '../../lib/plan/analysePlan';
import { MEASURED_STEP } from '../../lib/plan/cost';
import { PLAN_PRESETS } from '../../lib/plan/planPresets';
import { planReportBlocks, planReportHtml, planReportMarkdown } from '../../lib/plan/planReport';
import { escapeHtml } from '../../lib/plan/reportDocument';
import { goodModelPlan } from './quoted';

const ocean = analysePlan(PLAN_PRESETS[1].input);
const text = (a: typeof ocean) =>
  planReportBlocks(a).flatMap((b) =>
    b.type === 'table'
      ? [...b.head, ...b.rows.flat()]
      : b.type === 'list'
        ? b.items
        : b.type === 'figure'
          ? [b.caption]
          : [b.text],
  );

describe('plan report', () => {
  it('holds every input, prediction (formula and source), check (with fix), the cost and the matched run', () => {
    const all = text(ocean).join('\n');
    for (const field of [
      'rotation.latitudeDeg',
      'deformation.Ld',
      'drive.U',
      'dragTime',
      'forcing.wavelength',
      'forcing.halfWidth',
      'domain.Lx',
      'grid.nx',
      'hyperviscosity.gridDampingTime',
      'runLength',
      'cfl',
      'rhines',
    ])
      expect(all).toContain(field);
    for (const p of Object.values(ocean.predictions)) {
      expect(all).toContain(p.label);
      expect(all).toContain(p.formula);
      expect(all).toContain(p.reference);
    }
    for (const c of ocean.checks) {
      expect(all).toContain(c.title);
      expect(all).toContain(c.message);
      if (c.fix) expect(all).toContain(c.fix);
    }
    expect(ocean.checks.some((c) => c.severity === 'warning')).toBe(true); // the small deformation radius
    expect(all).toMatch(/wall time/);
    expect(all).toContain(`${ocean.cost.steps}`);
    expect(all).toContain(`measured ${MEASURED_STEP.measured_on}`);
    for (const r of ocean.matched?.ratios ?? []) expect(all).toContain(r.label);
    expect(all).toMatch(/Length unit ℓ = Lx\/2π/);
  });

  it('renders self-contained HTML with the ladder inline and the text escaped', () => {
    const hostile = analysePlan({ ...PLAN_PRESETS[0].input, title: '<img src=x onerror=alert(1)> & "q"' });
    const html = planReportHtml(hostile);
    expect(html).toContain(escapeHtml('<img src=x onerror=alert(1)> & "q"'));
    expect(html).not.toMatch(/<img|<script|<iframe|<link/i);
    expect(html).not.toMatch(/<[^>]*\s(src|href)\s*=/i); // no such attribute on any element
    expect(html).toMatch(/<figure>\n<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect(html).toContain('regime: zonostrophic');
    expect(html).toContain('<h2>Checks</h2>');
  });

  it('renders Markdown with the same sections and the figure as a data URI', () => {
    const md = planReportMarkdown(ocean);
    for (const h of [
      '## Inputs as entered',
      '## Inputs as derived',
      '## Model units',
      '## Predictions',
      '## Checks',
      '## Matched cheap run',
      '## Scale ladder',
    ])
      expect(md).toContain(h);
    expect(md).toMatch(/Cost with Stria/);
    expect(md).toMatch(/!\[[^\]]*\]\(data:image\/svg\+xml;charset=utf-8,%3Csvg/);
    expect(md).not.toMatch(/<svg|<script/);
  });

  it('says when a plan is in model units and when no matched run exists', () => {
    const model = text(analysePlan(goodModelPlan())).join('\n');
    expect(model).toMatch(/The plan is in model units; no scaling applies/);
    const unmatched = analysePlan(
      goodModelPlan({
        domain: { Lx: 2048 * 2 * Math.PI, Ly: 2 * Math.PI },
        grid: { kind: 'points', nx: 65536, ny: 32 },
      }),
    );
    expect(unmatched.matched).toBeNull();
    expect(text(unmatched).join('\n')).toMatch(/No matched run: no grid can hold a matched run/);
  });
});
