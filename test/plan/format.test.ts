import { describe, expect, it } from 'vitest';
import {
  bytes,
  duration,
  fmt,
  latitudeText,
  lengthText,
  timeText,
  unitLabel,
  wavenumberText,
  withUnit,
} from '../../lib/plan/format';

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
    expect(withUnit(2e6, 'length', 'physical')).toBe('2000 km');
    expect(withUnit(40, 'velocity', 'physical')).toBe('40 m/s');
    expect(withUnit(3, 'wavenumber', 'model')).toBe('3 rad/model length');
    expect(unitLabel('count', 'physical')).toBe('');
    expect(withUnit(4, 'ratio', 'model')).toBe('4');
  });

  it('writes physical lengths in km (m below 1 km), times in days or hours (or s), latitudes in degrees', () => {
    expect(withUnit(2.723e7, 'length', 'physical')).toBe('27230 km');
    expect(withUnit(500, 'length', 'physical')).toBe('500 m');
    expect(withUnit(1000, 'length', 'physical')).toBe('1 km');
    // 1 day = 86 400 s, 1 h = 3600 s [practice: SI-accepted units].
    expect(withUnit(1e7, 'time', 'physical')).toBe('115.7 days');
    expect(withUnit(89310, 'time', 'physical')).toBe('24.81 h');
    expect(withUnit(325.5, 'time', 'physical')).toBe('325.5 s');
    expect(withUnit(2 * 86400, 'time', 'physical')).toBe('2 days');
    expect(latitudeText(45)).toBe('45°');
    // Model units stay plain numbers with their named unit.
    expect(withUnit(1e7, 'time', 'model')).toBe('1e7 model time');
  });

  it('gives a wavenumber its wavelength 2π/k too, and keeps "at least" and "at most" through the units', () => {
    expect(withUnit(2 * Math.PI * 1e-6, 'wavenumber', 'physical')).toBe('6.283e-6 rad/m (wavelength 1000 km)');
    expect(lengthText(12344.01, 'up')).toBe('12.35 km');
    expect(lengthText(12346.99, 'down')).toBe('12.34 km');
    expect(timeText(3 * 86400 + 1, 'up')).toBe('3.001 days'); // at least: never below the time
    // A wavenumber rounded up is a wavelength rounded down.
    expect(wavenumberText((2 * Math.PI) / 123456, 'up')).toMatch(/wavelength 123.4 km\)$/);
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
