/** Median of a list of numbers. */
export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

/**
 * Milliseconds per call of `fn`: warm up, then time `batches` batches of calls, each lasting about
 * `batchMs`, and return the median batch's time per call (the median resists a busy machine).
 */
export function msPerCall(fn: () => void, opts: { warmup?: number; batches?: number; batchMs?: number } = {}): number {
  const warmup = opts.warmup ?? 5;
  const batches = opts.batches ?? 7;
  const batchMs = opts.batchMs ?? 400;
  for (let i = 0; i < warmup; i++) fn();
  // Calibrate the batch length from one timed call.
  let t = performance.now();
  fn();
  const one = Math.max(performance.now() - t, 1e-3);
  const calls = Math.max(1, Math.round(batchMs / one));
  const per: number[] = [];
  for (let b = 0; b < batches; b++) {
    t = performance.now();
    for (let i = 0; i < calls; i++) fn();
    per.push((performance.now() - t) / calls);
  }
  return median(per);
}
