import * as v from 'valibot';
import measured from './measuredStep.json';
import measuredTwoLayer from './measuredTwoLayerStep.json';

/**
 * What a run costs in Stria's own model: memory of its arrays, floating-point work per step, and
 * wall time from a measured step time.
 *
 * Memory, counted from lib/model for an nx × ny grid (S = ny·(nx/2 + 1) half-plane modes,
 * K = ⌊nx/3⌋ kept columns, C = 2(K + 1) packed block columns, M forced modes; Float64 unless noted):
 *   Stepper         state q̂, RK stage tendencies a, b, c, d, stage input w     6 × 2S
 *   LinearOperator  1/K², drag, hyper, large-scale and wave rates              5 × S
 *                   propagators e^{L dt/2}, e^{L dt}                           2 × 2S
 *                   kept mask (Uint8)                                          S bytes
 *   Grid            k², kx, ky                                                 S + nx/2 + 1 + ny
 *                   kept rows (Int32)                                          2⌊ny/3⌋ + 1
 *   RealTransform2D packed block, complex work grid                            2·ny·C + 2·nx·ny
 *                   row mask (Uint8)                                           ny bytes
 *                   row slab layout (Int32)                                    2·ny + 2
 *     y FFT         twiddles, scratch                                          2·ny + 2·ny·C
 *     x FFT         twiddles, scratch                                          2·nx + 2·nx·ny
 *   NonlinearTerm   the largest speeds |u|, |v|                                2
 *   Forcing         steady pattern, annulus lists (Int32 × 2), a draw pair     2S + 2M int32 + 2
 *   Model           a spectrum buffer for fields                               2S
 *   Stepper         the kick pair                                              2
 *                   slab range (Int32), stage layout (Int32; modeSlabs.ts)     2 + 2 + C, ny bytes
 * For large square grids this is ≈ 13 N + 4 N + 8/3 N doubles ≈ 157 bytes per grid point (N = nx·ny).
 *
 * Two layers (lib/model/twoLayer*.ts) keep the grid, the model's transform, the one-layer
 * LinearOperator (built by every Model), the forcing and the field buffer above, and in place of the
 * one-layer stepper and nonlinear term:
 *   TwoLayerStepper         state q̂₁, q̂₂ and RK stages a, b, c, d, w (both layers)     6 × 4S
 *                           the kick pair                                             2
 *   TwoLayerLinearOperator  1/K², 1/(K² + k_d²), hyper and large-scale rates          4 × S
 *                           2 × 2 propagators e^{L dt/2}, e^{L dt}                    2 × 8S
 *                           kept mask (Uint8), a rate scratch                         S bytes, 8
 *   TwoLayerNonlinearTerm   ψ̂₁, ψ̂₂                                                    2 × 2S
 *                           two RealTransform2D with their FFTs (as above)            2 × (one transform)
 *                           interface product grid, its x FFT work and twiddles       N + N + 2nx
 *                           its y FFT work and twiddles, its block                    ny·C + 2ny + ny·C
 *                           the −1 factors, the largest speeds                        S + 4
 * ≈ 440 bytes per grid point on large square grids.
 *
 * Work per step: the IF-RK4 step evaluates the nonlinear term 4 times, each one inverse and one
 * forward pair transform (two real fields as one complex 2D FFT over the kept columns): per
 * transform C complex FFTs of length ny and ny of length nx. A complex FFT of length n counts the
 * conventional 5 n log₂ n flops [practice], so
 *   flops/step = 4 · 2 · 5 · (C·ny·log₂ ny + ny·nx·log₂ nx) ≈ 66.7 n² log₂ n for n × n (C ≈ 2n/3).
 * Pointwise work (products, the RK combination) is O(N) and not counted.
 *
 * Wall time: t_step(nx, ny) = t_ref · (N log₂ N)/(N_ref log₂ N_ref) / speed, with t_ref measured at
 * N_ref = n_ref² by `npm run bench` (measuredStep.json) and `speed` the user's machine relative to
 * the one that measured it (2 = twice as fast).
 */

/** One array of the model and its size. */
export interface ArrayCount {
  owner: string;
  name: string;
  elements: number;
  bytesPerElement: number;
  bytes: number;
}

export interface MemoryEstimate {
  arrays: ArrayCount[];
  totalBytes: number;
  /** totalBytes / (nx·ny). */
  bytesPerPoint: number;
}

/**
 * Memory of a model on nx × ny with `forcedModes` independent modes on the forcing annulus
 * (`annulusModeCount`; the model reports the same number as `forcedModes`), of one layer or two.
 */
export function modelMemory(nx: number, ny: number, forcedModes: number, layers: 1 | 2 = 1): MemoryEstimate {
  const S = ny * (nx / 2 + 1);
  const C = 2 * (Math.floor(nx / 3) + 1);
  const N = nx * ny;
  const keptRows = 2 * Math.floor(ny / 3) + 1;
  const transform = (owner: string): Array<[string, string, number, number]> => [
    [owner, 'packed block', 2 * ny * C, 8],
    [owner, 'complex work grid', 2 * nx * ny, 8],
    [owner, 'row mask', ny, 1],
    [owner, 'row slab layout (offset, stride per row; run cuts)', 2 * ny + 2, 4],
    [owner, 'y FFT twiddles and scratch', 2 * ny + 2 * ny * C, 8],
    [owner, 'x FFT twiddles and scratch', 2 * nx + 2 * nx * ny, 8],
  ];
  const shared: Array<[string, string, number, number]> = [
    ['LinearOperator', 'rates 1/K², drag, hyper, large-scale, wave', 5 * S, 8],
    ['LinearOperator', 'propagators e^{L dt/2}, e^{L dt}', 2 * 2 * S, 8],
    ['LinearOperator', 'kept mask', S, 1],
    ['Grid', 'k², kx, ky', S + nx / 2 + 1 + ny, 8],
    ['Grid', 'kept rows', keptRows, 4],
    ['RealTransform2D', 'packed block', 2 * ny * C, 8],
    ['RealTransform2D', 'complex work grid', 2 * nx * ny, 8],
    ['RealTransform2D', 'row mask', ny, 1],
    ['RealTransform2D', 'row slab layout (offset, stride per row; run cuts)', 2 * ny + 2, 4],
    ['BatchFFT (y)', 'twiddles and scratch', 2 * ny + 2 * ny * C, 8],
    ['BatchFFT (x)', 'twiddles and scratch', 2 * nx + 2 * nx * ny, 8],
    ['Forcing', 'steady pattern and draw pair', 2 * S + 2, 8],
    ['Forcing', 'annulus modes and mirrors', 2 * forcedModes, 4],
    ['Model', 'field spectrum buffer', 2 * S, 8],
  ];
  const own: Array<[string, string, number, number]> =
    layers === 2
      ? [
          ['TwoLayerStepper', 'state q̂₁, q̂₂ and RK stages a, b, c, d, w', 6 * 4 * S, 8],
          ['TwoLayerStepper', 'kick pair', 2, 8],
          ['TwoLayerStepper', 'slab range of a member', 2, 4],
          ['TwoLayerStepper', 'phase arguments and the speed maxima of up to 64 threads', 2 + 4 * 64, 8],
          ['TwoLayerLinearOperator', 'rates 1/K², 1/(K² + k_d²), hyper, large-scale', 4 * S, 8],
          ['TwoLayerLinearOperator', '2 × 2 propagators e^{L dt/2}, e^{L dt}', 2 * 8 * S, 8],
          ['TwoLayerLinearOperator', 'kept mask', S, 1],
          ['TwoLayerLinearOperator', 'rate scratch', 8, 8],
          ['TwoLayerNonlinearTerm', 'ψ̂₁, ψ̂₂', 2 * 2 * S, 8],
          ...transform('TwoLayerNonlinearTerm (layer 1)'),
          ...transform('TwoLayerNonlinearTerm (layer 2)'),
          ['TwoLayerNonlinearTerm', 'interface product grid and its x FFT', 2 * N + 2 * nx, 8],
          ['TwoLayerNonlinearTerm', 'interface y FFT and block', 2 * ny * C + 2 * ny, 8],
          ['TwoLayerNonlinearTerm', '−1 factors, largest speeds', S + 4, 8],
        ]
      : [
          ['Stepper', 'state q̂ and RK stages a, b, c, d, w', 6 * 2 * S, 8],
          ['Stepper', 'kick pair', 2, 8],
          ['Stepper', 'slab range of a member', 2, 4],
          ['ModeSlabs', 'stage layout: origin, stride per slab; place, row step per column', 2 + C, 4],
          ['ModeSlabs', 'kept-row mask', ny, 1],
          ['Stepper', 'phase arguments and the speed maxima of up to 64 threads', 2 + 2 * 64, 8],
          ['NonlinearTerm', 'largest speeds |u|, |v|', 2, 8],
        ];
  const rows = [...own, ...shared];
  const arrays = rows.map(([owner, name, elements, b]) => ({
    owner,
    name,
    elements,
    bytesPerElement: b,
    bytes: elements * b,
  }));
  const totalBytes = arrays.reduce((s, a) => s + a.bytes, 0);
  return { arrays, totalBytes, bytesPerPoint: totalBytes / (nx * ny) };
}

/**
 * Independent forced modes of the annulus |k − k_f| ≤ δk, counted as lib/model/forcing.ts lists
 * them: kept modes (|ix| ≤ ⌊nx/3⌋, |m| ≤ ⌊ny/3⌋) with kx > 0, and kx = 0 with ky > 0 when the zonal
 * modes are forced. Any consistent length unit. Cost O(⌊nx/3⌋ + modes): per column only the rows
 * near the ring are tested, with the model's own test.
 */
export function annulusModeCount(p: {
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
  kf: number;
  dkf: number;
  force_zonal?: boolean;
}): number {
  const dkx = (2 * Math.PI) / p.Lx;
  const dky = (2 * Math.PI) / p.Ly;
  const Kx = Math.floor(p.nx / 3);
  const Ky = Math.floor(p.ny / 3);
  const zonal = p.force_zonal ?? true;
  const lo = Math.max(0, p.kf - p.dkf);
  const hi = p.kf + p.dkf;
  let count = 0;
  for (let i = 0; i <= Kx && i * dkx <= hi * (1 + 1e-12); i++) {
    const kx2 = (i * dkx) ** 2;
    const jLo = Math.sqrt(Math.max(0, lo * lo - kx2)) / dky;
    const jHi = Math.sqrt(Math.max(0, hi * hi - kx2)) / dky;
    for (let j = Math.max(0, Math.floor(jLo) - 1); j <= Math.min(Ky, Math.ceil(jHi) + 1); j++) {
      if (Math.abs(Math.hypot(i * dkx, j * dky) - p.kf) > p.dkf) continue;
      // Rows ±j; at kx = 0 only ky > 0 is independent, and only when the zonal modes are forced.
      if (i === 0) count += j > 0 && zonal ? 1 : 0;
      else count += j === 0 ? 1 : 2;
    }
  }
  return count;
}

/** Above this many expected annulus modes, `forcedModesForCost` estimates instead of counting. */
const COUNT_LIMIT = 2_000_000;

/**
 * The annulus mode count for a cost estimate: exact (`annulusModeCount`) while the ring is small
 * enough to count quickly, else its half-plane area 2π k_f δk/(dkx·dky). The lists cost 8 bytes a
 * mode, a small share of the total either way.
 */
export function forcedModesForCost(p: {
  nx: number;
  ny: number;
  Lx: number;
  Ly: number;
  kf: number;
  dkf: number;
}): number {
  const area = (2 * Math.PI * p.kf * p.dkf) / (((2 * Math.PI) / p.Lx) * ((2 * Math.PI) / p.Ly));
  return area > COUNT_LIMIT ? Math.round(area) : annulusModeCount(p);
}

/**
 * Nominal floating-point operations of one step on nx × ny (FFTs only, 5 n log₂ n per complex FFT):
 * 2 pair transforms an evaluation in one layer, 4.5 in two (docs/two-layer.md, section 5).
 */
export function flopsPerStep(nx: number, ny: number, layers: 1 | 2 = 1): number {
  const C = 2 * (Math.floor(nx / 3) + 1);
  const perTransform = 5 * (C * ny * Math.log2(ny) + ny * nx * Math.log2(nx));
  return 4 * (layers === 2 ? 4.5 : 2) * perTransform;
}

/** The reference step time, read from measuredStep.json and checked. */
export interface MeasuredStep {
  n: number;
  ms_per_step: number;
  measured_on: string;
  how: string;
}

const MeasuredStepSchema = v.object({
  format: v.literal('stria-measured-step'),
  version: v.literal(1),
  n: v.pipe(v.number(), v.integer(), v.minValue(2)),
  ms_per_step: v.pipe(
    v.number(),
    v.check((x) => Number.isFinite(x) && x > 0, 'a positive number of milliseconds'),
  ),
  measured_on: v.string(),
  how: v.string(),
});

/** Parse a measured-step record (the JSON the benchmark writes); throws naming the bad field. */
export function parseMeasuredStep(json: unknown): MeasuredStep {
  const r = v.safeParse(MeasuredStepSchema, json);
  if (!r.success) {
    const i = r.issues[0];
    throw new RangeError(
      `measured step time: ${i.path?.map((p) => String(p.key)).join('.') ?? '(record)'}: ${i.message}`,
    );
  }
  return r.output;
}

/** The figure this build of Stria was shipped with. */
export const MEASURED_STEP: Readonly<MeasuredStep> = Object.freeze(parseMeasuredStep(measured));

/**
 * What a two-layer step costs against a one-layer step on the same grid, measured
 * (measuredTwoLayerStep.json: the median of interleaved timings at 128² and 256²; docs/two-layer.md
 * section 8). The transform work alone is 2.25 one-layer steps (4.5 pair transforms an evaluation
 * against 2); the 2 × 2 stage updates, the inversion and the budget add the rest.
 */
export interface MeasuredRatio {
  ratio: number;
  grids: number[];
  measured_on: string;
  how: string;
}

const MeasuredRatioSchema = v.object({
  format: v.literal('stria-measured-step-ratio'),
  version: v.literal(1),
  ratio: v.pipe(
    v.number(),
    v.check((x) => Number.isFinite(x) && x >= 1, 'a ratio ≥ 1'),
  ),
  grids: v.array(v.pipe(v.number(), v.integer(), v.minValue(2))),
  measured_on: v.string(),
  how: v.string(),
});

/** Parse a measured step-ratio record; throws naming the bad field. */
export function parseMeasuredRatio(json: unknown): MeasuredRatio {
  const r = v.safeParse(MeasuredRatioSchema, json);
  if (!r.success) {
    const i = r.issues[0];
    throw new RangeError(
      `measured step ratio: ${i.path?.map((p) => String(p.key)).join('.') ?? '(record)'}: ${i.message}`,
    );
  }
  return r.output;
}

export const TWO_LAYER_STEP_RATIO: Readonly<MeasuredRatio> = Object.freeze(parseMeasuredRatio(measuredTwoLayer));

/**
 * Seconds per step on nx × ny: the reference time scaled as N log₂ N (N = nx·ny, i.e. n² log n for
 * square grids) and divided by `speed`, the machine's speed relative to the measuring one; two layers
 * cost TWO_LAYER_STEP_RATIO times that.
 */
export function stepSeconds(
  nx: number,
  ny: number,
  speed = 1,
  ref: MeasuredStep = MEASURED_STEP,
  layers: 1 | 2 = 1,
): number {
  if (!(speed > 0 && Number.isFinite(speed)))
    throw new RangeError(`machine-speed factor must be a finite number > 0, got ${speed}`);
  const N = nx * ny;
  const Nref = ref.n * ref.n;
  const one = ((ref.ms_per_step / 1000) * (N * Math.log2(N))) / (Nref * Math.log2(Nref)) / speed;
  return layers === 2 ? one * TWO_LAYER_STEP_RATIO.ratio : one;
}

/** The cost of a run of `steps` steps on nx × ny. */
export interface RunCost {
  memory: MemoryEstimate;
  flopsPerStep: number;
  steps: number;
  secondsPerStep: number;
  wallSeconds: number;
  speed: number;
  reference: MeasuredStep;
  /** 1 or 2; with two, the measured ratio the step time was multiplied by. */
  layers: 1 | 2;
  layerRatio: number;
}

/** Memory, work and wall time of `steps` steps on nx × ny with `forcedModes` annulus modes. */
export function runCost(
  nx: number,
  ny: number,
  steps: number,
  forcedModes: number,
  speed = 1,
  ref: MeasuredStep = MEASURED_STEP,
  layers: 1 | 2 = 1,
): RunCost {
  const secondsPerStep = stepSeconds(nx, ny, speed, ref, layers);
  return {
    layers,
    layerRatio: layers === 2 ? TWO_LAYER_STEP_RATIO.ratio : 1,
    memory: modelMemory(nx, ny, forcedModes, layers),
    flopsPerStep: flopsPerStep(nx, ny, layers),
    steps,
    secondsPerStep,
    wallSeconds: steps * secondsPerStep,
    speed,
    reference: ref,
  };
}
