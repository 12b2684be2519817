import { rhinesLabel } from './rhinesLabels';
import { REGIME_LABELS } from '../analysis/scales';
import { fmt, unitLabel } from './format';
import type { PlanPredictions } from './predictions';
import type { ResolvedPlan } from './resolvePlan';

/**
 * The scale ladder: every wavenumber of a plan on one logarithmic axis, drawn as a self-contained
 * SVG (no scripts, no external fonts or images; all text escaped). A length L sits at k = 2π/L.
 * Marks: the domain (2π/Ly, and 2π/Lx when different), the Rhines scale in the plan's convention,
 * the staircase jet spacing, k_β, k_fric, the forcing annulus, the dissipation wavenumber k_ν, the
 * grid's kept radius k_max, and the deformation wavenumber k_d when finite. The band between the
 * Rhines mark and k_β (the anisotropic, zonostrophic range) is shaded.
 */
export type MarkKind = 'domain' | 'jets' | 'arrest' | 'forcing' | 'dissipation' | 'grid' | 'deformation';

export interface LadderMark {
  id: string;
  symbol: string;
  label: string;
  /** Wavenumber (rad per length unit of the plan). */
  k: number;
  kind: MarkKind;
}

/** The marks of a plan, in increasing k; marks with non-finite or non-positive k are left out. */
export function ladderMarks(plan: ResolvedPlan, pred: PlanPredictions): LadderMark[] {
  const marks: LadderMark[] = [
    { id: 'domainY', symbol: '2π/Ly', label: 'domain (y)', k: (2 * Math.PI) / plan.Ly, kind: 'domain' },
    {
      id: 'rhines',
      symbol: 'k_Rh',
      label: `Rhines (${rhinesLabel(plan.input.rhines)})`,
      k: (2 * Math.PI) / pred.jetSpacingRhines.value,
      kind: 'jets',
    },
    {
      id: 'staircase',
      symbol: 'k_stair',
      label: 'staircase spacing',
      k: (2 * Math.PI) / pred.jetSpacingStaircase.value,
      kind: 'jets',
    },
    { id: 'kBeta', symbol: 'k_β', label: 'transitional', k: pred.kBeta.value, kind: 'arrest' },
    { id: 'kFric', symbol: 'k_fric', label: 'friction', k: pred.kFric.value, kind: 'arrest' },
    { id: 'kf', symbol: 'k_f', label: 'forcing', k: plan.kf, kind: 'forcing' },
    { id: 'kNu', symbol: 'k_ν', label: 'dissipation', k: pred.kNu.value, kind: 'dissipation' },
    { id: 'kMax', symbol: 'k_max', label: 'grid (2/3 rule)', k: plan.kMax, kind: 'grid' },
    { id: 'kd', symbol: 'k_d', label: 'deformation', k: plan.kd, kind: 'deformation' },
  ];
  if (plan.Lx !== plan.Ly)
    marks.push({ id: 'domainX', symbol: '2π/Lx', label: 'domain (x)', k: (2 * Math.PI) / plan.Lx, kind: 'domain' });
  return marks.filter((m) => Number.isFinite(m.k) && m.k > 0).sort((a, b) => a.k - b.k);
}

const COLOURS: Readonly<Record<MarkKind, string>> = Object.freeze({
  domain: '#444444',
  jets: '#1f5fa8',
  arrest: '#7a3e9d',
  forcing: '#c0392b',
  dissipation: '#b9770e',
  grid: '#222222',
  deformation: '#1e8449',
});

/** Escape text for XML character data and attribute values. */
export function escapeXml(s: string): string {
  return s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

export interface LadderOptions {
  /** Width in CSS pixels (default 760). */
  width?: number;
  /** Include the xmlns attribute for use as a standalone .svg file (default true). */
  standalone?: boolean;
}

/** The scale ladder of a plan as SVG markup. */
export function scaleLadderSvg(plan: ResolvedPlan, pred: PlanPredictions, opts: LadderOptions = {}): string {
  const width = opts.width ?? 760;
  const marks = ladderMarks(plan, pred);
  const lo = Math.floor(Math.log10(marks[0].k) - 0.15);
  const hi = Math.ceil(Math.log10(marks[marks.length - 1].k) + 0.15);
  const left = 30;
  const right = width - 30;
  const x = (k: number) => left + ((Math.log10(k) - lo) / (hi - lo)) * (right - left);
  // Labels stand upright above the axis, one per mark; where marks crowd, labels are spread at least
  // `gap` px apart and a leader runs from each mark's line to its label.
  const gap = 13;
  const cxs = marks.map((m) => x(m.k));
  const pos = cxs.slice();
  for (let i = 1; i < pos.length; i++) pos[i] = Math.max(pos[i], pos[i - 1] + gap);
  pos[pos.length - 1] = Math.min(pos[pos.length - 1], width - 8);
  for (let i = pos.length - 2; i >= 0; i--) pos[i] = Math.min(pos[i], pos[i + 1] - gap);
  for (let i = 0; i < pos.length; i++) pos[i] = Math.max(pos[i], 8 + i * gap);
  const texts = marks.map((m) => `${m.symbol} ${m.label}`);
  const labelH = 6.3 * Math.max(...texts.map((t) => t.length));
  const top = 48;
  const axisY = top + labelH + 40;
  const height = axisY + 46;
  const unit = unitLabel('wavenumber', plan.units);
  const R = pred.R_beta.value;
  const title = `Scale ladder — regime: ${pred.regime.text} (R_β = ${fmt(R, 3)})`;
  const regime = REGIME_LABELS[pred.regime.text];
  const parts: string[] = [];
  const ns = opts.standalone === false ? '' : ' xmlns="http://www.w3.org/2000/svg"';
  parts.push(
    `<svg${ns} viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" role="img" aria-label="${escapeXml(`${title}: ${regime}`)}" font-family="sans-serif" font-size="11">`,
  );
  parts.push(`<title>${escapeXml(`${title}: ${regime}`)}</title>`);
  parts.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`);
  parts.push(`<text x="${left}" y="20" font-size="13" font-weight="bold">${escapeXml(title)}</text>`);
  parts.push(
    `<text x="${left}" y="38" fill="#555555">${escapeXml(`wavenumber k (${unit}), logarithmic; a length L sits at k = 2π/L`)}</text>`,
  );
  const kRh = marks.find((m) => m.id === 'rhines');
  const kB = marks.find((m) => m.id === 'kBeta');
  if (kRh && kB && kRh.k < kB.k) {
    parts.push(
      `<rect x="${n(x(kRh.k))}" y="${axisY - 10}" width="${n(x(kB.k) - x(kRh.k))}" height="20" fill="#1f5fa8" fill-opacity="0.12"><title>anisotropic (zonostrophic) range</title></rect>`,
    );
  }
  const f0 = plan.kf - plan.dkf;
  if (f0 > 0)
    parts.push(
      `<rect x="${n(x(f0))}" y="${axisY - 10}" width="${n(Math.max(1, x(plan.kf + plan.dkf) - x(f0)))}" height="20" fill="#c0392b" fill-opacity="0.25"/>`,
    );
  parts.push(`<line x1="${left}" y1="${axisY}" x2="${right}" y2="${axisY}" stroke="#000000"/>`);
  for (let d = lo; d <= hi; d++) {
    const xd = n(x(Math.pow(10, d)));
    parts.push(`<line x1="${xd}" y1="${axisY}" x2="${xd}" y2="${axisY + 6}" stroke="#000000"/>`);
    parts.push(`<text x="${xd}" y="${axisY + 20}" text-anchor="middle">${escapeXml(`1e${d}`)}</text>`);
  }
  marks.forEach((m, i) => {
    const c = COLOURS[m.kind];
    const dash = m.kind === 'domain' || m.kind === 'grid' ? 'none' : '3 2';
    const bend = axisY - 22;
    const foot = axisY - 34;
    parts.push(
      `<polyline points="${n(cxs[i])},${axisY + 10} ${n(cxs[i])},${bend} ${n(pos[i])},${foot}" fill="none" stroke="${c}" stroke-dasharray="${dash}"/>`,
    );
    parts.push(
      `<text x="${n(pos[i] + 4)}" y="${foot - 3}" fill="${c}" transform="rotate(-90 ${n(pos[i] + 4)} ${foot - 3})">${escapeXml(texts[i])}<title>${escapeXml(`${m.label}: ${m.symbol} = ${fmt(m.k)} ${unit}`)}</title></text>`,
    );
  });
  parts.push(
    `<text x="${left}" y="${height - 8}" fill="#555555">${escapeXml('shaded: Rhines to k_β (anisotropic range, blue); forcing annulus (red)')}</text>`,
  );
  parts.push('</svg>');
  return parts.join('\n');
}

function n(v: number): string {
  return Number(v.toFixed(2)).toString();
}
