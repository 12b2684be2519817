import { AllocationMeter } from '../io/allocationMeter';
import { analyzeUserRecords } from './gridAnalysis';
import type { UserAnalysis } from './summary';
import type { RhinesConvention } from '../analysis/scales';
import { measuredVsPredicted, type Comparison } from './measuredVsPredicted';
import { PLANETS, type PlanetId } from '../plan/planets';
import { tangentPlane } from '../plan/tangentPlane';
import type { ByteSource } from '../io/byteSource';
import { discoverFields, type FieldMapping, type LevelChoice } from './fieldDiscovery';
import { userHeatFlux, type UserHeatFlux } from './heatFlux';
import type { MaskCounts } from './fieldValues';
import { roleUnits, type FieldRole } from './fieldNames';
import { openDataset } from '../io/openDataset';
import { sniffFormat } from '../io/datasetReader';
import { formatBytes } from '../run/runMemory';
import { checkUserFileMemory, estimateUserFileMemory, type UserFileMemoryEstimate } from './userFileMemory';
import { parseRecordWindow } from './recordWindow';
import { userFieldSource } from './fieldSource';
import { striaParameters } from './striaParameters';
import { spectralSlopes, type SpectralSlope } from './spectralSlopes';
import { fileUnitLabels } from './unitLabels';

/**
 * A user's NetCDF file through Stria's diagnostics, end to end: open (NetCDF-3 or netCDF-4), find the
 * fields, read them record by record over a window, analyse, and put the measured values beside the
 * planner's predictions for the same parameters. Parameters (β, k_d, ε, μ), in the file's units:
 * the user's, else β from a planet at a central latitude (the tangent plane, SI), else those a
 * Stria-written file records (stria_* attributes, converted to the file's units); each with its source.
 */
export interface AnalyzeFileOptions {
  map?: FieldMapping;
  beta?: number;
  kd?: number;
  eps?: number;
  mu?: number;
  planet?: PlanetId;
  lat0?: number;
  lon0?: number;
  /** "a:b", see recordWindow.ts. */
  records?: string;
  qIncludesBeta?: boolean;
  minValidFraction?: number;
  periodic?: { x?: boolean; y?: boolean };
  domain?: { x?: number; y?: number };
  tolerance?: number;
  rhines?: RhinesConvention;
  spectra?: boolean;
  /**
   * Fields with a layer or vertical dimension (fieldAxes.ts levelAxis): the layer to analyse, from 1,
   * or 'mean' for the depth-weighted mean (the default).
   */
  layer?: LevelChoice;
  /** Read every K-th point in x and y (fieldSource.ts); default 1, every point. */
  subsample?: number;
  /**
   * Refuse, before anything is read, an analysis whose memory estimate (userFileMemory.ts) plus
   * `runtimeBytes` exceeds this many bytes; no check when absent.
   */
  memoryBudget?: number;
  runtimeBytes?: number;
  onProgress?: (p: { record: number; index: number; of: number; done: number; total: number }) => void;
  meter?: AllocationMeter;
}

export interface FileAnalysis {
  file: {
    format: string;
    layout: 'gridded' | 'zonal-mean';
    fields: Partial<Record<FieldRole, { variable: string; found: string; units: string | null }>>;
    records: number;
    notes: string[];
    /** What the analysis was estimated to take before anything was read. */
    memoryEstimate: UserFileMemoryEstimate;
  };
  masking: Partial<Record<FieldRole, MaskCounts & { masked: number; fraction: number }>>;
  parameters: Record<'beta' | 'kd' | 'eps' | 'mu', { value: number; source: string } | null>;
  plane: { lat0: number; lon0: number; radius: number; label: string } | null;
  analysis: UserAnalysis;
  comparison: Comparison;
  /** Slopes of the time-mean energy spectrum in its two cascade ranges (spectralSlopes.ts); [] without spectra. */
  spectralSlopes: SpectralSlope[];
  /** The layer dimension and what was analysed of it; null when the fields have none. */
  layers: {
    dimension: string;
    count: number;
    analysed: string;
    weights: number[];
    weightsSource: string;
  } | null;
  /** The eddy heat (interface) flux of a two-layer file (heatFlux.ts); null otherwise. */
  heatFlux: UserHeatFlux | null;
}

export function analyzeFile(source: ByteSource, options: AnalyzeFileOptions = {}): FileAnalysis {
  const meter = options.meter ?? new AllocationMeter();
  const budget = options.memoryBudget;
  const runtime = options.runtimeBytes ?? 0;
  // The netCDF-4 reader takes the whole file into memory: a file larger than the budget is refused first.
  const head = source.read(0, Math.min(8, source.byteLength)).slice();
  if (budget !== undefined && !source.inMemory && sniffFormat(head, source.byteLength) === 'hdf5')
    if (source.byteLength + runtime > budget)
      throw new RangeError(
        `this netCDF-4 file is ${formatBytes(source.byteLength)}, and the HDF5 reader holds it whole in memory: more than the memory budget of ${formatBytes(budget)}`,
      );
  const reader = openDataset(source, { meter });
  const d = discoverFields(reader, {
    map: options.map,
    tolerance: options.tolerance,
    domain: options.domain,
    layer: options.layer,
  });
  // From the dimensions alone, before a buffer of the grid's size exists.
  const memoryInput = {
    reader,
    discovery: d,
    fileBytes: source.inMemory || reader.format === 'netcdf4' ? source.byteLength : 0,
    subsample: options.subsample,
    kd: options.kd,
    spectra: options.spectra,
    periodic: options.periodic,
    runtimeBytes: runtime,
  };
  const memoryEstimate =
    budget !== undefined ? checkUserFileMemory(memoryInput, budget) : estimateUserFileMemory(memoryInput);
  const planet = options.planet ? PLANETS[options.planet] : null;
  if (options.planet && !planet)
    throw new RangeError(`unknown planet "${options.planet}" (known: ${Object.keys(PLANETS).join(', ')})`);
  const lonlat = d.y.kind === 'latitude';
  const fs = userFieldSource(reader, d, {
    meter,
    subsample: options.subsample,
    tangentPlane:
      planet && lonlat
        ? {
            radius: planet.radius,
            label: `${planet.name}: ${planet.sources.radius}`,
            lat0: options.lat0,
            lon0: options.lon0,
          }
        : undefined,
  });
  const stria = striaParameters(reader.attributes);
  const params: FileAnalysis['parameters'] = { beta: null, kd: null, eps: null, mu: null };
  for (const k of ['beta', 'kd', 'eps', 'mu'] as const) {
    if (options[k] !== undefined) params[k] = { value: options[k] as number, source: 'given' };
    else if (stria[k]) params[k] = stria[k];
  }
  if (planet && options.beta === undefined) {
    if (fs.grid.lengthUnit !== 'm')
      throw new RangeError(
        "a planet gives β in SI units (m⁻¹ s⁻¹), but this grid is in model units: give --beta in the file's units instead",
      );
    const lat0 = fs.plane?.lat0 ?? options.lat0;
    if (lat0 === undefined) throw new RangeError('β from a planet needs the central latitude (--lat0) on an x/y grid');
    params.beta = {
      value: tangentPlane(planet, lat0).beta,
      source: `β = 2Ω cos φ0/R for ${planet.name} at φ0 = ${lat0}° (${planet.sources.omega}; ${planet.sources.radius})`,
    };
  }
  const window = options.records
    ? parseRecordWindow(options.records, d.records.count)
    : { start: 0, end: d.records.count };
  const value = (k: keyof FileAnalysis['parameters']) => params[k]?.value;
  const analysis = analyzeUserRecords(fs, {
    beta: value('beta'),
    kd: value('kd'),
    eps: value('eps'),
    mu: value('mu'),
    qIncludesBeta: options.qIncludesBeta,
    records: window,
    minValidFraction: options.minValidFraction,
    rhines: options.rhines,
    periodic: options.periodic,
    spectra: options.spectra,
    onProgress: options.onProgress,
    meter,
  });
  const velocity = d.fields.u ?? d.fields.ubar ?? d.fields.v ?? null;
  const labels = fileUnitLabels(
    analysis.grid.lengthUnit,
    velocity ? roleUnits(velocity.role, velocity.units ?? undefined) : null,
  );
  let comparison: Comparison;
  try {
    comparison = measuredVsPredicted(
      analysis,
      { beta: value('beta'), eps: value('eps'), mu: value('mu'), kd: value('kd') },
      labels,
    );
  } catch (e) {
    comparison = {
      units: analysis.grid.lengthUnit === 'm' ? 'physical' : 'model',
      labels,
      rows: [],
      missing: `no planner predictions: ${(e as Error).message}`,
    };
  }
  const slopes =
    analysis.spectra && analysis.spectra.records > 0
      ? spectralSlopes(analysis.spectra, striaForcing(reader.attributes), analysis.scales.kRhines)
      : [];
  const heatFlux = userHeatFlux(reader, d, { records: window, subsample: options.subsample, meter });
  const masking: FileAnalysis['masking'] = {};
  for (const [role, c] of Object.entries(fs.masks) as [FieldRole, MaskCounts][]) {
    const masked = c.nonFinite + c.fill + c.outOfRange;
    masking[role] = { ...c, masked, fraction: c.total ? masked / c.total : 0 };
  }
  const fields: FileAnalysis['file']['fields'] = {};
  for (const [role, f] of Object.entries(d.fields))
    fields[role as FieldRole] = { variable: f.variable, found: f.detail, units: f.units };
  return {
    file: {
      format: reader.format,
      layout: d.layout,
      fields,
      records: d.records.count,
      notes: [...reader.notes, ...d.notes],
      memoryEstimate,
    },
    masking,
    parameters: params,
    plane: fs.plane,
    analysis,
    comparison,
    spectralSlopes: slopes,
    layers: d.level
      ? {
          dimension: d.level.dimension,
          count: d.level.count,
          analysed: d.level.index === null ? 'depth-weighted mean' : `layer ${d.level.index + 1}`,
          weights: Array.from(d.level.weights),
          weightsSource: d.level.weightsSource,
        }
      : null,
    heatFlux,
  };
}

/**
 * The forcing wavenumber a Stria-written file records (stria_kf, model units), in the file's units:
 * divided by stria_length_unit_m for a file in physical units. Null for other files.
 */
function striaForcing(attributes: Record<string, unknown>): number | null {
  const kf = attributes.stria_kf;
  if (typeof attributes.stria_file_kind !== 'string' || typeof kf !== 'number' || !(kf > 0)) return null;
  const l = attributes.stria_units === 'physical' ? attributes.stria_length_unit_m : 1;
  return typeof l === 'number' && l > 0 ? kf / l : null;
}
