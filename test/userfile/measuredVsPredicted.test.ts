import { describe, expect, it } from 'vitest';
import { analyzeUserRecords } from '../../lib/userfile/gridAnalysis';
import { measuredVsPredicted } from '../../lib/userfile/measuredVsPredicted';
import { staircaseProfile } from '../support/jetFields';
import { arraySource } from '../support/userSource';

const [nx, ny, Ly, beta] = [16, 128, 2 * Math.PI, 10];
const dy = Ly / ny;
const L = Ly / 4;
const u = Float64Array.from({ length: nx * ny }, (_, k) => staircaseProfile(Math.floor(k / nx) * dy, L, beta, 0.2).u);
const analysis = (opts: { beta?: number; eps?: number; lengthUnit?: 'model' | 'm' | 'degrees' }) =>
  analyzeUserRecords(
    arraySource({ nx, ny, dx: Ly / nx, dy, lengthUnit: opts.lengthUnit ?? 'model' }, ['u'], 1, () => ({ u })),
    { beta: opts.beta, eps: opts.eps },
  );

describe('measured values beside the planner', () => {
  it("puts the planner's predictions for the same β, ε, μ beside the measurements", () => {
    const a = analysis({ beta, eps: 1e-3 });
    const c = measuredVsPredicted(a, { beta, eps: 1e-3, mu: 1e-3 });
    const row = (id: string) => c.rows.find((r) => r.id === id)!;
    // Worked example [derived] (CHECKS, Scales and regimes): β = 10, ε = μ = 1e-3 → U = 1,
    // k_R = 2.23607, R_β = 7.08786 (Rhines 1975; Sukoriansky et al. 2007 [published]).
    expect(row('U').predicted).toBeCloseTo(1, 12);
    expect(Math.abs(row('kR').predicted! / 2.23607 - 1)).toBeLessThan(1e-5);
    expect(Math.abs(row('R_beta').predicted! / 7.08786 - 1)).toBeLessThan(1e-5);
    expect(row('R_beta').predictedText).toBe('zonostrophic');
    // The ideal staircase spacing 720^{1/4}(U/β)^½ at U = 1 [published] Dritschel & McIntyre 2008, factor [derived].
    expect(row('spacingStaircase').predicted).toBeCloseTo(Math.pow(720, 0.25) / Math.sqrt(10), 12);
    expect(row('jetsStaircase').predicted).toBeCloseTo(Ly / (Math.pow(720, 0.25) / Math.sqrt(10)), 10);
    // Measured: 4 jets L apart; U_rms of the staircase flow is βL²/√720 [derived], so the measured
    // spacing sits on the staircase relation of its own U_rms (grid tolerance ~1e-2).
    expect(row('spacingStaircase').measured).toBeCloseTo(L, 12);
    expect(row('jetsRhines').measured).toBe(4);
    expect(row('U').measured).toBeCloseTo((beta * L * L) / Math.sqrt(720), 2);
    expect(Math.abs(row('spacingFromU').ratio! - 1)).toBeLessThan(1e-2);
    expect(row('U').ratio).toBeCloseTo(row('U').measured! / row('U').predicted!, 14);
    expect(c.missing).toBeNull();
    expect(c.units).toBe('model');
  });

  it('says what is missing for the predictions, and still relates the spacing to the measured U_rms', () => {
    const c = measuredVsPredicted(analysis({ beta }), { beta });
    expect(c.missing).toBe('no planner predictions: give ε, μ');
    expect(c.rows.every((r) => r.id === 'spacingFromU' || r.predicted === null)).toBe(true);
    expect(c.rows.find((r) => r.id === 'spacingFromU')!.predicted).not.toBeNull();
    const deg = measuredVsPredicted(analysis({ beta, lengthUnit: 'degrees' }), { beta, eps: 1, mu: 1 });
    expect(deg.missing).toBe(
      'no planner predictions: the grid is in degrees (give a planet to map it onto the tangent plane)',
    );
  });
});
