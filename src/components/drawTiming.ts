/**
 * How long the Field figure took to draw, for `npm run bench -- --draw` (bench/drawBench.ts), which
 * reads it through the test hooks (keep/testHooks.ts). A ring of the last 256 times in ms, written
 * without allocating, so measuring costs a frame nothing.
 */
const RING = 256;
const times = new Float64Array(RING);
let count = 0;

export function recordFieldDraw(ms: number): void {
  times[count % RING] = ms;
  count++;
}

/** The recorded draw times, oldest first (at most the last 256). */
export function fieldDrawTimes(): number[] {
  const n = Math.min(count, RING);
  const out: number[] = [];
  for (let i = count - n; i < count; i++) out.push(times[i % RING]);
  return out;
}
