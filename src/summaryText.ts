import type { JetVerdict } from '../lib/analysis/jetDetector';
import { REGIME_LABELS, type Regime } from '../lib/analysis/scales';
import type { RunSummary } from '../lib/analysis/summary';

/**
 * The words and numbers every place of the app quotes a run by (the readouts, the Zonal view,
 * Compare's panes, the Plan view's matched comparison): one formatter, so that the same window reads
 * the same everywhere.
 */

/** Significant figures of a standard error as shown; the value is rounded to the same decimal place. */
const ERROR_DIGITS = 2;

/**
 * A measured value with its standard error, "0.598 ± 0.012": the error to two significant figures and
 * the value to the same decimal place (three significant figures without an error). '—' when the
 * value is missing.
 */
export function withError(value: number | null | undefined, stderr: number | null | undefined): string {
  if (value == null || !Number.isFinite(value)) return '—';
  if (stderr == null || !Number.isFinite(stderr) || stderr <= 0) return plain(value);
  const place = Math.floor(Math.log10(stderr)) - (ERROR_DIGITS - 1);
  // Very large or very small numbers, or an error far above the value: exponent notation for both.
  const a = Math.abs(value);
  if (place < -8 || place > 5 || (a > 0 && (a >= 1e6 || a < 1e-4)))
    return `${value.toPrecision(3)} ± ${stderr.toPrecision(ERROR_DIGITS)}`;
  const decimals = Math.max(0, -place);
  const step = Math.pow(10, place);
  const round = (x: number) => (decimals > 0 ? x.toFixed(decimals) : String(Math.round(x / step) * step));
  return `${round(value)} ± ${round(stderr)}`;
}

/** A number to three significant figures (plain between 1e-4 and 1e6), '—' when missing. */
export function plain(x: number | null | undefined, digits = 3): string {
  if (x == null || !Number.isFinite(x)) return '—';
  const a = Math.abs(x);
  if (x !== 0 && (a >= 1e6 || a < 1e-4)) return x.toExponential(digits - 1);
  return String(Number(x.toPrecision(digits)));
}

/** The jet verdict in words with its count: "4 significant jets", "no significant jets", "too short to tell". */
export function jetWords(verdict: JetVerdict | null, count: number | null): string {
  if (verdict === null) return 'no sample yet';
  if (verdict === 'too-short' || count === null) return 'too short to tell';
  if (verdict === 'no-jets' || count === 0) return 'no significant jets';
  return `${count} significant jet${count === 1 ? '' : 's'}`;
}

/** The regime of the time means in a word or two; "spinning up" before the steady state. */
export function regimeWords(regime: RunSummary['regime']): string {
  if (regime === null) return '—';
  if (regime === 'spinning-up') return 'spinning up';
  return regime === 'zonostrophic' ? 'zonostrophic' : regime === 'transitional' ? 'transitional' : 'friction-dominated';
}

/** The long description of a regime (its R_β range and what it looks like), for a title. */
export function regimeTitle(regime: RunSummary['regime']): string {
  if (regime === null) return 'needs β > 0, forcing and a sample of the time means';
  if (regime === 'spinning-up')
    return 'the run has not reached its statistical steady state (energy steady to 5 % over windows of 1/(2μ)): no regime is claimed before it';
  return REGIME_LABELS[regime as Regime];
}

/** "t = 12.3–45.6" of a window, or '' without one. */
export function windowText(start: number | null, end: number | null): string {
  return start === null || end === null ? '' : `t = ${start.toFixed(1)}–${end.toFixed(1)}`;
}
