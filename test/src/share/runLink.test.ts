import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { validateParams } from '../../../lib/model/validateParams';
import { DEMO_SCENARIOS } from '../../../lib/plan/demoScenarios';
import { decodeRunLink, encodeRunLink } from '../../../src/share/runLink';

describe('run links', () => {
  it('round-trip every scenario bit for bit', () => {
    for (const s of DEMO_SCENARIOS) {
      const p = validateParams(s.params);
      const back = decodeRunLink(`#${encodeRunLink(p)}`);
      expect(back, s.id).toEqual({ kind: 'run', params: p });
    }
  });

  it('write only what differs from the model defaults, with the version first', () => {
    expect(encodeRunLink({ ...DEFAULT_PARAMS })).toBe('v=1');
    const p = { ...DEFAULT_PARAMS, beta: 12.5, force_zonal: true, nu: 1e-15, mu: 0.05 };
    const link = encodeRunLink(p);
    expect(link).toBe('v=1&beta=12.5&mu=0.05&nu=1e-15&force_zonal=true');
    expect(decodeRunLink(link)).toEqual({ kind: 'run', params: p });
  });

  it('say "no run" for an empty hash', () => {
    expect(decodeRunLink('')).toEqual({ kind: 'none' });
    expect(decodeRunLink('#')).toEqual({ kind: 'none' });
  });

  it('refuse with a message naming what is wrong', () => {
    const bad = (hash: string) => {
      const r = decodeRunLink(hash);
      if (r.kind !== 'bad') throw new Error(`accepted ${hash}`);
      return r.message;
    };
    expect(bad('beta=3')).toMatch(/no version/);
    expect(bad('v=2&beta=3')).toMatch(/version 2/);
    expect(bad('v=1&wind=3')).toMatch(/“wind” is not a parameter/);
    expect(bad('v=1&beta=fast')).toMatch(/beta = “fast” is not a number/);
    expect(bad('v=1&beta=')).toMatch(/beta = “” is not a number/);
    expect(bad('v=1&force_zonal=yes')).toMatch(/force_zonal = “yes” must be true or false/);
    expect(bad('v=1&mu=-1')).toMatch(/mu = -1: .*linear drag/);
    expect(bad('v=1&nx=100')).toMatch(/nx = 100: must be a power of two/);
    expect(bad('v=1&forcing=gusty')).toMatch(/forcing = "gusty"/);
  });
});
