import { describe, expect, it } from 'vitest';
import { seamTest } from '../../lib/userfile/periodicity';

const field = (nx: number, ny: number, f: (x: number, y: number) => number) =>
  Float64Array.from({ length: nx * ny }, (_, k) => f(k % nx, Math.floor(k / nx)));

describe('the edge-mismatch test of periodicity', () => {
  it('passes a smooth periodic field and fails a bounded one', () => {
    const [nx, ny] = [32, 24];
    const periodic = field(
      nx,
      ny,
      (i, j) => Math.sin((2 * Math.PI * 3 * i) / nx + 0.3) * Math.cos((2 * Math.PI * 2 * j) / ny),
    );
    expect(seamTest(periodic, nx, ny, 'x')).toMatchObject({ periodic: true, duplicated: false });
    expect(seamTest(periodic, nx, ny, 'y')?.periodic).toBe(true);
    // A seam difference of a full neighbour step: the ratio of a periodic field is ≈ 1.
    expect(seamTest(periodic, nx, ny, 'x')!.ratio).toBeLessThan(1.5);
    const bounded = field(nx, ny, (i, j) => i / nx + Math.sin(j));
    expect(seamTest(bounded, nx, ny, 'x')).toMatchObject({ periodic: false });
    expect(seamTest(bounded, nx, ny, 'x')!.ratio).toBeCloseTo(nx - 1, 9); // a ramp: (n − 1) steps across the seam
  });

  it('flags a grid whose last point repeats the first, and gives no answer on too few points', () => {
    const [nx, ny] = [17, 8];
    const dup = field(nx, ny, (i) => Math.cos((2 * Math.PI * i) / (nx - 1)));
    expect(seamTest(dup, nx, ny, 'x')).toMatchObject({ periodic: false, duplicated: true });
    expect(
      seamTest(
        field(4, 4, (i) => i),
        4,
        4,
        'x',
      ),
    ).toBeNull();
  });
});
