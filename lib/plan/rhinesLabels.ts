import type { RhinesConvention } from '../analysis/scales';

/**
 * The Rhines conventions as people read them, for every text (the report, the command line, the app):
 * the code keys (kR, sqrtUbeta, …) appear in JSON and plan files only.
 */
export const RHINES_LABELS: Readonly<Record<RhinesConvention, string>> = Object.freeze({
  kR: '2π/k_R',
  sqrtUbeta: '(U/β)^½',
  piOverKR: 'π/k_R',
  twoPiSqrtUbeta: '2π(U/β)^½',
});

/** The readable label of a convention. */
export function rhinesLabel(c: RhinesConvention): string {
  return RHINES_LABELS[c];
}
