import { describe, expect, it } from 'vitest';
import { CYCLE_TERMS, type CycleTerm } from '../../../lib/analysis/cycleSeries';
import { arrowPolygon, cycleLayout, cycleNumber, MAX_WIDTH, MIN_WIDTH } from '../../../src/views/cycleLayout';

const terms = (set: Partial<Record<CycleTerm, number>>): Record<CycleTerm, number> =>
  Object.fromEntries(CYCLE_TERMS.map((t) => [t, set[t] ?? 0])) as Record<CycleTerm, number>;

describe('the energy cycle drawing', () => {
  // A made-up equilibrated cycle: G = 1 → C = 0.9 → T = 0.8, the rest lost.
  const t = terms({
    generation: 1,
    conversion: 0.9,
    barotropicTransfer: 0.8,
    hyperPotential: 0.1,
    dragBaroclinic: -0.05,
    hyperBaroclinic: 0.15,
    dragBarotropic: 0.7,
    hyperBarotropic: 0.1,
    potential: 1,
    kineticBaroclinic: 0.5,
    kineticBarotropic: 2.5,
  });

  it('gives each reservoir the rate its flows leave in it (docs/two-layer.md, the energy cycle) [derived]', () => {
    const L = cycleLayout(t);
    const rate = (id: string) => L.reservoirs.find((r) => r.id === id)!.rate!;
    expect(rate('ape')).toBeCloseTo(1 - 0.9 - 0.1, 15);
    expect(rate('kebc')).toBeCloseTo(0.9 - 0.8 + 0.05 - 0.15, 15);
    expect(rate('kebt')).toBeCloseTo(0.8 - 0.7 - 0.1, 15);
    // The rates sum to the whole budget: generation less every loss.
    expect(rate('ape') + rate('kebc') + rate('kebt')).toBeCloseTo(1 - 0.1 + 0.05 - 0.15 - 0.7 - 0.1, 14);
    expect(L.reservoirs.map((r) => r.share)).toEqual([null, 0.25, 0.125, 0.625]);
  });

  it('sizes the arrows against the largest flow or loss, and keeps a negative loss', () => {
    const L = cycleLayout(t);
    expect(L.scale).toBe(1);
    expect(L.flows.find((f) => f.id === 'generation')!.width).toBe(MAX_WIDTH);
    expect(L.flows.find((f) => f.id === 'transfer')!.width).toBeCloseTo(MIN_WIDTH + 0.8 * (MAX_WIDTH - MIN_WIDTH), 12);
    expect(L.sinks.find((s) => s.from === 'kebc' && s.kind === 'drag')!.value).toBe(-0.05);
    // No forcing, no large-scale drag: neither is drawn.
    expect(L.flows.map((f) => f.id)).toEqual(['generation', 'conversion', 'transfer']);
    expect(L.sinks.some((s) => s.kind === 'largeScale')).toBe(false);
    expect(cycleLayout(terms({ injection: 0.2 })).flows.map((f) => f.id)).toContain('injection');
  });

  it('draws an arrow with its tip at the end point, and prints numbers at three figures', () => {
    const pts = arrowPolygon(0, 10, 100, 10, 10)
      .split(' ')
      .map((p) => p.split(',').map(Number));
    expect(pts).toHaveLength(7);
    expect(pts[3]).toEqual([100, 10]);
    expect(Math.max(...pts.map((p) => p[0]))).toBe(100);
    expect(arrowPolygon(5, 5, 5, 5, 3)).toBe('');
    expect([cycleNumber(0.58412), cycleNumber(1.67e-4), cycleNumber(null), cycleNumber(0)]).toEqual([
      '0.584',
      '1.67e-4',
      '—',
      '0',
    ]);
  });
});
