import { describe, expect, it } from 'vitest';
import { planFieldParser } from '../../../src/plan/planFieldParser';

describe('plan fields read as people type them', () => {
  it('takes unit words in a physical plan and stores SI (1 km = 1000 m, 1 d = 86 400 s: SI, common practice)', () => {
    expect(planFieldParser('domain.Lx', 'physical')?.('500 km')).toBe(500_000);
    expect(planFieldParser('dragTime', 'physical')?.('30 d')).toBe(30 * 86_400);
    expect(planFieldParser('runLength', 'physical')?.('6 h')).toBe(6 * 3600);
    expect(planFieldParser('rotation.latitudeDeg', 'physical')?.('45°S')).toBe(-45);
    expect(planFieldParser('domain.Lx', 'physical')?.('2.5e6')).toBe(2.5e6);
  });

  it('names the units a field takes when the word is not one of them', () => {
    expect(planFieldParser('domain.Lx', 'physical')?.('3 d')).toEqual({ error: expect.stringMatching(/m, km/) });
  });

  it('leaves model-unit plans and unitless fields to plain numbers', () => {
    expect(planFieldParser('domain.Lx', 'model')).toBeUndefined();
    expect(planFieldParser('forcing.halfWidth', 'physical')).toBeUndefined();
  });
});
