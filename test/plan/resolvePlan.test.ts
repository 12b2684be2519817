import { describe, expect, it } from 'vitest';
import { resolvePlan } from '../../lib/plan/resolvePlan';
import { expectQuoted, goodModelPlan } from './quoted';

const earth = (over: Record<string, unknown> = {}) => ({
  units: 'physical',
  rotation: { kind: 'planet', planet: 'earth', latitudeDeg: 45 },
  deformation: { kind: 'layer', H: 1e4, gPrime: 1 },
  drive: { kind: 'velocity', U: 10 },
  dragTime: 1e6,
  forcing: { wavelength: 5e5, halfWidth: 0.1 },
  domain: { Lx: 2e7, Ly: 1e7 },
  grid: { kind: 'spacing', dx: 5e4, dy: 5e4 },
  hyperviscosity: { order: 4, gridDampingTime: 3600 },
  runLength: 1e8,
  ...over,
});

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('resolvePlan', () => {
  // f and β at 45° [derived] from Moritz, J. Geodesy 74, 128 (2000).
  it('takes f and β from the planet and latitude', () => {
    const p = resolvePlan(earth());
    expectQuoted(p.beta, '1.6186774e-11');
    expectQuoted(p.f as number, '1.0312608e-4');
  });

  // L_d = √(g′H)/|f| [practice]: √(1 · 1e4) / 1.0312608e-4 s⁻¹.
  it('derives L_d from the layer with |f|, in either hemisphere', () => {
    const north = resolvePlan(earth());
    expect(rel(north.Ld, 100 / (north.f as number))).toBeLessThan(2 * Number.EPSILON);
    expect(rel(north.kd * north.Ld, 1)).toBeLessThan(2 * Number.EPSILON);
    const south = resolvePlan(earth({ rotation: { kind: 'planet', planet: 'earth', latitudeDeg: -45 } }));
    expect(south.f).toBe(-(north.f as number));
    expect(south.Ld).toBe(north.Ld);
    const none = resolvePlan(earth({ deformation: { kind: 'none' } }));
    expect(none.Ld).toBe(Infinity);
    expect(none.kd).toBe(0);
  });

  // Energy balance dE/dt = ε − 2μE [derived] (docs/scales.md): a target U means ε = μU², and an
  // injection rate means U = (ε/μ)^½.
  it('closes the energy balance both ways', () => {
    const byU = resolvePlan(earth());
    expect(byU.mu).toBe(1e-6);
    expect(byU.eps).toBe(1e-6 * 100);
    expect(byU.U).toBe(10);
    const byEps = resolvePlan(earth({ drive: { kind: 'injection', eps: 4e-4 } }));
    expect(byEps.U).toBe(Math.sqrt(4e-4 / 1e-6));
  });

  it('turns a spacing into powers of two and states the spacing it gets', () => {
    const p = resolvePlan(earth());
    expect([p.nx, p.ny]).toEqual([512, 256]); // 400 and 200 points needed
    expect(p.dx).toBe(2e7 / 512);
    expect(p.dy).toBe(1e7 / 256);
  });

  // ν = 1/(τ k_max^{2p}) with k_max the radius of the kept disc (2/3 rule [practice]).
  it('sets ν so the grid-scale damping time is τ', () => {
    const p = resolvePlan(goodModelPlan({ domain: { Lx: 4 * Math.PI, Ly: 2 * Math.PI } }));
    expect(p.kMax).toBe(Math.min((2 * Math.PI * 170) / (4 * Math.PI), 170)); // ⌊512/3⌋ = 170
    expect(rel(p.nu * Math.pow(p.kMax, 2 * p.order) * p.gridDampingTime, 1)).toBeLessThan(8 * Number.EPSILON);
    expect(p.kf).toBe(40);
    expect(rel(p.dkf, 2)).toBeLessThan(2 * Number.EPSILON);
  });

  it('says how the derived inputs were obtained', () => {
    const d = resolvePlan(earth()).derivations.join(' | ');
    expect(d).toMatch(
      /f = 2Ω sin φ and β = 2Ω cos φ\/R for Earth \(Ω = 7\.292115e-5 rad\/s, R = 6\.3710087714e6 m\) at φ = 45°/,
    );
    expect(d).toMatch(/L_d = √\(g′H\)\/\|f\|/);
    expect(d).toMatch(/ε = μU²/);
    expect(d).toMatch(/smallest powers of two/);
  });
});
