/**
 * `npm run bench [-- options]`: Stria's benchmarks. Figures for the README come from here, never from
 * timed tests.
 *   (default)          ms per default step at n = 128, 256, 512, and the C/FFTW reference beside it
 *   --json             one JSON object per line instead of a table
 *   --sizes a,b,c      other sizes
 *   --no-reference     skip the reference run
 *   --rounds R         alternate Stria and the reference R times (default 3, 1 with --scaling), quote the median
 *                      of the paired ratios: a shared machine drifts between the two measurements; each
 *                      round's Stria timings run in a fresh process that loads only the step (stepRound.ts)
 *   --scaling          sizes 64..1024 and the fitted exponent of the cost against N² log N
 *   --threads a,b      time the step on each of these thread counts (default 1), with the speed-up over
 *                      one thread; the ratio to the reference is the one-thread step's
 *   --time-to-jets     the default scenario at 256² (or --n N) from rest until jets show, on the threads
 *                      a run takes by default (or --threads N): wall and model time, and the scheme's error at that step against
 *                      half and quarter steps
 *   --two-layer        the two-layer step beside the one-layer step at each size (one thread, alternated
 *                      over the rounds): ms per step and their ratio, median over the rounds
 *   --draw             the Field figure's draw time at 512² (or --n N) in Debian's Chromium
 *   --scaling-law      the README's Rhines-scaling sweep through `stria sweep` on every core (--jobs J):
 *                      wall time and the fitted exponent of jet spacing against the Rhines length
 */
import { referenceUnavailable, runReference, type ReferenceTiming } from './reference';
import { stepRound } from './stepRound';
import { fitScaling } from './scaling';
import { median } from './timing';
import { availableParallelism } from 'node:os';
import { startStepThreads, type NodeStepThreads } from '../cli/stepThreads';
import type { StepThreads } from '../lib/model/threadTeam';
import { DEFAULT_THREADS_MIN_POINTS } from '../lib/model/stepTeam';

const args = process.argv.slice(2);
const has = (flag: string) => args.includes(flag);
const value = (flag: string) => {
  const i = args.indexOf(flag);
  return i >= 0 ? args[i + 1] : undefined;
};
const json = has('--json');
const scaling = has('--scaling');
const sizes = (value('--sizes') ?? (scaling ? '64,128,256,512,1024' : '128,256,512')).split(',').map(Number);

// --time-to-jets takes the threads a run takes by default (every core from 128² up, one below: stepTeam.ts).
const jetsSide = Number(value('--n') ?? 256);
const runThreads = jetsSide * jetsSide >= DEFAULT_THREADS_MIN_POINTS ? availableParallelism() : 1;
const threadCounts = (value('--threads') ?? (has('--time-to-jets') ? String(runThreads) : '1')).split(',').map(Number);
if (threadCounts.some((t) => !(Number.isInteger(t) && t >= 1))) throw new Error('--threads: whole numbers ≥ 1');
/**
 * Helper threads for the time to jets, which runs in this process (the step timings run each round in
 * a process of their own, bench/stepRound.ts, which starts its own).
 */
const helperSets = new Map<number, NodeStepThreads>();
if (has('--time-to-jets'))
  for (const t of threadCounts) if (t > 1 && !helperSets.has(t)) helperSets.set(t, await startStepThreads(t));
const threadsFor = (t: number): StepThreads | null => helperSets.get(t)?.threads ?? null;
async function finish(): Promise<never> {
  for (const h of helperSets.values()) await h.close();
  process.exit(0);
}

function emit(obj: Record<string, unknown>, line: string): void {
  if (json) console.log(JSON.stringify(obj));
  else if (line) console.log(line);
}

// Each mode loads only its own modules: what a process has loaded can shift the speed of the step it
// runs (bench/stepRound.ts), and the time to jets runs here.
if (has('--time-to-jets')) {
  const { MIN_JETS, timeToJets } = await import('./timeToJets');
  const n = Number(value('--n') ?? 256);
  if (!json)
    console.log(
      `Time to jets: default scenario at ${n}², from rest, until the jet detector finds ≥ ${MIN_JETS} significant jets in a window of the drag time 1/μ`,
    );
  const r = timeToJets(n, json ? undefined : console.log, threadsFor(threadCounts[0]));
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
    `  ${r.wall_seconds.toFixed(1)} s wall on ${r.threads} thread${r.threads > 1 ? 's' : ''}, model time ${r.model_time.toFixed(1)}, ${r.steps} steps: ${s.jet_count} jets, staircase index ${s.staircase_index?.toFixed(3)}, R_β ${s.zonostrophy_index?.toFixed(2)}\n` +
      `  scheme error over ${r.accuracy.span.toFixed(2)} T at dt = ${r.dt.toPrecision(3)}: ${r.accuracy.error_dt.toExponential(2)} relative (dt/2: ${r.accuracy.error_half.toExponential(2)}, observed order ${r.accuracy.observed_order.toFixed(2)})`,
  );
  await finish();
}

if (has('--scaling-law')) {
  const { scalingLaw } = await import('./scalingLaw');
  const jobs = Number(value('--jobs') ?? availableParallelism());
  if (!json) console.log(`Rhines-scaling sweep (lib/sweep/rhinesExample.ts) through stria sweep on ${jobs} workers`);
  const r = scalingLaw(jobs);
  const f = r.fits.jet_spacing_vs_rhines_length;
  const ci = f.exponent_ci;
  emit(
    { kind: 'scaling_law', ...r },
    `  ${r.runs} runs in ${r.wall_seconds.toFixed(0)} s wall: jet_spacing ∝ rhines_length^b, b = ${f.exponent?.toFixed(2)} [${ci?.[0].toFixed(2)}, ${ci?.[1].toFixed(2)}] (${((f.level ?? 0.95) * 100).toFixed(0)} % bootstrap interval), prefactor at b = 1: ${f.prefactor_at_exponent_1?.toFixed(2)}${ci && ci[0] <= 1 && ci[1] >= 1 && ci[0] > 0 ? ' — the Rhines scaling' : ''}`,
  );
  await finish();
}

if (has('--two-layer')) {
  const twoRounds = Math.max(1, Number(value('--rounds') ?? 3));
  const ratios = new Map<number, number[]>();
  for (let round = 1; round <= twoRounds; round++) {
    if (!json) console.log(`Two-layer step beside the one-layer step, one thread, round ${round} of ${twoRounds}`);
    const timings = stepRound(sizes, [1], [1, 2]);
    for (const n of sizes) {
      const one = timings.find((t) => t.n === n && t.layers === 1);
      const two = timings.find((t) => t.n === n && t.layers === 2);
      if (!one || !two) throw new Error(`the round gave no timing at n = ${n}`);
      const ratio = two.ms_per_step / one.ms_per_step;
      ratios.set(n, [...(ratios.get(n) ?? []), ratio]);
      emit(
        { kind: 'two_layer', round, n, one_layer_ms: one.ms_per_step, two_layer_ms: two.ms_per_step, ratio },
        `  n = ${String(n).padStart(4)}   one layer ${one.ms_per_step.toFixed(3)} ms, two layers ${two.ms_per_step.toFixed(3)} ms: ×${ratio.toFixed(2)}`,
      );
    }
  }
  if (!json) console.log('Two-layer/one-layer step: median (lowest–highest)');
  for (const [n, rs] of ratios)
    emit(
      { kind: 'two_layer_ratio', n, rounds: rs.length, median: median(rs), min: Math.min(...rs), max: Math.max(...rs) },
      `  n = ${String(n).padStart(4)}   ${median(rs).toFixed(2)} (${Math.min(...rs).toFixed(2)}–${Math.max(...rs).toFixed(2)})`,
    );
  await finish();
}

if (has('--draw')) {
  const { timeFieldDraw } = await import('./drawBench');
  const d = await timeFieldDraw(Number(value('--n') ?? 512));
  emit(
    { kind: 'draw', ...d },
    `Field figure draw time in Chromium at ${d.n}² (${d.frames} frames): median ${d.median_ms.toFixed(2)} ms, 95th percentile ${d.p95_ms.toFixed(2)} ms, max ${d.max_ms.toFixed(2)} ms`,
  );
  await finish();
}

const why = has('--no-reference') ? 'not asked for' : referenceUnavailable();
const rounds = why ? 1 : Math.max(1, Number(value('--rounds') ?? (scaling ? 1 : 3)));
const ratiosBySize = new Map<number, number[]>();
/** Every round's ms per step, by size and thread count. */
const msBy = new Map<string, number[]>();
const key = (n: number, t: number) => `${n}×${t}`;
const oneThread = threadCounts.includes(1) ? 1 : threadCounts[0];
for (let round = 1; round <= rounds; round++) {
  if (!json)
    console.log(
      `Stria step benchmark (scheme ifrk4, Node ${process.version}); median of timed batches in a fresh process${rounds > 1 ? `, round ${round} of ${rounds}` : ''}`,
    );
  // The round's timings, in a process of their own (bench/stepRound.ts).
  const timings = stepRound(sizes, threadCounts);
  for (const n of sizes) {
    const cells: string[] = [];
    for (const t of threadCounts) {
      const timing = timings.find((x) => x.n === n && x.asked_threads === t);
      if (!timing) throw new Error(`the round gave no timing at n = ${n} on ${t} threads`);
      msBy.set(key(n, t), [...(msBy.get(key(n, t)) ?? []), timing.ms_per_step]);
      const base = timings.find((x) => x.n === n && x.threads === 1);
      const speedup = base && t > 1 ? base.ms_per_step / timing.ms_per_step : undefined;
      emit({ ...timing, round, ...(speedup ? { speedup } : {}) }, '');
      cells.push(
        `${timing.ms_per_step.toFixed(3).padStart(9)} ms/step on ${timing.threads}${speedup ? ` (×${speedup.toFixed(2)})` : ''}`,
      );
    }
    if (!json) console.log(`  n = ${String(n).padStart(4)} ${cells.join('   ')}`);
  }
  if (why) {
    if (why !== 'not asked for') emit({ kind: 'reference', skipped: why }, `  C/FFTW reference skipped: ${why}`);
    continue;
  }
  // The reference runs right after Stria in every round, so each ratio pairs two close measurements.
  const ref: ReferenceTiming[] = runReference();
  if (!json) console.log('C/FFTW reference step (same scheme, 20 real transforms per step, one thread), right after:');
  for (const r of ref) {
    const ours = timings.find((t) => t.n === r.n && t.threads === oneThread);
    const ratio = ours ? ours.ms_per_step / r.ms_per_step : undefined;
    if (ratio !== undefined) ratiosBySize.set(r.n, [...(ratiosBySize.get(r.n) ?? []), ratio]);
    emit(
      {
        kind: 'reference',
        round,
        n: r.n,
        reference_ms_per_step: r.ms_per_step,
        stria_threads: oneThread,
        stria_ms_per_step: ours?.ms_per_step,
        ratio,
      },
      `  n = ${String(r.n).padStart(4)}   ${r.ms_per_step.toFixed(3).padStart(9)} ms/step` +
        (ratio ? `   Stria on ${oneThread}/reference = ${ratio.toFixed(2)}` : ''),
    );
  }
}
if (ratiosBySize.size > 0) {
  if (!json)
    console.log(
      `Stria on ${oneThread}/reference over ${rounds} round${rounds > 1 ? 's' : ''}: median (lowest–highest)`,
    );
  for (const [n, rs] of ratiosBySize) {
    emit(
      { kind: 'ratio', n, rounds: rs.length, median: median(rs), min: Math.min(...rs), max: Math.max(...rs) },
      `  n = ${String(n).padStart(4)}   ${median(rs).toFixed(2)} (${Math.min(...rs).toFixed(2)}–${Math.max(...rs).toFixed(2)})`,
    );
  }
}

if (threadCounts.length > 1 && rounds > 1) {
  if (!json) console.log(`Over ${rounds} rounds: median ms per step (speed-up over one thread, of the medians)`);
  for (const n of sizes) {
    const one = msBy.get(key(n, 1));
    const cells = threadCounts.map((t) => {
      const ms = median(msBy.get(key(n, t)) ?? []);
      const speedup = one && t > 1 ? median(one) / ms : undefined;
      emit({ kind: 'threads', n, threads: t, rounds, median_ms_per_step: ms, ...(speedup ? { speedup } : {}) }, '');
      return `${ms.toFixed(3).padStart(9)} ms/step on ${t}${speedup ? ` (×${speedup.toFixed(2)})` : ''}`;
    });
    if (!json) console.log(`  n = ${String(n).padStart(4)} ${cells.join('   ')}`);
  }
}

if (scaling && sizes.length >= 2) {
  // One fit per thread count, on the median over rounds at each size.
  for (const t of threadCounts) {
    const fit = fitScaling(
      sizes.map((n) => ({ n, threads: t, ms_per_step: median(msBy.get(key(n, t)) ?? []), scheme: '' })),
    );
    emit(
      { kind: 'scaling', threads: t, exponent_N: fit.exponentN, exponent_N2logN: fit.exponentN2logN, sizes },
      `  on ${t} thread${t > 1 ? 's' : ''}: cost ∝ N^${fit.exponentN.toFixed(3)}; against N² log N the exponent is ${fit.exponentN2logN.toFixed(3)} (1 means exactly N² log N)`,
    );
  }
}
await finish();
