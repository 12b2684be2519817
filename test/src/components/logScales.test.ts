import type uPlot from 'uplot';
import { describe, expect, it } from 'vitest';
import { boundLogScales, LOG_DECADES, logRange, logTicks } from '../../../src/components/logScales';
import { spectraChartOptions } from '../../../src/views/spectraCharts';

describe('logRange', () => {
  it('covers the data in whole decades', () => {
    expect(logRange(0.03, 47)).toEqual([0.01, 100]);
    expect(logRange(1, 10)).toEqual([1, 10]);
  });

  it('keeps at most LOG_DECADES decades below the top, however small the least value', () => {
    // A 256² spectrum: shells past the dissipation scale hold energies far below 1e-25.
    for (const least of [1e-30, 1e-100, 5e-324]) {
      const [lo, hi] = logRange(least, 2.5);
      expect(hi).toBe(10);
      expect(Math.log10(hi / lo)).toBeCloseTo(LOG_DECADES, 9);
    }
  });

  it('gives a decade for a single value and [1, 10] with nothing positive', () => {
    expect(logRange(3, 3)).toEqual([1, 10]);
    expect(logRange(Infinity, -Infinity)).toEqual([1, 10]);
    expect(logRange(null, null)).toEqual([1, 10]);
  });
});

describe('logTicks', () => {
  it('puts every m·10^e on a narrow range, exactly as written in decimal', () => {
    expect(logTicks(0.01, 1)).toEqual([
      0.01, 0.02, 0.03, 0.04, 0.05, 0.06, 0.07, 0.08, 0.09, 0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1,
    ]);
  });

  it('ends after a bounded count on ranges where the chart library never ends', () => {
    const t = logTicks(1e-40, 1e-28);
    expect(t).toEqual(Array.from({ length: 13 }, (_, i) => Number(`1e${i - 40}`)));
    expect(logTicks(1e-300, 1e10).length).toBe(311);
  });

  it('gives nothing for an empty or non-positive range', () => {
    expect(logTicks(0, 1)).toEqual([]);
    expect(logTicks(5, 5)).toEqual([]);
  });
});

describe('boundLogScales', () => {
  it('bounds the log scales of the spectra chart and ticks both its axes', () => {
    const o = boundLogScales(spectraChartOptions([]));
    const u = {} as uPlot;
    const range = o.scales!.y.range as (u: uPlot, lo: number, hi: number, key: string) => [number, number];
    expect(range(u, 1e-40, 0.3, 'y')).toEqual([1e-12, 1]);
    const splits = o.axes![1].splits as (u: uPlot, i: number, lo: number, hi: number) => number[];
    expect(splits(u, 1, 1e-12, 1)).toHaveLength(13);
    expect(typeof o.axes![0].splits).toBe('function');
  });

  it('leaves linear scales, and a range or splits the chart sets itself, as they are', () => {
    const own = (_u: uPlot, lo: number, hi: number): [number, number] => [lo, hi];
    const given: Pick<uPlot.Options, 'scales' | 'axes'> = {
      scales: { x: { time: false }, y: { distr: 3, log: 10, range: own } },
      axes: [{}, { scale: 'y' }],
    };
    const o = boundLogScales(given);
    expect(o.scales!.y.range).toBe(own);
    expect(o.scales!.x.range).toBeUndefined();
    expect(o.axes![0].splits).toBeUndefined();
    expect(typeof o.axes![1].splits).toBe('function');
  });
});
