import { describe, expect, it } from 'vitest';
import { bytes, duration, fmt, unitLabel, withUnit } from '../../lib/plan/format';

describe('format', () => {
  it('prints 4 significant figures, plain in the middle range and with an exponent outside it', () => {
    expect(fmt(1234.5678)).toBe('1235');
    expect(fmt(0.0012346)).toBe('0.001235');
    expect(fmt(1.6186774e-11)).toBe('1.619e-11');
    expect(fmt(6371008.7714, 11)).toBe('6.3710087714e6');
    expect(fmt(0)).toBe('0');
    expect(fmt(Infinity)).toBe('∞');
    expect(fmt(NaN)).toBe('NaN');
  });

  it('rounds up or down at the shown digits so "at least" and "at most" hold', () => {
    expect(fmt(124.01, 4, 'up')).toBe('124.1');
    expect(fmt(124.09, 4, 'down')).toBe('124');
    expect(fmt(9.9991, 4, 'up')).toBe('10');
    expect(fmt(125, 4, 'up')).toBe('125');
    for (const x of [1.00001e-7, 3.14159, 99999.5, 2.71828e9]) {
      expect(Number(fmt(x, 4, 'up'))).toBeGreaterThanOrEqual(x);
      expect(Number(fmt(x, 4, 'down'))).toBeLessThanOrEqual(x);
    }
  });

  it('names units for both unit systems', () => {
    expect(withUnit(2e6, 'length', 'physical')).toBe('2e6 m');
    expect(withUnit(3, 'wavenumber', 'model')).toBe('3 rad/model length');
    expect(unitLabel('count', 'physical')).toBe('');
    expect(withUnit(4, 'ratio', 'model')).toBe('4');
  });

  it('prints durations and byte counts readably', () => {
    expect(duration(30)).toBe('30 s');
    expect(duration(600)).toBe('10 min');
    expect(duration(3 * 3600)).toBe('3 h');
    expect(duration(10 * 86400)).toBe('10 days');
    expect(duration(3 * 365.25 * 86400)).toBe('3 years');
    expect(bytes(512)).toBe('512 B');
    expect(bytes(82.9e6)).toBe('82.9 MB');
  });
});
