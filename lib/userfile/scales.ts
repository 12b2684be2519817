import {
  RHINES_DEFINITIONS,
  regimeOf,
  rhinesLength,
  rhinesWavenumber,
  staircaseSpacing,
  transitionalWavenumber,
  type RhinesConvention,
} from '../analysis/scales';
import type { UserAnalysis } from './summary';

/**
 * The scales of a user's flow from its measured U_rms (scales.ts): the Rhines wavenumber
 * k_R = (β/2U)^½ (Rhines 1975) and the Rhines length in every convention, the ideal-staircase spacing
 * 720^{1/4}(U/β)^½ (Dritschel & McIntyre 2008), and with the user's ε the transitional wavenumber
 * k_β = (β³/ε)^{1/5} (Vallis & Maltrud 1993) and the zonostrophy index R_β = k_β/k_R (Sukoriansky et
 * al. 2007) with its regime. What cannot be formed is skipped with the reason.
 */
export interface ScaleInput {
  uRms: number | null;
  uRmsKind: string;
  degrees: boolean;
  beta: number | null;
  eps?: number;
  rhines?: RhinesConvention;
}

export function userScales(
  s: ScaleInput,
  skip: (diagnostic: string, reason: string) => void,
  computed: string[],
): UserAnalysis['scales'] {
  const { beta } = s;
  const conv = s.rhines ?? 'kR';
  const out: UserAnalysis['scales'] = {
    beta,
    kRhines: null,
    rhinesConvention: conv,
    rhinesLength: null,
    rhinesLengths: null,
    staircaseSpacing: null,
    kBeta: null,
    zonostrophyIndex: null,
    regime: null,
  };
  const U = s.uRms;
  if (U !== null) computed.push(`U_rms (${s.uRmsKind})`);
  if (s.degrees)
    return (skip('Rhines scale, zonostrophy index', 'the grid is in degrees: lengths need the tangent plane'), out);
  if (beta === null || U === null || !(beta > 0 && U > 0))
    return (
      skip('Rhines scale, zonostrophy index', beta === null ? 'needs β' : 'needs β > 0 and a non-zero U_rms'),
      out
    );
  out.kRhines = rhinesWavenumber(beta, U);
  out.rhinesLengths = Object.fromEntries(
    (Object.keys(RHINES_DEFINITIONS) as RhinesConvention[]).map((c) => [c, rhinesLength(beta, U, c)]),
  ) as Record<RhinesConvention, number>;
  out.rhinesLength = out.rhinesLengths[conv];
  out.staircaseSpacing = staircaseSpacing(beta, U);
  computed.push('Rhines scale from U_rms');
  const eps = s.eps;
  if (eps === undefined || !(eps > 0))
    return (skip('zonostrophy index R_β', 'needs the energy injection rate ε (files rarely carry it: give it)'), out);
  out.kBeta = transitionalWavenumber(beta, eps);
  out.zonostrophyIndex = out.kBeta / out.kRhines;
  out.regime = regimeOf(out.zonostrophyIndex);
  computed.push('zonostrophy index R_β = k_β/k_R');
  return out;
}
