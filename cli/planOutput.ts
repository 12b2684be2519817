import type { RunSummary } from '../lib/analysis/summary';
import type { PlanAnalysis } from '../lib/plan/analysePlan';
import { RATIO_LABELS, type MatchedRun } from '../lib/plan/matchedRun';
import { duration, fmt, withUnit } from '../lib/plan/format';
import type { PlanPredictions } from '../lib/plan/predictions';
import { regimeLabel } from '../lib/plan/predictions';
import { verdicts } from '../lib/plan/verdict';

/**
 * What `stria plan` prints. The headline numbers use the run summary's keys, so a prediction and the
 * matched run's measurement sit under the same name: regime, jet_count (Ly over the Rhines-scale
 * spacing), u_rms, k_rhines, k_beta, zonostrophy_index, jet_spacing. Values are in the plan's units
 * (SI for a physical plan); the matched run is in its own model units.
 */
export function headline(p: PlanPredictions) {
  return {
    regime: p.regime.text,
    jet_count: p.jetsRhines.value,
    u_rms: p.U.value,
    k_rhines: p.kR.value,
    k_beta: p.kBeta.value,
    zonostrophy_index: p.R_beta.value,
    jet_spacing: p.jetSpacingRhines.value,
  };
}

export function planJson(a: PlanAnalysis, measured: RunSummary | null): unknown {
  const p = a.predictions;
  return {
    title: a.plan.input.title ?? null,
    units: a.plan.units,
    ...headline(p),
    jet_count_staircase: p.jetsStaircase.value,
    jet_spacing_staircase: p.jetSpacingStaircase.value,
    spin_up_time: p.spinUpTime.value,
    steady_time: p.steadyTime.value,
    dt: p.dtCFL.value,
    steps_planned: p.stepsPlanned.value,
    predictions: p,
    checks: a.checks.map((c) => ({ id: c.id, severity: c.severity, title: c.title, message: c.message, fix: c.fix })),
    cost: {
      steps: a.cost.steps,
      seconds_per_step: a.cost.secondsPerStep,
      wall_seconds: a.cost.wallSeconds,
      memory_bytes: a.cost.memory.totalBytes,
    },
    matched: a.matched
      ? {
          params: a.matched.params,
          run_length: a.matched.plan.runLength,
          steps: a.matched.cost.steps,
          wall_seconds: a.matched.cost.wallSeconds,
          within_target: a.matched.withinTarget,
          predicted: headline(a.matched.predictions),
          measured,
          verdicts: measured ? verdicts(a.matched.predictions, measured) : null,
          // The physical size of the matched run's model units (the plan's scaling), or null in model units.
          physical_units:
            a.plan.units === 'physical'
              ? { metres_per_length: a.scaling.length, seconds_per_time: a.scaling.time }
              : null,
        }
      : null,
    matched_error: a.matchedError,
    baroclinic: a.baroclinic
      ? {
          shear: a.baroclinic.shear,
          depth_ratio: a.baroclinic.depthRatio,
          predictions: Object.fromEntries(a.baroclinic.predictions.map((q) => [q.id, q])),
          matched: a.baroclinic.matched
            ? {
                params: a.baroclinic.matched.params,
                run_length: a.baroclinic.matched.runLength,
                steps: a.baroclinic.matched.cost.steps,
                wall_seconds: a.baroclinic.matched.cost.wallSeconds,
                within_target: a.baroclinic.matched.withinTarget,
                kept: a.baroclinic.matched.kept,
                predicted: a.baroclinic.matched.predicted,
                measured,
                notes: a.baroclinic.matched.notes,
              }
            : null,
          matched_error: a.baroclinic.matchedError,
        }
      : null,
  };
}

/** The plan in text: predictions, checks, cost and the matched run it proposes (not its measurement). */
export function planText(a: PlanAnalysis): string {
  const p = a.predictions;
  const u = a.plan.units;
  const lines = [
    `Stria plan: ${a.plan.input.title ?? 'untitled'} (${u === 'physical' ? 'SI units' : 'model units'})`,
    `Regime: ${regimeLabel(p)}`,
    '',
    'Predictions:',
  ];
  const rows = Object.values(p).map((q) => [
    `${q.label} (${q.symbol})`,
    q.text ? `${q.text}, R_β = ${fmt(q.value)}` : withUnit(q.value, q.quantity, u),
  ]);
  const w = Math.max(...rows.map((r) => r[0].length));
  lines.push(...rows.map(([k, x]) => `  ${k.padEnd(w)}  ${x}`));
  const b = a.baroclinic;
  if (b) {
    lines.push(
      '',
      `Baroclinic drive (two layers): shear U₁ − U₂ = ${withUnit(b.shear, 'velocity', u)}, δ = ${fmt(b.depthRatio)}`,
    );
    const br = b.predictions.map((q) => [
      `${q.label} (${q.symbol})`,
      q.text ? `${q.text}, ξ = ${fmt(q.value)}` : withUnit(q.value, q.quantity, u),
    ]);
    const bw = Math.max(...br.map((r) => r[0].length));
    lines.push(...br.map(([k, x]) => `  ${k.padEnd(bw)}  ${x}`));
    lines.push("  (Held & Larichev's scalings carry order-one prefactors; their simulations vary faster with ξ)");
  }
  lines.push('', 'Checks:');
  for (const c of a.checks)
    lines.push(`  [${c.severity}] ${c.title}: ${c.message}${c.fix ? `\n          fix: ${c.fix}` : ''}`);
  lines.push('', `Cost with Stria's model: ${a.cost.steps} steps, ${duration(a.cost.wallSeconds)} here`);
  const m = a.matched;
  const bm = b?.matched;
  if (b && bm)
    lines.push(
      `Matched two-layer run: ${bm.params.nx} × ${bm.params.ny}, ${bm.cost.steps} steps, about ${duration(bm.cost.wallSeconds)} (model units: ${bm.kept.map((k) => `${k.label} ${k.kept ? 'kept' : `${fmt(k.planned)} → ${fmt(k.matched)}`}`).join('; ')})`,
      ...bm.notes.map((n) => `  ${n}`),
    );
  else if (b) lines.push(`Matched two-layer run: none (${b.matchedError})`);
  else if (!m) lines.push(`Matched cheap run: none (${a.matchedError})`);
  else {
    lines.push(
      `Matched cheap run: ${m.params.nx} × ${m.params.ny}, ${m.cost.steps} steps, about ${duration(m.cost.wallSeconds)} (model units; ${m.gives === 'none' ? 'every ratio kept' : `the ratio that gave last: ${RATIO_LABELS[m.gives]}`})`,
    );
  }
  return `${lines.join('\n')}\n`;
}

/**
 * The matched run's measurement beside its predictions, under the run summary's keys, with the
 * verdict of each row (lib/plan/verdict.ts): measured ± its standard error, the tolerance, and what
 * to change when it does not agree.
 */
export function matchedComparisonText(m: MatchedRun, measured: RunSummary): string {
  const rows = verdicts(m.predictions, measured);
  const w = [18, 14, 24, 15];
  const lines = [
    '',
    `  ${'quantity'.padEnd(w[0])}  ${'predicted'.padEnd(w[1])}  ${'measured ± std. error'.padEnd(w[2])}  ${'verdict'.padEnd(w[3])}  why`,
  ];
  for (const r of rows) {
    const meas =
      r.stderr !== null && typeof r.measured === 'number'
        ? `${show(r.measured)} ± ${show(r.stderr)}`
        : show(r.measured);
    lines.push(
      `  ${r.key.padEnd(w[0])}  ${show(r.predicted).padEnd(w[1])}  ${meas.padEnd(w[2])}  ${r.verdict.padEnd(w[3])}  ${r.note}`,
    );
  }
  lines.push(
    '',
    `  A row agrees when |ln(measured/predicted)| ≤ 2·((σ/measured)² + r²)^½: σ the measurement's standard error, r the scaling's own scatter (${rows
      .filter((r) => r.key !== 'regime')
      .map((r) => `${r.key} ${r.scatter}`)
      .join(', ')}; sources in lib/plan/verdict.ts and docs/significance.md).`,
  );
  return `${lines.join('\n')}\n`;
}

/** Predictions beside a run's measurement, key by key (the run summary's keys). */
export function keyedComparisonText(predicted: object, measured: RunSummary): string {
  const pred = predicted as Record<string, unknown>;
  const meas = measured as unknown as Record<string, unknown>;
  const lines = ['', `  ${'quantity'.padEnd(18)}  ${'predicted'.padEnd(14)}  measured`];
  for (const k of Object.keys(pred)) lines.push(`  ${k.padEnd(18)}  ${show(pred[k]).padEnd(14)}  ${show(meas[k])}`);
  return `${lines.join('\n')}\n`;
}

function show(x: unknown): string {
  return typeof x === 'number' ? fmt(x) : x === null || x === undefined ? '—' : String(x);
}
