import { describe, expect, it } from 'vitest';
import { RHINES_DEFINITIONS } from '../../lib/analysis/scales';
import { analysePlan } from '../../lib/plan/analysePlan';
import { planPreset } from '../../lib/plan/planPresets';
import { planReportMarkdown } from '../../lib/plan/planReport';
import { RHINES_LABELS } from '../../lib/plan/rhinesLabels';

const KEYS = Object.keys(RHINES_DEFINITIONS);
const codeKey = new RegExp(`\\b(${KEYS.join('|')})\\b`);

describe('Rhines conventions in text', () => {
  it('have a readable label each, with the formula of the length', () => {
    expect(Object.keys(RHINES_LABELS).sort()).toEqual([...KEYS].sort());
    for (const label of Object.values(RHINES_LABELS)) expect(label).not.toMatch(codeKey);
  });

  it('appear in predictions and in the report by their labels, the code keys only as entered', () => {
    const a = analysePlan(planPreset('jupiter').input);
    for (const p of Object.values(a.predictions)) expect(p.label, p.id).not.toMatch(codeKey);
    const report = planReportMarkdown(a)
      .split('\n')
      .filter((line) => !/^\| rhines \|/.test(line)); // the input as entered keeps its value
    for (const line of report) expect(line).not.toMatch(/\((kR|sqrtUbeta|piOverKR|twoPiSqrtUbeta)\)|spacing, kR/);
    expect(report.join('\n')).toContain('Rhines length 2π(U/β)^½');
  });
});
