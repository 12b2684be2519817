import type { AnalyzeFileOptions } from '../lib/userfile/analyzeFile';
import { FIELD_ROLES, type FieldRole } from '../lib/userfile/fieldNames';
import { RHINES_DEFINITIONS, type RhinesConvention } from '../lib/analysis/scales';
import { PLANETS, type PlanetId } from '../lib/plan/planets';
import { parseNumber, UsageError, type OptionSpec } from './args';
import { DEFAULT_MEMORY_BUDGET, parseByteSize } from './byteSize';

/**
 * The options of `stria analyze`, declared once (help, parsing and messages come from here), and
 * their translation into lib/userfile/analyzeFile.ts options; a mistake is a UsageError naming the option.
 */
export const ANALYZE_OPTIONS: readonly OptionSpec[] = [
  {
    name: 'map',
    kind: 'text',
    value: 'ROLE=NAME,…',
    help: `name the fields yourself: roles ${FIELD_ROLES.join(', ')} (e.g. u=U,v=V)`,
  },
  {
    name: 'beta',
    kind: 'number',
    value: 'B',
    help: "β in the file's units: 1/(m·s) for SI files (default: from --planet, or a Stria file's own)",
  },
  { name: 'kd', kind: 'number', value: 'K', help: 'deformation wavenumber k_d = 1/L_d (1/length; default 0)' },
  {
    name: 'eps',
    kind: 'number',
    value: 'E',
    help: 'energy injection rate ε (length²/time³), for R_β and the predictions',
  },
  { name: 'mu', kind: 'number', value: 'M', help: 'linear drag rate μ (1/time), for the predictions' },
  {
    name: 'planet',
    kind: 'text',
    value: 'NAME',
    help: `${Object.keys(PLANETS).join(' or ')}: map longitude/latitude onto the tangent plane\nand take β = 2Ω cos φ0/R at the central latitude`,
  },
  {
    name: 'lat0',
    kind: 'number',
    value: 'DEG',
    help: "central latitude φ0 of the tangent plane (default: the grid's centre)",
  },
  {
    name: 'lon0',
    kind: 'number',
    value: 'DEG',
    help: "central longitude λ0 of the tangent plane (default: the grid's centre)",
  },
  {
    name: 'records',
    kind: 'text',
    value: 'A:B',
    help: 'records A to B−1, from 0 (A: and :B and negative counts from the end\nwork: -20: is the last 20); time means are over these',
  },
  { name: 'json', kind: 'flag', help: 'print the result object as JSON' },
  { name: 'q-total', kind: 'flag', help: "the file's q is the total PV (βy included), not the anomaly" },
  {
    name: 'periodic',
    kind: 'text',
    value: 'AXES',
    help: 'which axes are periodic: xy, x, y or none (default: from the\ncoordinates, else from the data)',
  },
  {
    name: 'domain',
    kind: 'text',
    value: 'LX,LY',
    help: "domain lengths in the axes' units (periodicity; positions of axes\nwithout a coordinate variable)",
  },
  {
    name: 'tolerance',
    kind: 'number',
    value: 'F',
    help: 'regular-spacing tolerance, a fraction of the spacing (default 1e-3)',
  },
  {
    name: 'min-valid',
    kind: 'number',
    value: 'F',
    help: 'least fraction of valid points in a row, and of records in a\ntime mean (default 0.5)',
  },
  {
    name: 'rhines',
    kind: 'text',
    value: 'CONV',
    help: `Rhines-length convention: ${Object.keys(RHINES_DEFINITIONS).join(', ')} (default kR)`,
  },
  { name: 'no-spectra', kind: 'flag', help: 'skip spectra and spectral flux' },
  {
    name: 'layer',
    kind: 'text',
    value: 'N|mean',
    help: 'fields with a layer (or vertical) dimension: analyse layer N (from 1,\nthe first along it) or the depth-weighted mean (default mean); a two-layer\nfile gets its eddy heat flux reported',
  },
  {
    name: 'subsample',
    kind: 'count',
    value: 'K',
    help: 'read every K-th point in x and y (one row of the file at a time):\na large grid in a fraction of the memory',
  },
  {
    name: 'memory-budget',
    kind: 'text',
    value: 'SIZE',
    help: 'refuse, before reading, an analysis whose memory estimate exceeds SIZE,\ne.g. 512MiB, 8GiB (default 2GiB)',
  },
  { name: 'quiet', kind: 'flag', help: 'no progress on standard error' },
];

/** Parsed option values → analyzeFile options. */
export function toOptions(o: Record<string, unknown>): AnalyzeFileOptions {
  const out: AnalyzeFileOptions = {};
  for (const k of ['beta', 'kd', 'eps', 'mu', 'lat0', 'lon0', 'tolerance'] as const)
    if (o[k] !== undefined) out[k] = o[k] as number;
  if (o['min-valid'] !== undefined) out.minValidFraction = o['min-valid'] as number;
  if (o.map !== undefined) out.map = parseMap(o.map as string);
  if (o.planet !== undefined) {
    const p = (o.planet as string).toLowerCase();
    if (!(p in PLANETS))
      throw new UsageError(`--planet must be one of ${Object.keys(PLANETS).join(', ')}, got "${o.planet}"`);
    out.planet = p as PlanetId;
  }
  if ((o.lat0 !== undefined || o.lon0 !== undefined) && o.planet === undefined)
    throw new UsageError('--lat0 and --lon0 place the tangent plane of a planet: give --planet too');
  if (o.records !== undefined) out.records = o.records as string;
  if (o['q-total']) out.qIncludesBeta = true;
  if (o['no-spectra']) out.spectra = false;
  if (o.subsample !== undefined) out.subsample = o.subsample as number;
  if (o.layer !== undefined) {
    const text = (o.layer as string).trim().toLowerCase();
    const n = Number(text);
    if (text === 'mean') out.layer = 'mean';
    else if (/^[0-9]+$/.test(text) && n >= 1) out.layer = n;
    else throw new UsageError(`--layer must be a layer number from 1 or "mean", got "${o.layer}"`);
  }
  const budget = o['memory-budget'] as string | undefined;
  out.memoryBudget = budget === undefined ? DEFAULT_MEMORY_BUDGET : parseByteSize(budget);
  if (!Number.isFinite(out.memoryBudget))
    throw new UsageError(`--memory-budget ${budget}: needs a size such as 512MiB, 4GiB or 2000000000 (bytes)`);
  if (o.periodic !== undefined) {
    const p = (o.periodic as string).toLowerCase();
    if (!['xy', 'yx', 'x', 'y', 'none'].includes(p))
      throw new UsageError(`--periodic must be xy, x, y or none, got "${o.periodic}"`);
    out.periodic = { x: p.includes('x'), y: p.includes('y') };
  }
  if (o.domain !== undefined) {
    const parts = (o.domain as string).split(',').map((s) => parseNumber(s));
    if (parts.length !== 2 || !parts.every((x) => Number.isFinite(x) && x > 0))
      throw new UsageError(`--domain needs two positive lengths LX,LY, got "${o.domain}"`);
    out.domain = { x: parts[0], y: parts[1] };
  }
  if (o.rhines !== undefined) {
    if (!((o.rhines as string) in RHINES_DEFINITIONS))
      throw new UsageError(`--rhines must be one of ${Object.keys(RHINES_DEFINITIONS).join(', ')}, got "${o.rhines}"`);
    out.rhines = o.rhines as RhinesConvention;
  }
  return out;
}

/** "u=U,v=V" → { u: 'U', v: 'V' }; roles checked, names kept as written. */
export function parseMap(text: string): Partial<Record<FieldRole, string>> {
  const out: Partial<Record<FieldRole, string>> = {};
  for (const part of text.split(',')) {
    const m = /^\s*([a-z]+)\s*=\s*(.+?)\s*$/.exec(part);
    if (!m) throw new UsageError(`--map: "${part}" is not ROLE=NAME (e.g. u=U,v=V)`);
    const role = m[1] as FieldRole;
    if (!FIELD_ROLES.includes(role))
      throw new UsageError(`--map: "${m[1]}" is not a role (roles: ${FIELD_ROLES.join(', ')})`);
    if (out[role]) throw new UsageError(`--map names ${role} twice`);
    out[role] = m[2];
  }
  return out;
}
