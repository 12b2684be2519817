import type { UnitSystem } from './planInput';
import type { Quantity } from './predictions';

/**
 * Number and unit text for messages and reports. Numbers keep 4 significant figures (plain notation
 * between 1e-3 and 1e6, else exponent notation); a physical plan's lengths, times and wavenumbers
 * read as people write them (km, days or hours, with wavelengths; see below), other quantities in
 * SI, and a model-unit plan's in named model units.
 */
export function fmt(x: number, digits = 4, round: Rounding = 'nearest'): string {
  if (!Number.isFinite(x)) return x > 0 ? '∞' : x < 0 ? '−∞' : 'NaN';
  if (round !== 'nearest') x = roundDirected(x, digits, round);
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return String(Number(x.toPrecision(digits)));
  const [m, e] = x.toExponential(digits - 1).split('e');
  return `${Number(m)}e${Number(e)}`;
}

/**
 * 'up' and 'down' round away from or toward −∞ at the shown digits, for fixes that say "at least" or
 * "at most": the number printed then always satisfies the condition it states.
 */
export type Rounding = 'nearest' | 'up' | 'down';

function roundDirected(x: number, digits: number, round: 'up' | 'down'): number {
  if (x === 0) return 0;
  const step = Math.pow(10, Math.floor(Math.log10(Math.abs(x))) - digits + 1);
  const r = Number(x.toPrecision(digits));
  if (round === 'up' && r < x) return Number((r + step).toPrecision(digits));
  if (round === 'down' && r > x) return Number((r - step).toPrecision(digits));
  return r;
}

const PHYSICAL: Readonly<Record<Quantity, string>> = Object.freeze({
  velocity: 'm/s',
  length: 'm',
  wavenumber: 'rad/m',
  time: 's',
  rate: '1/s',
  enstrophyRate: '1/s³',
  count: '',
  ratio: '',
});

const MODEL: Readonly<Record<Quantity, string>> = Object.freeze({
  velocity: 'model length/time',
  length: 'model length',
  wavenumber: 'rad/model length',
  time: 'model time',
  rate: '1/model time',
  enstrophyRate: '1/model time³',
  count: '',
  ratio: '',
});

/** The unit of a quantity in a unit system ('' for counts and ratios). */
export function unitLabel(q: Quantity, units: UnitSystem): string {
  return (units === 'physical' ? PHYSICAL : MODEL)[q];
}

/**
 * A number with its unit; `round` as in `fmt`. Physical lengths, times and wavenumbers read as people
 * write them (quantities.ts): "27230 km", "115.7 days", "2.308e-7 rad/m (wavelength 27230 km)";
 * everything else as the number and its SI or model unit, e.g. "40 m/s", "3 rad/model length".
 */
export function withUnit(x: number, q: Quantity, units: UnitSystem, round: Rounding = 'nearest'): string {
  if (units === 'physical' && Number.isFinite(x)) {
    if (q === 'length') return lengthText(x, round);
    if (q === 'time') return timeText(x, round);
    if (q === 'wavenumber' && x > 0) return wavenumberText(x, round);
  }
  const u = unitLabel(q, units);
  return u ? `${fmt(x, 4, round)} ${u}` : fmt(x, 4, round);
}

/** A duration in seconds in the most readable unit (s, min, h, days, years). */
export function duration(seconds: number): string {
  const a = Math.abs(seconds);
  if (a < 120) return `${fmt(seconds, 3)} s`;
  if (a < 7200) return `${fmt(seconds / 60, 3)} min`;
  if (a < 2 * 86400) return `${fmt(seconds / 3600, 3)} h`;
  if (a < 2 * 365.25 * 86400) return `${fmt(seconds / 86400, 3)} days`;
  return `${fmt(seconds / (365.25 * 86400), 3)} years`;
}

/** A byte count in B, kB, MB, GB, TB (powers of 1000). */
export function bytes(n: number): string {
  const units = ['B', 'kB', 'MB', 'GB', 'TB', 'PB'];
  let i = 0;
  let x = n;
  while (x >= 1000 && i < units.length - 1) {
    x /= 1000;
    i++;
  }
  return `${fmt(x, 3)} ${units[i]}`;
}

/*
 * Physical quantities as people write them (the report, the command line's text and the app use
 * these, through withUnit):
 *   lengths      km, or m below 1 km                        2.723e7 m → "27230 km", 500 m → "500 m"
 *   times        days from 2 days, hours from 2 h, else s   1e7 s → "115.7 days", 6 h → "6 h"
 *   wavenumbers  rad/m with the wavelength 2π/k beside it   "2.308e-7 rad/m (wavelength 27230 km)"
 *   latitudes    degrees                                    "45°"
 * Directed rounding ("at least", "at most") is kept through the change of unit, and turns round for
 * a wavelength (a wavenumber at least k is a wavelength at most 2π/k). The parser of typed values
 * is quantityInput.ts.
 */
const KM = 1000;
const HOUR = 3600;
const DAY = 86_400;

/** A length in metres as km (from 1 km) or m. */
export function lengthText(metres: number, round: Rounding = 'nearest'): string {
  return Math.abs(metres) >= KM ? `${fmt(metres / KM, 4, round)} km` : `${fmt(metres, 4, round)} m`;
}

/** A time in seconds as days (from 2 days), hours (from 2 h) or s. */
export function timeText(seconds: number, round: Rounding = 'nearest'): string {
  const a = Math.abs(seconds);
  if (a >= 2 * DAY) return `${fmt(seconds / DAY, 4, round)} days`;
  if (a >= 2 * HOUR) return `${fmt(seconds / HOUR, 4, round)} h`;
  return `${fmt(seconds, 4, round)} s`;
}

/** A wavenumber in rad/m with its wavelength 2π/k. */
export function wavenumberText(k: number, round: Rounding = 'nearest'): string {
  const turned: Rounding = round === 'up' ? 'down' : round === 'down' ? 'up' : 'nearest';
  return `${fmt(k, 4, round)} rad/m (wavelength ${lengthText((2 * Math.PI) / k, turned)})`;
}

/** A latitude in degrees. */
export function latitudeText(degrees: number): string {
  return `${fmt(degrees, 6)}°`;
}
