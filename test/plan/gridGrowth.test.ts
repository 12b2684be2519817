import { describe, expect, it } from 'vitest';
import { keptRadius } from '../../lib/model/validateParams';
import { gridReaching, growthText } from '../../lib/plan/gridGrowth';

describe('grid growth', () => {
  it('doubles both sizes until the kept radius reaches the wavenumber asked for', () => {
    // 2π domain: k_max = ⌊n/3⌋; 100 needs n = 512 (k_max 170), from 128 (42).
    expect(gridReaching(128, 128, 2 * Math.PI, 2 * Math.PI, 100)).toEqual({ nx: 512, ny: 512 });
    expect(gridReaching(128, 64, 2 * Math.PI, Math.PI, 42)).toEqual({ nx: 128, ny: 64 });
    const g = gridReaching(256, 128, 2 * Math.PI, Math.PI, 300);
    expect(g && keptRadius({ ...g, Lx: 2 * Math.PI, Ly: Math.PI })).toBeGreaterThanOrEqual(300);
    expect(gridReaching(1024, 1024, 2 * Math.PI, 2 * Math.PI, 1e9)).toBeNull();
  });

  it('says what to do, or that it cannot be done', () => {
    expect(growthText({ nx: 1024, ny: 512 })).toBe('raise nx × ny to 1024 × 512');
    expect(growthText(null)).toMatch(/beyond 65536 points/);
  });
});
