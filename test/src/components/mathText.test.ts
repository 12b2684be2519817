import { describe, expect, it } from 'vitest';
import { mathPieces } from '../../../src/components/mathText';

const show = (t: string) =>
  mathPieces(t)
    .map((p) => (p.kind === 'plain' ? p.text : `${p.kind}(${p.text})`))
    .join('');

describe('labels without raw notation', () => {
  it('turns _x and ^{…} into subscripts and superscripts', () => {
    expect(show('k_β = (β³/ε)^{1/5}')).toBe('ksub(β) = (β³/ε)sup(1/5)');
    expect(show('L = 720^{1/4}(U_rms/β)^½')).toBe('L = 720sup(1/4)(Usub(rms)/β)sup(½)');
    expect(show('R_β = √2 (β²ε/μ⁵)^{1/20}')).toBe('Rsub(β) = √2 (β²ε/μ⁵)sup(1/20)');
    expect(show('τ_f = (ε k_f²)^{-1/3}')).toBe('τsub(f) = (ε ksub(f)²)sup(−1/3)');
  });

  it('leaves text without notation as it is', () => {
    expect(show('jets in the domain')).toBe('jets in the domain');
    expect(show('_ alone, a ^ caret')).toBe('_ alone, a ^ caret');
  });
});
