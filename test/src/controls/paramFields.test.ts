import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { keptRadius } from '../../../lib/model/validateParams';
import { isChoice, PARAM_GROUPS } from '../../../src/controls/paramFields';

describe('parameter fields', () => {
  const fields = PARAM_GROUPS.flatMap((g) => g.fields);

  it('offer every parameter but the scheme (there is one), each once', () => {
    const keys = fields.map((f) => f.key).sort();
    const expected = Object.keys(DEFAULT_PARAMS)
      .filter((k) => k !== 'scheme')
      .sort();
    expect(keys).toEqual(expected);
  });

  it('give every number a symbol, a name and its range, and the forcing range follows the grid', () => {
    for (const f of fields) {
      expect(f.symbol.length, f.key).toBeGreaterThan(0);
      expect(f.name.length, f.key).toBeGreaterThan(0);
      if (!isChoice(f)) expect(f.range({ ...DEFAULT_PARAMS }).length, f.key).toBeGreaterThan(0);
    }
    const kf = fields.find((f) => f.key === 'kf');
    if (!kf || isChoice(kf)) throw new Error('no k_f field');
    const p = { ...DEFAULT_PARAMS, nx: 64, ny: 64 };
    expect(kf.range(p)).toContain(`≤ ${keptRadius(p)}`);
  });

  it('offer only valid grid sizes', () => {
    const nx = fields.find((f) => f.key === 'nx');
    expect(nx && !isChoice(nx) ? nx.choices : []).toEqual([32, 64, 128, 256, 512, 1024]);
  });
});
