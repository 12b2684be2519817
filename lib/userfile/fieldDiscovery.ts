import { coordinateAxis, type CoordinateAxis } from './coordinateAxis';
import { isNumericType, type DatasetReader, type DatasetVariable } from '../io/datasetReader';
import {
  hintOf,
  horizontal,
  levelAxis,
  recordAxis,
  striaPeriods,
  type LevelAxis,
  type LevelChoice,
  type RecordAxis,
} from './fieldAxes';
import {
  FIELD_ROLES,
  GRID_ROLES,
  matchRole,
  ROLE_LABELS,
  roleUnits,
  type FieldRole,
  type MatchHow,
} from './fieldNames';
import { printable } from '../io/fileErrors';

export type { LevelAxis, LevelChoice, RecordAxis };

/**
 * Finds what Stria can analyse in a user's file: velocity components u, v, relative vorticity ζ,
 * streamfunction ψ or QG PV q on a regular x/y or longitude/latitude grid, or the zonal-mean zonal
 * velocity ū on (time, latitude/y), with the eddy profiles u′v′, v′q′ and EKE stored beside it (a
 * zonal-mean file such as Stria's own). Fields are recognised as fieldNames.ts says, or named by the user
 * (`map`: { u: 'U', v: 'V' }), and must share one grid: horizontal dimensions last (y then x, or x
 * then y), before them at most one dimension longer than 1 (the records: usually time) besides a
 * layer or vertical dimension (fieldAxes.ts levelAxis: one layer or the depth-weighted mean is
 * analysed), and any number of length 1 (a single level). Irregular axes are refused (coordinateAxis.ts).
 */
export type FieldMapping = Partial<Record<FieldRole, string>>;

export interface FoundField {
  role: FieldRole;
  variable: string;
  how: MatchHow;
  /** How it was recognised, in words. */
  detail: string;
  /** Units as the file gives them, and the factor to SI (1 for model units or unrecognised units). */
  units: string | null;
  factor: number;
}

export interface Discovery {
  layout: 'gridded' | 'zonal-mean';
  fields: Partial<Record<FieldRole, FoundField>>;
  /** Null for the zonal-mean layout. */
  x: CoordinateAxis | null;
  y: CoordinateAxis;
  /** The fields' dimension order: 'yx' when x varies fastest, 'xy' when y does. */
  order: 'yx' | 'xy';
  /** Dimension names of every field, slowest first. */
  dimensions: string[];
  records: RecordAxis;
  /** The layer or vertical dimension and the level analysed (null: the fields have none longer than 1). */
  level: LevelAxis | null;
  notes: string[];
}

export interface DiscoveryOptions {
  map?: FieldMapping;
  /** Tolerance of the regular-spacing check (fraction of the spacing). */
  tolerance?: number;
  /** Domain lengths in the axes' units: the period for the periodicity check, and positions for an axis without coordinate. */
  domain?: { x?: number; y?: number };
  /** The layer to analyse (from 1) or 'mean' (depth-weighted), when the fields have a layer dimension; default 'mean'. */
  layer?: LevelChoice;
}

export function discoverFields(reader: DatasetReader, options: DiscoveryOptions = {}): Discovery {
  const notes: string[] = [];
  const chosen = chooseFields(reader, options.map ?? {}, notes);
  // Which of the chosen fields are grids and which are meridional profiles.
  const grids: [FieldRole, DatasetVariable][] = [];
  let profile: [FieldRole, DatasetVariable] | null = null;
  // Eddy profiles stored beside ū (a zonal-mean file): read with it, as their own roles.
  const eddyProfiles: [FieldRole, DatasetVariable][] = [];
  for (const role of FIELD_ROLES) {
    const v = chosen[role];
    if (!v) continue;
    const shape = horizontal(reader, v);
    const gridRole = GRID_ROLES.includes(role);
    if (shape === 'grid' && gridRole) grids.push([role, v]);
    else if (shape === 'profile' && (role === 'ubar' || role === 'u')) profile ??= [role, v];
    else if (shape === 'profile' && !gridRole) eddyProfiles.push([role, v]);
    else
      notes.push(
        `"${v.name}" (${ROLE_LABELS[role]}) is left out: its dimensions (${v.dimensions.join(', ')}) are not ${gridRole ? '(…, y, x)' : '(time, y)'}`,
      );
  }
  const layout = grids.length ? 'gridded' : profile ? 'zonal-mean' : null;
  if (!layout) {
    throw new RangeError(
      `missing variables: no field to analyse — found no ${FIELD_ROLES.map((r) => ROLE_LABELS[r]).join(', ')} by CF standard_name or by name. ` +
        `The file has ${reader.variables.map((v) => `"${v.name}" (${v.dimensions.join(', ')})`).join(', ') || 'no variables'}; name the fields with --map, e.g. --map u=U,v=V` +
        (notes.length ? `. ${notes.join('; ')}` : ''),
    );
  }
  const lead = layout === 'gridded' ? grids[0][1] : (profile as [FieldRole, DatasetVariable])[1];
  const fields: Partial<Record<FieldRole, FoundField>> = {};
  // `matched` is the role the variable was found as (a u on (time, y) serves as ū).
  const take = (role: FieldRole, v: DatasetVariable, matched: FieldRole) => {
    if (v.dimensions.join() !== lead.dimensions.join()) {
      notes.push(
        `"${v.name}" is left out: it is on dimensions (${v.dimensions.join(', ')}), not those of "${lead.name}" (${lead.dimensions.join(', ')}); Stria needs every field on one grid`,
      );
      return;
    }
    fields[role] = found(role, v, chosen.how[matched] as { how: MatchHow; detail: string }, notes);
  };
  if (layout === 'gridded') for (const [role, v] of grids) take(role, v, role);
  else {
    take('ubar', (profile as [FieldRole, DatasetVariable])[1], (profile as [FieldRole, DatasetVariable])[0]);
    for (const [role, v] of eddyProfiles) take(role, v, role);
  }
  if (layout === 'gridded')
    for (const [, v] of profile ? [profile, ...eddyProfiles] : eddyProfiles)
      notes.push(`"${v.name}" (a zonal-mean profile) is not used: the gridded fields give the zonal means`);

  const dims = lead.dimensions;
  const nh = layout === 'gridded' ? 2 : 1;
  const hdims = dims.slice(-nh);
  let order: 'yx' | 'xy' = 'yx';
  if (nh === 2) {
    const [a, b] = hdims.map((d) => hintOf(reader, d));
    if (a === 'x' && b === 'y') order = 'xy';
    else if (!(a === 'y' && b === 'x'))
      notes.push(`the axes of "${lead.name}" are not marked as x and y: taken in the CF order (y, x)`);
  }
  const level = levelAxis(reader, lead, dims.slice(0, -nh), options.layer, notes);
  const records = recordAxis(reader, lead, dims.slice(0, -nh), level?.dimension);
  if (level && records.dimension !== null && dims.indexOf(level.dimension) < dims.indexOf(records.dimension))
    throw new RangeError(
      `the layer dimension "${level.dimension}" comes before the record dimension "${records.dimension}" in "${lead.name}" (${dims.join(', ')}): Stria reads (records, layers, …)`,
    );
  const periods = striaPeriods(reader);
  const ydim = nh === 2 ? (order === 'yx' ? hdims[0] : hdims[1]) : hdims[0];
  const y = coordinateAxis(reader, ydim, 'y', {
    tolerance: options.tolerance,
    length: options.domain?.y,
    filePeriod: periods.y,
  });
  const x =
    nh === 2
      ? coordinateAxis(reader, order === 'yx' ? hdims[1] : hdims[0], 'x', {
          tolerance: options.tolerance,
          length: options.domain?.x,
          filePeriod: periods.x,
        })
      : null;
  return { layout, fields, x, y, order, dimensions: dims.slice(), records, level, notes };
}

/** The variable for each role: the user's mapping, else the best match in the file. */
function chooseFields(reader: DatasetReader, map: FieldMapping, notes: string[]) {
  const out: Partial<Record<FieldRole, DatasetVariable>> & {
    how: Partial<Record<FieldRole, { how: MatchHow; detail: string }>>;
  } = { how: {} };
  for (const [role, name] of Object.entries(map) as [FieldRole, string][]) {
    if (!FIELD_ROLES.includes(role))
      throw new RangeError(`--map: "${role}" is not a field Stria reads (it reads ${FIELD_ROLES.join(', ')})`);
    if (!reader.has(name))
      throw new RangeError(
        `missing variable: the mapping names "${name}" for ${role}, but the file has ${reader.variables.map((v) => `"${v.name}"`).join(', ')}`,
      );
    const v = reader.variable(name);
    if (!isNumericType(v.type))
      throw new RangeError(`the mapping names "${name}" for ${role}, but it holds ${v.type}, not numbers`);
    out[role] = v;
    out.how[role] = { how: 'mapping', detail: `the mapping ${role}=${name}` };
  }
  const taken = new Set(Object.values(map));
  for (const role of FIELD_ROLES) {
    if (out[role]) continue;
    const matches = reader.variables
      .filter((v) => isNumericType(v.type) && !taken.has(v.name) && v.shape.length >= 1)
      .map((v) => ({ v, m: matchRole(v, role, notes) }))
      .filter((c): c is { v: DatasetVariable; m: { how: MatchHow; detail: string } } => c.m !== null)
      .sort((a, b) => Number(b.m.how === 'standard_name') - Number(a.m.how === 'standard_name'));
    if (!matches.length) continue;
    out[role] = matches[0].v;
    out.how[role] = matches[0].m;
    taken.add(matches[0].v.name);
    if (matches.length > 1)
      notes.push(
        `${ROLE_LABELS[role]}: took "${matches[0].v.name}" (by ${matches[0].m.detail}) of ${matches.map((c) => `"${c.v.name}"`).join(', ')}; choose another with --map ${role}=NAME`,
      );
  }
  return out;
}

function found(role: FieldRole, v: DatasetVariable, m: { how: MatchHow; detail: string }, notes: string[]): FoundField {
  const units = typeof v.attributes.units === 'string' ? v.attributes.units : null;
  const reading = roleUnits(role, units ?? undefined);
  if (reading.kind === 'unknown')
    notes.push(
      `"${v.name}": units "${printable(units ?? '')}" not recognised for ${ROLE_LABELS[role]}; its values are taken as they are`,
    );
  return {
    role,
    variable: v.name,
    how: m.how,
    detail: m.detail,
    units,
    factor: reading.kind === 'si' ? reading.factor : 1,
  };
}
