import { describe, expect, it } from 'vitest';
import {
  COMPARE_PARAMS,
  compareRuns,
  DEFAULT_COMPARE,
  refusal,
  startingValues,
} from '../../../src/compare/compareSetup';

describe('compareRuns', () => {
  it('differ in the chosen parameter alone, with the same seed', () => {
    const [a, b] = compareRuns(DEFAULT_COMPARE);
    expect([a.beta, b.beta]).toEqual([0, 40]);
    const differing = (Object.keys(a) as (keyof typeof a)[]).filter((k) => a[k] !== b[k]);
    expect(differing).toEqual(['beta']);
    expect(a.seed).toBe(b.seed);
  });

  it('refuse a value the model refuses, saying why', () => {
    expect(refusal(DEFAULT_COMPARE, -1)).toMatch(/β: a finite number ≥ 0/);
    expect(refusal(DEFAULT_COMPARE, 10)).toBeNull();
    expect(() => compareRuns({ ...DEFAULT_COMPARE, key: 'kf', a: 500 })).toThrow(/kf/);
  });
});

describe('startingValues', () => {
  it('give two values the model accepts for every parameter and scenario', () => {
    for (const scenario of ['jets', 'isotropic', 'deformation']) {
      for (const { key } of COMPARE_PARAMS) {
        const { a, b } = startingValues(scenario, key);
        expect(() => compareRuns({ scenario, key, a, b }), `${scenario} ${key}`).not.toThrow();
        expect(a).not.toBe(b);
      }
    }
  });
});
