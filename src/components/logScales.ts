import type uPlot from 'uplot';

/**
 * Logarithmic chart scales that hold whatever the data: a range of at most LOG_DECADES decades below
 * the largest value, and Stria's own tick positions, counted by exponent.
 *
 * Why: uPlot's log-axis ticks step through a table of increments from 1e-32 to 1e32 and round each
 * tick to the increment's decimals; below about 1e-25 the rounding returns the same tick again and
 * the loop never ends, pushing ticks until the array's length overflows ("Invalid array length")
 * with the page frozen and its heap past 1 GB. A spectrum at 256² and up holds such values: the
 * hyperviscous shells past the dissipation scale carry energies of 1e-30 and less. Ticks computed
 * from the exponents end after a bounded count for any positive range, and a bounded range keeps
 * the chart readable (12 decades on a chart a few hundred pixels high is some 30 pixels a decade).
 */
export const LOG_DECADES = 12;

/** 10^e written exactly (Math.pow(10, -5) is 0.000009999999999999999). */
const pow10 = (e: number) => Number(`1e${e}`);

/**
 * The range of a log scale for data from `min` to `max`: whole decades around them, at most
 * `decades` below the top; [1, 10] when nothing positive is shown.
 */
export function logRange(min: number | null, max: number | null, decades = LOG_DECADES): [number, number] {
  if (max === null || !(max > 0) || !Number.isFinite(max)) return [1, 10];
  const top = Math.ceil(Math.log10(max) - 1e-12);
  const least = min !== null && min > 0 ? Math.floor(Math.log10(min) + 1e-12) : top - 1;
  const bottom = Math.min(top - 1, Math.max(least, top - decades));
  return [pow10(bottom), pow10(top)];
}

/**
 * Tick values of a log axis from `min` to `max` (both > 0): every m·10^e (m = 1…9) when the range
 * spans at most six decades, the powers of ten alone beyond that.
 */
export function logTicks(min: number, max: number): number[] {
  if (!(min > 0 && max > min && Number.isFinite(max))) return [];
  const e0 = Math.floor(Math.log10(min) + 1e-12);
  const e1 = Math.ceil(Math.log10(max) - 1e-12);
  const mantissas = e1 - e0 <= 6 ? [1, 2, 3, 4, 5, 6, 7, 8, 9] : [1];
  const out: number[] = [];
  for (let e = e0; e <= e1; e++)
    for (const m of mantissas) {
      const t = Number(`${m}e${e}`);
      if (t >= min * (1 - 1e-12) && t <= max * (1 + 1e-12)) out.push(t);
    }
  return out;
}

/**
 * The options with every log scale bounded (`logRange`, unless it sets its own range) and every axis
 * on a log scale ticked by `logTicks` (unless it sets its own splits). Other scales and axes pass as
 * they are. The x axis is the first; the others are on 'y' unless they name a scale.
 */
export function boundLogScales<T extends Pick<uPlot.Options, 'scales' | 'axes'>>(options: T): T {
  const scales = options.scales ?? {};
  const isLog = (key: string) => scales[key]?.distr === 3;
  if (!Object.keys(scales).some(isLog)) return options;
  const bounded: uPlot.Scales = {};
  for (const [key, s] of Object.entries(scales))
    bounded[key] = s.distr === 3 && s.range === undefined ? { ...s, range: (_u, lo, hi) => logRange(lo, hi) } : s;
  const axes = options.axes?.map((a, i) =>
    isLog(a.scale ?? (i === 0 ? 'x' : 'y')) && a.splits === undefined
      ? { ...a, splits: (_u: uPlot, _i: number, lo: number, hi: number) => logTicks(lo, hi) }
      : a,
  );
  return { ...options, scales: bounded, ...(axes ? { axes } : {}) };
}
