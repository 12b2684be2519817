/**
 * `npm run bench [-- options]`: Stria's benchmarks. Figures for the README come from here, never from
 * timed tests.
 *   (default)          ms per default step at n = 128, 256, 512, and the C/FFTW reference beside it
 *   --json             one JSON object per line instead of a table
 *   --sizes a,b,c      other sizes
 *   --no-reference     skip the reference run
 *   --rounds R         alternate Stria and the reference R times (default 3, 1 with --scaling), quote the median
 *                      of the paired ratios: a shared machine drifts between the two measurements
 *   --scaling          sizes 64..1024 and the fitted exponent of the cost against N² log N
 *   --time-to-jets     the default scenario at 256² from rest until jets show: wall and model time,
 *                      and the scheme's error at that step against half and quarter steps
 *   --draw             the Field figure's draw time at 512² (or --n N) in Debian's Chromium
 *   --scaling-law      the README's Rhines-scaling sweep through `stria sweep` on every core (--jobs J):
 *                      wall time and the fitted exponent of jet spacing against the Rhines length
 */
import { referenceUnavailable, runReference, type ReferenceTiming } from './reference';
import { timeStep, type StepTiming } from './stepBench';
import { fitScaling } from './scaling';
import { median } from './timing';
import { MIN_JETS, MIN_STAIRCASE, timeToJets } from './timeToJets';
import { timeFieldDraw } from './drawBench';
import { scalingLaw } from './scalingLaw';
import { availableParallelism } from 'node:os';

const args = process.argv.slice(2);
const has = (flag: string) => args.includes(flag);
const value = (flag: string) => {
  const i = args.indexOf(flag);
  return i >= 0 ? args[i + 1] : undefined;
};
const json = has('--json');
const scaling = has('--scaling');
const sizes = (value('--sizes') ?? (scaling ? '64,128,256,512,1024' : '128,256,512')).split(',').map(Number);

function emit(obj: Record<string, unknown>, line: string): void {
  if (json) console.log(JSON.stringify(obj));
  else console.log(line);
}

if (has('--time-to-jets')) {
  const n = Number(value('--n') ?? 256);
  if (!json)
    console.log(
      `Time to jets: default scenario at ${n}², from rest, until ≥ ${MIN_JETS} jets and staircase index ≥ ${MIN_STAIRCASE}`,
    );
  const r = timeToJets(n, json ? undefined : console.log);
  const s = r.summary;
  emit(
    {
      kind: 'time_to_jets',
      ...r,
      summary: undefined,
      jet_count: s.jet_count,
      staircase_index: s.staircase_index,
      zonostrophy_index: s.zonostrophy_index,
    },
    `  ${r.wall_seconds.toFixed(1)} s wall, model time ${r.model_time.toFixed(1)}, ${r.steps} steps: ${s.jet_count} jets, staircase index ${s.staircase_index?.toFixed(3)}, R_β ${s.zonostrophy_index?.toFixed(2)}\n` +
      `  scheme error over ${r.accuracy.span.toFixed(2)} T at dt = ${r.dt.toPrecision(3)}: ${r.accuracy.error_dt.toExponential(2)} relative (dt/2: ${r.accuracy.error_half.toExponential(2)}, observed order ${r.accuracy.observed_order.toFixed(2)})`,
  );
  process.exit(0);
}

if (has('--scaling-law')) {
  const jobs = Number(value('--jobs') ?? availableParallelism());
  if (!json) console.log(`Rhines-scaling sweep (lib/sweep/rhinesExample.ts) through stria sweep on ${jobs} workers`);
  const r = scalingLaw(jobs);
  const f = r.fits.jet_spacing_vs_rhines_length;
  const ci = f.exponent_ci;
  emit(
    { kind: 'scaling_law', ...r },
    `  ${r.runs} runs in ${r.wall_seconds.toFixed(0)} s wall: jet_spacing ∝ rhines_length^b, b = ${f.exponent?.toFixed(2)} [${ci?.[0].toFixed(2)}, ${ci?.[1].toFixed(2)}] (${((f.level ?? 0.95) * 100).toFixed(0)} % bootstrap interval), prefactor at b = 1: ${f.prefactor_at_exponent_1?.toFixed(2)}${ci && ci[0] <= 1 && ci[1] >= 1 && ci[0] > 0 ? ' — the Rhines scaling' : ''}`,
  );
  process.exit(0);
}

if (has('--draw')) {
  const d = await timeFieldDraw(Number(value('--n') ?? 512));
  emit(
    { kind: 'draw', ...d },
    `Field figure draw time in Chromium at ${d.n}² (${d.frames} frames): median ${d.median_ms.toFixed(2)} ms, 95th percentile ${d.p95_ms.toFixed(2)} ms, max ${d.max_ms.toFixed(2)} ms`,
  );
  process.exit(0);
}

const why = has('--no-reference') ? 'not asked for' : referenceUnavailable();
const rounds = why ? 1 : Math.max(1, Number(value('--rounds') ?? (scaling ? 1 : 3)));
const ratiosBySize = new Map<number, number[]>();
let timings: StepTiming[] = [];
for (let round = 1; round <= rounds; round++) {
  if (!json)
    console.log(
      `Stria step benchmark (scheme ifrk4, Node ${process.version}); median of timed batches${rounds > 1 ? `, round ${round} of ${rounds}` : ''}`,
    );
  timings = [];
  for (const n of sizes) {
    const t = timeStep(n);
    timings.push(t);
    emit({ ...t, round }, `  n = ${String(n).padStart(4)}   ${t.ms_per_step.toFixed(3).padStart(9)} ms/step`);
  }
  if (why) {
    if (why !== 'not asked for') emit({ kind: 'reference', skipped: why }, `  C/FFTW reference skipped: ${why}`);
    continue;
  }
  // The reference runs right after Stria in every round, so each ratio pairs two close measurements.
  const ref: ReferenceTiming[] = runReference();
  if (!json) console.log('C/FFTW reference step (same scheme, 20 real transforms per step), right after:');
  for (const r of ref) {
    const ours = timings.find((t) => t.n === r.n);
    const ratio = ours ? ours.ms_per_step / r.ms_per_step : undefined;
    if (ratio !== undefined) ratiosBySize.set(r.n, [...(ratiosBySize.get(r.n) ?? []), ratio]);
    emit(
      {
        kind: 'reference',
        round,
        n: r.n,
        reference_ms_per_step: r.ms_per_step,
        stria_ms_per_step: ours?.ms_per_step,
        ratio,
      },
      `  n = ${String(r.n).padStart(4)}   ${r.ms_per_step.toFixed(3).padStart(9)} ms/step` +
        (ratio ? `   Stria/reference = ${ratio.toFixed(2)}` : ''),
    );
  }
}
if (ratiosBySize.size > 0) {
  if (!json) console.log(`Stria/reference over ${rounds} round${rounds > 1 ? 's' : ''}: median (lowest–highest)`);
  for (const [n, rs] of ratiosBySize) {
    emit(
      { kind: 'ratio', n, rounds: rs.length, median: median(rs), min: Math.min(...rs), max: Math.max(...rs) },
      `  n = ${String(n).padStart(4)}   ${median(rs).toFixed(2)} (${Math.min(...rs).toFixed(2)}–${Math.max(...rs).toFixed(2)})`,
    );
  }
}

if (scaling && timings.length >= 2) {
  const fit = fitScaling(timings);
  emit(
    { kind: 'scaling', exponent_N: fit.exponentN, exponent_N2logN: fit.exponentN2logN, sizes },
    `  cost ∝ N^${fit.exponentN.toFixed(3)}; against N² log N the exponent is ${fit.exponentN2logN.toFixed(3)} (1 means exactly N² log N)`,
  );
}
