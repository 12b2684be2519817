import { regimeLabel } from './predictions';
import { RATIO_LABELS } from './matchedRun';
import { rhinesLabel } from './rhinesLabels';
import { PLAN_FIELD_QUANTITIES } from './quantityInput';
import type { PlanAnalysis } from './analysePlan';
import type { PlanCheck } from './checks';
import { bytes, duration, fmt, unitLabel, withUnit } from './format';
import { planModelParams } from './units';
import { renderHtml, renderMarkdown, type Block } from './reportDocument';
import { ladderMarks, scaleLadderSvg } from './scaleLadderSvg';
import type { UnitSystem } from './planInput';

/**
 * The printable plan report, for a compute proposal: every input as entered and as derived, every
 * prediction with its formula and source, every check with its numbers and fix, the cost, the
 * matched cheap run, and the scale ladder. `planReportMarkdown` and `planReportHtml` render the same
 * blocks; the HTML is one self-contained page with the ladder as inline SVG.
 */
export function planReportBlocks(a: PlanAnalysis): Block[] {
  const { plan, predictions: p } = a;
  const u = plan.units;
  const title = reportTitle(a);
  const counts = (cs: PlanCheck[]) =>
    ['error', 'warning', 'ok'].map((s) => `${cs.filter((c) => c.severity === s).length} ${s}`).join(', ');
  const blocks: Block[] = [
    { type: 'heading', level: 1, text: title },
    {
      type: 'paragraph',
      text: `Regime: ${regimeLabel(p)}. Expected jets in the domain: ${fmt(p.jetsRhines.value, 3)} (Rhines spacing ${rhinesLabel(plan.input.rhines)}) to ${fmt(p.jetsStaircase.value, 3)} (staircase spacing). Checks: ${counts(a.checks)}. Units: ${u === 'physical' ? 'SI (m, s)' : 'model units'}.`,
    },
    { type: 'heading', level: 2, text: 'Inputs as entered' },
    {
      type: 'table',
      head: ['field', 'value', 'unit'],
      rows: flatten(plan.input).map(([k, v]) => [k, enteredText(k, v, plan.input), inputUnit(k, u, plan.order)]),
    },
    { type: 'heading', level: 2, text: 'Inputs as derived' },
    {
      type: 'table',
      head: ['quantity', 'value'],
      rows: [
        ['β', `${fmt(plan.beta)} ${betaUnit(u)}`],
        ['f', plan.f === null ? 'not given' : withUnit(plan.f, 'rate', u)],
        ['deformation radius L_d', Number.isFinite(plan.Ld) ? withUnit(plan.Ld, 'length', u) : 'none (barotropic)'],
        ['energy injection rate ε', `${fmt(plan.eps)} ${injectionUnit(u)}`],
        ['linear drag μ', withUnit(plan.mu, 'rate', u)],
        ['forcing k_f ± δk', `${fmt(plan.kf)} ± ${fmt(plan.dkf)} ${unitLabel('wavenumber', u)}`],
        ['grid nx × ny', `${plan.nx} × ${plan.ny}`],
        ['spacing dx, dy', `${withUnit(plan.dx, 'length', u)}, ${withUnit(plan.dy, 'length', u)}`],
        ['largest kept wavenumber k_max (2/3 rule)', withUnit(plan.kMax, 'wavenumber', u)],
        [`hyperviscosity ν (order p = ${plan.order})`, `${fmt(plan.nu)} ${hyperUnit(u, plan.order)}`],
        [
          'run length',
          withUnit(plan.runLength, 'time', u) + (u === 'physical' ? ` (${duration(plan.runLength)})` : ''),
        ],
      ],
    },
    { type: 'list', items: plan.derivations },
    ...scalingBlocks(a),
    { type: 'heading', level: 2, text: 'Predictions' },
    {
      type: 'table',
      head: ['prediction', 'symbol', 'value', 'formula', 'source'],
      rows: Object.values(p).map((q) => [
        q.label,
        q.symbol,
        q.text ? `${q.text} (R_β = ${fmt(q.value)})` : withUnit(q.value, q.quantity, u),
        q.formula,
        q.reference,
      ]),
    },
    ...baroclinicBlocks(a),
    { type: 'heading', level: 2, text: 'Checks' },
    {
      type: 'table',
      head: ['verdict', 'check', 'finding', 'numbers', 'threshold', 'fix', 'source'],
      rows: a.checks.map((c) => checkRow(c, u)),
    },
    ...costBlocks(a),
    ...matchedBlocks(a),
    { type: 'heading', level: 2, text: 'Scale ladder' },
    {
      type: 'figure',
      svg: scaleLadderSvg(plan, p),
      caption: `Every wavenumber of the plan on one logarithmic axis (${unitLabel('wavenumber', u)}); regime: ${p.regime.text}.`,
    },
    {
      type: 'table',
      head: ['mark', 'meaning', 'k', 'length 2π/k'],
      rows: ladderMarks(plan, p).map((m) => [
        m.symbol,
        m.label,
        withUnit(m.k, 'wavenumber', u),
        withUnit((2 * Math.PI) / m.k, 'length', u),
      ]),
    },
  ];
  return blocks;
}

/** The report as Markdown. */
export function planReportMarkdown(a: PlanAnalysis): string {
  return renderMarkdown(planReportBlocks(a));
}

/** The report as one self-contained HTML page (no scripts, no external requests). */
export function planReportHtml(a: PlanAnalysis): string {
  return renderHtml(reportTitle(a), planReportBlocks(a));
}

function reportTitle(a: PlanAnalysis): string {
  return `Stria plan: ${a.plan.input.title ?? 'untitled'}`;
}

function checkRow(c: PlanCheck, u: UnitSystem): string[] {
  return [
    c.severity,
    c.title,
    c.message,
    c.numbers.map((x) => `${x.label} = ${withUnit(x.value, x.quantity, u)}`).join('; '),
    c.threshold,
    c.fix ?? '—',
    c.reference,
  ];
}

function scalingBlocks(a: PlanAnalysis): Block[] {
  const { plan, scaling, predictions: p } = a;
  if (plan.units === 'model')
    return [
      { type: 'heading', level: 2, text: 'Units' },
      { type: 'paragraph', text: 'The plan is in model units; no scaling applies.' },
    ];
  const mp = planModelParams(plan, p.dtCFL.value / scaling.time, scaling);
  return [
    { type: 'heading', level: 2, text: 'Model units' },
    {
      type: 'paragraph',
      text: `Length unit ℓ = Lx/2π = ${fmt(scaling.length)} m (the domain is 2π long in x); time unit t = ℓ/U = ${fmt(scaling.time)} s (${duration(scaling.time)}), so the rms velocity is 1. The planned run in model units:`,
    },
    {
      type: 'table',
      head: ['parameter', 'model value'],
      rows: Object.entries(mp).map(([k, v]) => [k, typeof v === 'number' ? fmt(v, 6) : String(v)]),
    },
  ];
}

function costBlocks(a: PlanAnalysis): Block[] {
  const c = a.cost;
  const ref = c.reference;
  return [
    { type: 'heading', level: 2, text: 'Cost with Stria’s model' },
    {
      type: 'table',
      head: ['quantity', 'value'],
      rows: [
        ['memory', `${bytes(c.memory.totalBytes)} (${fmt(c.memory.bytesPerPoint, 4)} bytes per grid point)`],
        ['work per step', `${fmt(c.flopsPerStep)} flops (FFTs, 5 n log₂ n per complex FFT)`],
        ['time per step', duration(c.secondsPerStep)],
        ['steps', String(c.steps)],
        ['wall time', duration(c.wallSeconds)],
        ['machine', `speed factor ${fmt(c.speed)} relative to the measuring machine`],
      ],
    },
    {
      type: 'paragraph',
      text: `Step time scaled as N² log N from ${fmt(ref.ms_per_step)} ms per step at ${ref.n} × ${ref.n}, measured ${ref.measured_on} (${ref.how}).`,
    },
    {
      type: 'table',
      head: ['owner', 'array', 'elements', 'bytes'],
      rows: c.memory.arrays.map((x) => [x.owner, x.name, String(x.elements), bytes(x.bytes)]),
    },
  ];
}

function matchedBlocks(a: PlanAnalysis): Block[] {
  const m = a.matched;
  if (!m)
    return [
      { type: 'heading', level: 2, text: 'Matched cheap run' },
      { type: 'paragraph', text: `No matched run: ${a.matchedError ?? 'unknown reason'}` },
    ];
  const worst = a.matchedChecks.filter((c) => c.severity !== 'ok');
  return [
    { type: 'heading', level: 2, text: 'Matched cheap run' },
    {
      type: 'paragraph',
      text: `${m.params.nx} × ${m.params.ny} grid, ${m.cost.steps} steps, about ${duration(m.cost.wallSeconds)} here (target ${duration(m.targetWallSeconds)}${m.withinTarget ? '' : ', exceeded'}). ${m.gives === 'none' ? 'Every ratio is kept.' : `The ratio that gave last: ${RATIO_LABELS[m.gives]}.`}`,
    },
    {
      type: 'table',
      head: ['ratio', 'planned', 'matched', 'kept', 'why'],
      rows: m.ratios.map((r) => [
        r.label,
        fmt(r.planned),
        fmt(r.matched),
        r.kept ? 'exactly' : 'compromised',
        r.why || '—',
      ]),
    },
    ...(m.notes.length ? [{ type: 'list' as const, items: m.notes }] : []),
    { type: 'heading', level: 3, text: 'Its model parameters' },
    {
      type: 'table',
      head: ['parameter', 'value'],
      rows: Object.entries(m.params).map(([k, v]) => [k, typeof v === 'number' ? fmt(v, 6) : String(v)]),
    },
    { type: 'heading', level: 3, text: 'Its checks' },
    worst.length
      ? {
          type: 'table',
          head: ['verdict', 'check', 'finding', 'numbers', 'threshold', 'fix', 'source'],
          rows: worst.map((c) => checkRow(c, 'model')),
        }
      : { type: 'paragraph', text: 'Every check passes.' },
  ];
}

/** [dotted path, value text] for every leaf of the input. */
function flatten(x: unknown, prefix = ''): Array<[string, string]> {
  if (typeof x !== 'object' || x === null) return [[prefix, String(x)]];
  return Object.entries(x as Record<string, unknown>).flatMap(([k, v]) =>
    typeof v === 'object' && v !== null
      ? flatten(v, `${prefix}${k}.`)
      : [[`${prefix}${k}`, typeof v === 'number' ? fmt(v, 8) : String(v)] as [string, string]],
  );
}

function inputUnit(path: string, u: UnitSystem, order: number): string {
  const leaf = path.split('.').pop() ?? '';
  switch (leaf) {
    case 'latitudeDeg':
      return '° (planetocentric)';
    case 'beta':
      return betaUnit(u);
    case 'f':
      return unitLabel('rate', u);
    case 'Ld':
    case 'H':
    case 'wavelength':
    case 'Lx':
    case 'Ly':
    case 'dx':
    case 'dy':
      return unitLabel('length', u);
    case 'gPrime':
      return u === 'physical' ? 'm/s²' : 'model length/time²';
    case 'eps':
      return injectionUnit(u);
    case 'U':
      return unitLabel('velocity', u);
    case 'dragTime':
    case 'gridDampingTime':
    case 'runLength':
      return unitLabel('time', u);
    case 'halfWidth':
      return 'fraction of k_f';
    case 'order':
      return `(ν in ${hyperUnit(u, order)})`;
    default:
      return '';
  }
}

const betaUnit = (u: UnitSystem) => (u === 'physical' ? '1/(m·s)' : '1/(model length·time)');
const injectionUnit = (u: UnitSystem) => (u === 'physical' ? 'm²/s³ (W/kg)' : 'model length²/time³');
const hyperUnit = (u: UnitSystem, p: number) => (u === 'physical' ? `m^${2 * p}/s` : `model length^${2 * p}/time`);

/** An input as entered, with the readable form beside it: a physical length or time, a Rhines convention. */
function enteredText(path: string, text: string, input: PlanAnalysis['plan']['input']): string {
  if (path === 'rhines') return `${text} (${rhinesLabel(input.rhines)})`;
  const q = Object.hasOwn(PLAN_FIELD_QUANTITIES, path) ? PLAN_FIELD_QUANTITIES[path] : null;
  const x = Number(text);
  if (input.units !== 'physical' || (q !== 'length' && q !== 'time') || !Number.isFinite(x)) return text;
  const readable = withUnit(x, q, 'physical');
  return readable.startsWith(`${text} `) ? text : `${text} (${readable})`;
}

/** The baroclinic drive's predictions and matched two-layer run (baroclinicPlan.ts); none for a stirred plan. */
function baroclinicBlocks(a: PlanAnalysis): Block[] {
  const b = a.baroclinic;
  if (!b) return [];
  const u = a.plan.units;
  const blocks: Block[] = [
    { type: 'heading', level: 2, text: 'Baroclinic drive (two layers, imposed shear)' },
    {
      type: 'paragraph',
      text: `Shear U₁ − U₂ = ${withUnit(b.shear, 'velocity', u)}, depth ratio δ = H₁/H₂ = ${fmt(b.depthRatio)}, drag on the lower layer. The one-layer predictions above take U as Held & Larichev's eddy velocity; those of the forcing do not apply (no stirring).`,
    },
    {
      type: 'table',
      head: ['prediction', 'symbol', 'value', 'formula', 'source'],
      rows: b.predictions.map((q) => [
        q.label,
        q.symbol,
        q.text ? `${q.text} (ξ = ${fmt(q.value)})` : withUnit(q.value, q.quantity, u),
        q.formula,
        q.reference,
      ]),
    },
  ];
  const m = b.matched;
  blocks.push({ type: 'heading', level: 3, text: 'Matched two-layer run' });
  if (!m) blocks.push({ type: 'paragraph', text: `None: ${b.matchedError}` });
  else {
    blocks.push(
      {
        type: 'paragraph',
        text: `${m.params.nx} × ${m.params.ny}, model units (Lx = 2π, U = (U₁ − U₂)/2 = 1), shear ${fmt(m.params.shear)}, k_d ${fmt(m.params.kd)}, β ${fmt(m.params.beta)}, μ ${fmt(m.params.mu)}, run length ${fmt(m.runLength)}: ${m.cost.steps} steps, about ${duration(m.cost.wallSeconds)}.`,
      },
      {
        type: 'table',
        head: ['ratio', 'planned', 'matched', 'kept'],
        rows: m.kept.map((k) => [k.label, fmt(k.planned), fmt(k.matched), k.kept ? 'yes' : 'no']),
      },
    );
    if (m.notes.length) blocks.push({ type: 'list', items: m.notes });
  }
  return blocks;
}
