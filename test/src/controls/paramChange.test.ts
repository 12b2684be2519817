import { describe, expect, it } from 'vitest';
import { DEFAULT_PARAMS } from '../../../lib/model/params';
import { appMemoryBudget, estimateAppMemory, roughBytes } from '../../../src/appMemory';
import {
  describeIssues,
  formatNumber,
  memoryRefusalOf,
  parseNumber,
  refusalOf,
} from '../../../src/controls/paramChange';

describe('parameter entry', () => {
  it('reads plain and exponent numbers, and multiples of π', () => {
    expect(parseNumber(' 0.02 ')).toBe(0.02);
    expect(parseNumber('3e-26')).toBe(3e-26);
    expect(parseNumber('-1.5E+3')).toBe(-1500);
    expect(parseNumber('.5')).toBe(0.5);
    expect(parseNumber('2π')).toBe(2 * Math.PI);
    expect(parseNumber('2 pi')).toBe(2 * Math.PI);
    expect(parseNumber('π')).toBe(Math.PI);
    expect(parseNumber('0.5PI')).toBe(0.5 * Math.PI);
  });

  it('refuses what is not a number', () => {
    for (const t of ['', 'fast', '1,5', '0x10', '1e', 'Infinity', 'NaN', '1e999', '2ππ'])
      expect(parseNumber(t), t).toBeNull();
  });

  it('shows exact multiples of π as such, anything else exactly', () => {
    expect(formatNumber(2 * Math.PI)).toBe('2π');
    expect(formatNumber(Math.PI)).toBe('π');
    expect(formatNumber(0.25 * Math.PI)).toBe('0.25π');
    expect(formatNumber(6.28)).toBe('6.28');
    expect(formatNumber(24)).toBe('24');
    expect(formatNumber(3e-26)).toBe('3e-26');
    for (const x of [2 * Math.PI, 0.25 * Math.PI, 6.28, 3e-26, 0.1 + 0.2]) expect(parseNumber(formatNumber(x))).toBe(x);
  });

  it('finds the refusal of a change with validateParams, including rules between fields', () => {
    expect(refusalOf({ ...DEFAULT_PARAMS }, { beta: 3 })).toBeNull();
    const mu = refusalOf({ ...DEFAULT_PARAMS }, { mu: -1 });
    expect(mu?.map((i) => i.field)).toEqual(['mu']);
    const grid = refusalOf({ ...DEFAULT_PARAMS }, { nx: 32 });
    expect(grid?.map((i) => i.field)).toEqual(['kf']);
    expect(describeIssues(grid ?? [], 'nx')).toMatch(/^kf: forcing annulus/);
    expect(describeIssues(mu ?? [], 'mu')).toMatch(/^out of range \(linear drag μ/);
  });

  it('refuses a new grid over the memory budget at the edited field, counting the run it replaces', () => {
    const two = appMemoryBudget(2); // 512 MiB: a device of 2 GiB
    const at = { ...DEFAULT_PARAMS, nx: 1024, ny: 512 };
    const issues = memoryRefusalOf(at, { ny: 1024 }, two);
    const need = estimateAppMemory({ ...at, ny: 1024 }, at).totalBytes;
    expect(issues).toEqual([
      {
        field: 'ny',
        value: 1024,
        message: `1024 × 1024 needs ≈ ${roughBytes(need)} with the 1024 × 512 run it replaces; the app's budget is 512 MiB (a quarter of this device's 2 GiB)`,
      },
    ]);
    expect(describeIssues(issues ?? [], 'ny')).toMatch(/^1024 × 1024 needs ≈ \d+ MiB with the 1024 × 512 run/);
    // Smaller grids, changes that keep the model, and the same value pass; the cap takes 1024² too.
    expect(memoryRefusalOf(at, { ny: 256 }, two)).toBeNull();
    expect(memoryRefusalOf({ ...at, ny: 1024 }, { beta: 3 }, two)).toBeNull();
    expect(memoryRefusalOf({ ...at, ny: 1024 }, { ny: 1024 }, two)).toBeNull();
    expect(memoryRefusalOf(at, { ny: 1024 }, appMemoryBudget(8))).toBeNull();
    // A new domain builds a new model as well.
    expect(memoryRefusalOf({ ...at, ny: 1024 }, { Lx: 3 }, two)?.map((i) => i.field)).toEqual(['Lx']);
  });
});
