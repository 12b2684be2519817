import { dissipationWavenumber, frictionWavenumber, rhinesWavenumber } from '../../lib/analysis/scales';
import type { ModelParams } from '../../lib/model/params';

/**
 * The default fit bands of the Spectra view: inside the ranges where the laws the chart draws apply.
 *   inverse  from the arrest scale to the forcing annulus, k_arrest ≤ k ≤ k_f − δk_f: the inverse
 *            energy cascade, E ∝ k^{−5/3} (Kraichnan 1967), and on a β-plane the zonal spectrum
 *            E_Z ∝ β² m^{−5} (Sukoriansky et al. 2007). The arrest scale is the Rhines wavenumber
 *            k_R = (β/2U)^½ of the measured U_rms with β, the friction wavenumber k_fric = (μ³/ε)^½
 *            without it (whichever is larger when both are known), never below the second shell.
 *   forward  from the annulus to the dissipation range, k_f + δk_f ≤ k ≤ k_ν: the forward enstrophy
 *            cascade, E ∝ k^{−3} (Kraichnan 1967), up to the hyperviscous wavenumber
 *            k_ν = (η^⅓/ν)^{1/2p} of the enstrophy the hyperviscosity removes (scales.ts), and never
 *            past the shells the 2/3 rule cuts.
 * Each edge stays half a shell inside its range, so no shell of the annulus or beyond k_ν enters.
 * A band with fewer than three shells is reported as missing, with the reason.
 */
export type BandId = 'inverse' | 'forward';

export interface FitBand {
  id: BandId;
  /** The band, or null when the range holds fewer than three shells. */
  band: [number, number] | null;
  /** Which range it is, in words with its edges (for the caption). */
  text: string;
  /** The slope the law gives there for the total spectrum, and for the zonal one. */
  law: string;
  /** Why there is no band, when there is none. */
  missing: string | null;
}

/** What the bands are worked out from: the run's parameters and measured rates. */
export interface BandInputs {
  params: Pick<ModelParams, 'beta' | 'mu' | 'eps' | 'kf' | 'dkf' | 'nu' | 'nu_order' | 'forcing'>;
  /** Shell width and the highest complete shell's centre. */
  dk: number;
  kTop: number;
  /** Measured rms velocity (time mean when there is one). */
  Urms: number;
  /** Enstrophy removed by the hyperviscosity per unit time (the step report's enstrophy.hyper). */
  eta: number;
}

const fmt = (x: number) => (Number.isFinite(x) ? String(Number(x.toPrecision(3))) : '—');

/** The arrest wavenumber and its name, as above. */
export function arrestWavenumber(i: BandInputs): { k: number; name: string } {
  const { beta, mu, eps } = i.params;
  const kR = beta > 0 && i.Urms > 0 ? rhinesWavenumber(beta, i.Urms) : NaN;
  const kF = mu > 0 && eps > 0 ? frictionWavenumber(mu, eps) : NaN;
  if (Number.isFinite(kR) && !(kF > kR)) return { k: kR, name: 'the Rhines wavenumber k_R' };
  if (Number.isFinite(kF)) return { k: kF, name: 'the friction wavenumber k_fric' };
  return { k: 0, name: 'the domain scale' };
}

function shells(band: [number, number], dk: number): number {
  return Math.floor(band[1] / dk) - Math.ceil(band[0] / dk) + 1;
}

/** The two default bands of a run. */
export function fitBands(i: BandInputs): Record<BandId, FitBand> {
  const { kf, dkf, nu, nu_order, forcing } = i.params;
  const half = i.dk / 2;
  const arrest = arrestWavenumber(i);
  const forced = forcing !== 'none' && kf > 0;
  const lo = Math.max(arrest.k, 2 * i.dk);
  const inverse: [number, number] = [lo, kf - dkf - half];
  const kNu = nu > 0 && i.eta > 0 ? dissipationWavenumber(i.eta, nu, nu_order) : Infinity;
  const forward: [number, number] = [kf + dkf + half, Math.min(kNu, i.kTop)];
  const check = (b: [number, number], why: string): { band: [number, number] | null; missing: string | null } =>
    !forced
      ? { band: null, missing: 'no forcing, so no cascade ranges' }
      : shells(b, i.dk) >= 3
        ? { band: b, missing: null }
        : { band: null, missing: why };
  const inv = check(
    inverse,
    `${arrest.name} (${fmt(arrest.k)}) is too close to the forcing (k_f − δk_f = ${fmt(kf - dkf)}): no inverse-cascade range of three shells`,
  );
  const fwd = check(
    forward,
    `the dissipation range (k_ν = ${fmt(kNu)}) or the 2/3-rule cut (${fmt(i.kTop)}) starts too close to the forcing (k_f + δk_f = ${fmt(kf + dkf)}): no forward range of three shells`,
  );
  return {
    inverse: {
      id: 'inverse',
      ...inv,
      text: `the inverse-cascade range, from ${arrest.name} (${fmt(arrest.k)}) to the forcing annulus (k_f − δk_f = ${fmt(kf - dkf)})`,
      law: 'E ∝ k⁻⁵ᐟ³; the zonal E_Z ∝ m⁻⁵',
    },
    forward: {
      id: 'forward',
      ...fwd,
      text: `the forward-cascade range, from the forcing annulus (k_f + δk_f = ${fmt(kf + dkf)}) to ${Number.isFinite(kNu) && kNu < i.kTop ? `the dissipation range (k_ν = ${fmt(kNu)})` : `the 2/3-rule cut (${fmt(i.kTop)})`}`,
      law: 'E ∝ k⁻³',
    },
  };
}
