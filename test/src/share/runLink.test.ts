import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { validateParams } from '../../../lib/model/validateParams';
import { DEMO_SCENARIOS } from '../../../lib/plan/demoScenarios';
import { appMemoryBudget, estimateAppMemory, roughBytes } from '../../../src/appMemory';
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

  it('refuse inherited names such as __proto__, naming the key, instead of dropping the entry', () => {
    for (const key of ['__proto__', 'toString', 'constructor', 'hasOwnProperty']) {
      const r = decodeRunLink(`v=1&${key}=1&beta=3`);
      expect(r, key).toEqual({ kind: 'bad', message: `“${key}” is not a parameter` });
    }
  });

  it('read numbers in decimal notation only: hexadecimal, binary and named numbers are refused, naming the key', () => {
    for (const raw of ['0x20', '0X20', '0b100000', '0o40', 'Infinity', '-Infinity', 'NaN', '1_0', '32px', '2π']) {
      const r = decodeRunLink(`v=1&nx=${encodeURIComponent(raw)}`);
      expect(r, raw).toEqual({ kind: 'bad', message: `nx = “${raw}” is not a number in decimal notation` });
    }
    // What the encoder writes, and hand-written decimal forms, still read.
    for (const [raw, x] of [
      ['256', 256],
      ['+256', 256],
      ['256.', 256],
      ['2.56e2', 256],
      ['2.56E+2', 256],
    ] as const) {
      expect(decodeRunLink(`v=1&nx=${encodeURIComponent(raw)}`), raw).toEqual({
        kind: 'run',
        params: validateParams({ nx: x }),
      });
    }
    expect(decodeRunLink(`v=1&nu=${encodeURIComponent('1e-15')}&mu=.05`)).toEqual({
      kind: 'run',
      params: validateParams({ nu: 1e-15, mu: 0.05 }),
    });
  });

  it('refuse a run over the app memory budget with the estimate, and take it where it fits', () => {
    const hash = 'v=1&nx=1024&ny=1024';
    const need = roughBytes(estimateAppMemory(validateParams({ nx: 1024, ny: 1024 })).totalBytes);
    expect(decodeRunLink(hash, appMemoryBudget(2))).toEqual({
      kind: 'bad',
      message: `1024 × 1024 needs ≈ ${need}; the app's budget is 512 MiB (a quarter of this device's 2 GiB)`,
    });
    expect(decodeRunLink(hash, appMemoryBudget(4))).toEqual({
      kind: 'run',
      params: validateParams({ nx: 1024, ny: 1024 }),
    });
    // Without a device memory (Node here) the budget is the cap, 1 GiB.
    expect(decodeRunLink(hash).kind).toBe('run');
  });
});
