/**
 * Round tick values covering [lo, hi]: steps of 1, 2 or 5 × 10ⁿ, about `target` of them, only
 * values inside the interval (to within a part in 10⁹ of the step, so end points on a tick count).
 */
export function niceTicks(lo: number, hi: number, target = 5): number[] {
  if (!(Number.isFinite(lo) && Number.isFinite(hi)) || hi <= lo || target < 1) return [];
  const raw = (hi - lo) / target;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  const step = (f < 1.5 ? 1 : f < 3.5 ? 2 : f < 7.5 ? 5 : 10) * mag;
  const eps = step * 1e-9;
  const out: number[] = [];
  for (let i = Math.ceil((lo - eps) / step); i * step <= hi + eps; i++) out.push(i * step === 0 ? 0 : i * step);
  return out;
}

/** A tick label: few significant digits, exponent form for very large or small magnitudes. */
export function tickLabel(x: number, step: number): string {
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e4 || a < 1e-3) return x.toExponential(Math.max(0, Math.min(3, Math.round(Math.log10(a / step)))));
  const decimals = Math.max(0, Math.min(6, -Math.floor(Math.log10(step) + 1e-9)));
  return x.toFixed(decimals);
}
