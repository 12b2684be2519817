import { fmt, lengthText } from '../plan/format';
import type { UnitLabels } from './unitLabels';
import type { ComparisonRow } from './measuredVsPredicted';
import type { FileAnalysis } from './analyzeFile';
import type { SpectralSlope } from './spectralSlopes';
import { rhinesLabel } from '../plan/rhinesLabels';

/**
 * The readable text of a file analysis (`stria analyze` without --json): what was read and how,
 * what was masked, what was computed and what skipped with the reason, the jets, the staircase, the
 * scales, and the table of measured values beside the planner's predictions. Lengths in the
 * grid's units (m for SI files and the tangent plane).
 */
export function fileAnalysisText(r: FileAnalysis, name = 'the file'): string {
  const a = r.analysis;
  const g = a.grid;
  const labels = r.comparison.labels;
  const L = (x: number | null | undefined) =>
    x === null || x === undefined
      ? '—'
      : labels.length === 'm'
        ? lengthText(x)
        : `${fmt(x)}${labels.length === '°' ? '°' : ` ${labels.length}`}`;
  const out: string[] = [];
  out.push(
    `Stria analysis of ${name} (${r.file.format}, ${r.file.layout === 'gridded' ? 'gridded fields' : 'zonal-mean profiles'})`,
  );
  out.push('', 'Fields');
  for (const [role, f] of Object.entries(r.file.fields))
    out.push(`  ${role.padEnd(5)} ← "${f.variable}" (by ${f.found}${f.units ? `, units "${f.units}"` : ''})`);
  const derived = Object.entries(a.fields).filter(([, from]) => from && from !== 'file');
  if (derived.length) out.push(`  derived: ${derived.map(([k, from]) => `${k} from ${from}`).join(', ')}`);
  out.push('', 'Grid');
  out.push(
    `  ${g.nx} × ${g.ny} points, dx = ${L(g.dx)}, dy = ${L(g.dy)}; periodic in x: ${g.periodicX ? 'yes' : 'no'}, in y: ${g.periodicY ? 'yes' : 'no'}`,
  );
  out.push(
    `  records ${a.window.start} to ${a.window.end - 1} of ${r.file.records} (${a.window.count})${a.window.timeStart !== null ? `, time ${fmt(a.window.timeStart)} to ${fmt(a.window.timeEnd as number)} ${timeUnitText(a.window.timeUnits)}` : ''}`,
  );
  if (r.layers)
    out.push(
      `  layers: ${r.layers.analysed} of the ${r.layers.count} along "${r.layers.dimension}"${r.layers.analysed === 'depth-weighted mean' ? ` (weights ${r.layers.weights.map((w) => fmt(w, 4)).join(', ')}: ${r.layers.weightsSource})` : ''}`,
    );
  out.push('', 'Masked values (missing data are left out, never averaged in)');
  for (const [role, m] of Object.entries(r.masking)) {
    out.push(
      `  ${role.padEnd(5)} ${m.masked} of ${m.total} (${fmt(100 * m.fraction, 3)}%): ${m.fill} fill or missing_value, ${m.nonFinite} NaN/Inf, ${m.outOfRange} outside the valid range`,
    );
  }
  out.push('', 'Parameters');
  for (const [k, p] of Object.entries(r.parameters))
    out.push(`  ${k.padEnd(5)} ${p ? `${fmt(p.value, 6)} (${p.source})` : 'not given'}`);
  out.push('', 'Computed');
  for (const c of a.computed) out.push(`  - ${c}`);
  if (a.skipped.length) {
    out.push('', 'Skipped');
    for (const s of a.skipped) out.push(`  - ${s.diagnostic}: ${s.reason}`);
  }
  out.push('', 'Results');
  if (r.heatFlux) {
    const h = r.heatFlux;
    out.push(
      `  eddy heat flux ⟨v′τ′⟩ (τ = ψ₁ − ψ₂, v of the upper layer; ${h.from === 'fields' ? `from ${h.variable} of both layers` : `the file's ${h.variable} profile`}): ${fmt(h.mean, 4)}${h.stderr !== null ? ` ± ${fmt(h.stderr, 2)}` : ''} over ${h.records} record${h.records === 1 ? '' : 's'}`,
    );
  }
  if (a.jets) {
    const j = a.jets;
    out.push(
      j.count === null
        ? `  jets: ${j.reason}`
        : `  jets: ${j.count} significant eastward jet${j.count === 1 ? '' : 's'}${j.count ? ` at y = ${j.jets.map((x) => fmt(x.y)).join(', ')}` : ''} (${j.reason})`,
    );
    if (j.meanSpacing !== null)
      out.push(
        `  jet spacing: ${L(j.meanSpacing)}${j.spacingStderr !== null ? ` ± ${L(j.spacingStderr)} (standard error)` : ''}, spread between jets ${L(j.spacingStd)}`,
      );
  }
  if (a.staircase)
    out.push(
      a.staircase.index === null
        ? `  PV staircase: ${a.staircase.reason}`
        : `  PV staircase: ${a.staircase.edges.length} significant edges, mean step width ${L(a.staircase.meanWidth)}, sharpness index ${fmt(a.staircase.index, 4)}${a.staircase.indexStderr !== null ? ` ± ${fmt(a.staircase.indexStderr, 2)}` : ''} (1 perfect, 0 the plain βy)`,
    );
  if (a.uRms) out.push(`  U_rms = ${fmt(a.uRms.value)} ${labels.velocity} (${a.uRms.kind})`);
  if (a.scales.kRhines !== null)
    out.push(
      `  k_R = ${fmt(a.scales.kRhines)} ${labels.wavenumber}, Rhines length ${rhinesLabel(a.scales.rhinesConvention)} = ${L(a.scales.rhinesLength)}, staircase spacing 720^¼(U/β)^½ = ${L(a.scales.staircaseSpacing)}`,
    );
  if (a.scales.zonostrophyIndex !== null) out.push(`  R_β = ${fmt(a.scales.zonostrophyIndex)} (${a.scales.regime})`);
  if (a.diffusivity?.Dfit !== null && a.diffusivity)
    out.push(`  ${diffusivityText(a.diffusivity.Dfit as number, L(a.diffusivity.Lmix))}`);
  if (a.spectra)
    out.push(
      `  spectra: ${a.spectra.kind === 'pv' ? 'energy and enstrophy of q' : 'kinetic energy'}, mean of ${a.spectra.records} records${a.spectra.refused ? ` (${a.spectra.refused} left out for missing values)` : ''}`,
    );
  for (const sl of r.spectralSlopes) out.push(`  ${slopeText(sl)}`);
  out.push('', 'Measured beside the planner');
  out.push(...comparisonTable(r.comparison.rows, labels));
  if (r.comparison.missing) out.push(`  (${r.comparison.missing})`);
  const notes = [...r.file.notes, ...a.notes];
  if (notes.length) {
    out.push('', 'Notes');
    for (const n of notes) out.push(`  - ${n}`);
  }
  out.push(
    '',
    `Memory: ${fmt(a.memory.retainedBytes / 1048576, 3)} MiB of buffers kept, at most ${fmt(a.memory.peakTransientBytes / 1048576, 3)} MiB more while a record is read`,
  );
  return out.join('\n') + '\n';
}

/** The rows as a fixed-width table, each number's unit in the file's own units. */
export function comparisonTable(rows: readonly ComparisonRow[], labels: UnitLabels): string[] {
  const cell = (x: number | null, text?: string) => (x === null ? '—' : fmt(x) + (text ? ` (${text})` : ''));
  const head = ['quantity', 'measured', 'predicted', 'ratio', 'unit', 'verdict'];
  const body = rows.map((r) => [
    r.label,
    cell(r.measured, r.measuredText),
    cell(r.predicted, r.predictedText),
    r.ratio === null ? '—' : fmt(r.ratio, 3),
    labels[r.quantity],
    r.verdict ?? '',
  ]);
  const w = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
  const line = (c: string[]) =>
    '  ' +
    c
      .map((x, i) => (i === 0 || i === c.length - 1 ? x.padEnd(w[i]) : x.padStart(w[i])))
      .join('  ')
      .trimEnd();
  return [line(head), ...body.map(line)];
}

/**
 * The eddy diffusivity of PV, D = −⟨v′q′⟩/∂q̄/∂y fitted across the rows. A negative D means the
 * eddies carry PV up its gradient (sharpening it, as at jets that a staircase forms), so it is no
 * down-gradient diffusivity and has no mixing length: say so instead of printing the bare number.
 */
export function diffusivityText(D: number, mixingLength: string): string {
  if (D < 0)
    return `eddy diffusivity of PV D_fit = ${fmt(D)}: UP-GRADIENT (negative): the eddy PV flux runs up the mean PV gradient, so this is no down-gradient diffusivity and no mixing length follows from it`;
  return `eddy diffusivity of PV D_fit = ${fmt(D)}, mixing length ${mixingLength}`;
}

/** The time axis's unit as the file states it (its units attribute, quoted), or that it states none. */
export function timeUnitText(units: string | null): string {
  return units ? `(units "${units}" as the file states them)` : '(the file states no time units)';
}

function slopeText(s: SpectralSlope): string {
  const band = Number.isFinite(s.kLo) ? ` over k = ${fmt(s.kLo)} to ${fmt(s.kHi)}` : '';
  const law = `${s.range} range (theory ${s.expected === -3 ? '−3' : '−5/3'})`;
  if (s.slope === null) return `energy spectrum slope, ${law}: not fitted${band}: ${s.reason}`;
  return `energy spectrum slope, ${law}: ${fmt(s.slope, 3)} ± ${fmt(s.slopeStdErr as number, 2)}${band} (${s.points} shells)`;
}
