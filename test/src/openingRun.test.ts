import { describe, expect, it } from 'vitest';
import { DEFAULT_SCENARIO_ID, DEMO_SCENARIOS } from '../../lib/plan/demoScenarios';
import { matchScenario, openingRun, scenarioParams } from '../../src/openingRun';
import { encodeRunLink } from '../../src/share/runLink';

describe('the opening run', () => {
  it('is the default scenario when the address has no link', () => {
    const o = openingRun('');
    expect(o.linkError).toBeNull();
    expect(matchScenario(o.params)).toBe(DEFAULT_SCENARIO_ID);
  });

  it('is the linked run when the link is good', () => {
    const p = { ...scenarioParams('few-jets'), seed: 99 };
    const o = openingRun(`#${encodeRunLink(p)}`);
    expect(o).toEqual({ params: p, linkError: null });
    expect(matchScenario(o.params)).toBeNull();
  });

  it('is the default scenario, with the reason, when the link is bad', () => {
    const o = openingRun('#v=1&kf=500');
    expect(o.linkError).toMatch(/kf = 500: forcing annulus/);
    expect(matchScenario(o.params)).toBe(DEFAULT_SCENARIO_ID);
  });

  it('recognises every scenario by its parameters', () => {
    for (const s of DEMO_SCENARIOS) expect(matchScenario(scenarioParams(s.id))).toBe(s.id);
  });
});
