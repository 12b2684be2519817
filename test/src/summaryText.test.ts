import { describe, expect, it } from 'vitest';
import { jetWords, regimeWords, withError } from '../../src/summaryText';

describe('summary text: one formatter for every place that quotes a run', () => {
  it('writes a value with its standard error to two significant figures of the error', () => {
    expect(withError(0.59812, 0.01234)).toBe('0.598 ± 0.012');
    expect(withError(1.5708, 0.2)).toBe('1.57 ± 0.20');
    expect(withError(123.4, 17)).toBe('123 ± 17');
    expect(withError(1234.5, 170)).toBe('1230 ± 170');
    expect(withError(0.0048, 0.00086)).toBe('0.00480 ± 0.00086');
    expect(withError(3.2, null)).toBe('3.2');
    expect(withError(null, 0.1)).toBe('—');
    expect(withError(2e-7, 3e-8)).toBe('2.00e-7 ± 3.0e-8');
  });

  it('says the jet verdict in words with its count', () => {
    expect(jetWords('jets', 4)).toBe('4 significant jets');
    expect(jetWords('jets', 1)).toBe('1 significant jet');
    expect(jetWords('no-jets', 0)).toBe('no significant jets');
    expect(jetWords('too-short', null)).toBe('too short to tell');
    expect(jetWords(null, null)).toBe('no sample yet');
  });

  it('says spinning up before the steady state instead of a regime', () => {
    expect(regimeWords('spinning-up')).toBe('spinning up');
    expect(regimeWords('zonostrophic')).toBe('zonostrophic');
    expect(regimeWords(null)).toBe('—');
  });
});
