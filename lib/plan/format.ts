import type { UnitSystem } from './planInput';
import type { Quantity } from './predictions';

/**
 * Number and unit text for messages and reports. Numbers keep 4 significant figures (plain notation
 * between 1e-3 and 1e6, else exponent notation); units are SI for a physical plan and named model
 * units otherwise.
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

/** A number with its unit, e.g. "1.2e6 m"; `round` as in `fmt`. */
export function withUnit(x: number, q: Quantity, units: UnitSystem, round: Rounding = 'nearest'): string {
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
