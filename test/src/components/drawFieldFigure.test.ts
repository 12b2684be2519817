import { describe, expect, it } from 'vitest';
import { figureLayout } from '../../../src/components/drawFieldFigure';

describe('field figure layout', () => {
  it('keeps the domain aspect in the plot, and the colour bar beside it at full height', () => {
    const square = figureLayout(700, 1, 1000);
    expect(square.plot.w).toBe(square.plot.h);
    expect(square.width).toBe(700);
    expect(square.bar.h).toBe(square.plot.h);
    expect(square.bar.x).toBeGreaterThan(square.plot.x + square.plot.w);
    const wide = figureLayout(700, 2, 1000);
    expect(wide.plot.w).toBe(2 * wide.plot.h);
  });

  it('shrinks to the height allowed, keeping the aspect', () => {
    const l = figureLayout(1000, 1, 300);
    expect(l.plot.h).toBe(300);
    expect(l.plot.w).toBe(300);
    expect(l.width).toBeLessThan(1000);
  });
});
