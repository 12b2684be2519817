import { describe, expect, it } from 'vitest';
import { LayerSnapshotPlan } from '../../lib/analysis/layerSnapshot';
import { LayerZonalMeanPlan } from '../../lib/analysis/layerZonalMean';
import type { StriaRunInfo } from '../../lib/io/cfGlobalAttributes';
import { TWO_LAYER_SNAPSHOT_FILE, TWO_LAYER_ZONAL_MEAN_FILE } from '../../lib/io/cfStria';
import { encodeStriaFile, layerSnapshotFrame, layerZonalMeanFrame, type StriaFrame } from '../../lib/io/cfStriaWriter';
import { memorySource } from '../../lib/io/byteSource';
import { readNetcdf } from '../../lib/io/netcdfRead';
import { Model } from '../../lib/model/model';
import { twoLayerCoefficients, type ModelParams } from '../../lib/model/params';
import { analyzeFile } from '../../lib/userfile/analyzeFile';
import { fileAnalysisText } from '../../lib/userfile/report';

/** A baroclinically unstable two-layer flow of the test's own (unequal layers, so the weights matter). */
const FLOW: Partial<ModelParams> = {
  layers: 2,
  nx: 32,
  ny: 32,
  kd: 4,
  depth_ratio: 0.5,
  beta: 1,
  shear: 0.4,
  mu: 0.2,
  nu: 1e-7,
  nu_order: 4,
  forcing: 'none',
  kf: 6,
  dkf: 1,
  dt: 0.05,
  init_energy: 0.01,
};

/** Stria's own two-layer snapshot and zonal-mean files of a short run, with what the model says of it. */
function writeRun() {
  const m = new Model(FLOW);
  const p = m.params;
  const run: StriaRunInfo = { params: p, striaVersion: '0.1.0', createdAt: '2026-12-05T00:00:00Z' };
  const plan = new LayerSnapshotPlan(p);
  const c = twoLayerCoefficients(p);
  const zonal = new LayerZonalMeanPlan(plan.grid, {
    h1: c.h1,
    h2: c.h2,
    Q1: c.Q1,
    Q2: c.Q2,
    band: Math.floor(p.ny / 3),
  });
  const snaps: StriaFrame[] = [];
  const zon: StriaFrame[] = [];
  const heat: number[] = [];
  const ubar = { upper: new Float64Array(p.ny), lower: new Float64Array(p.ny) };
  m.step(400);
  for (let r = 0; r < 6; r++) {
    m.step(20);
    const up = plan.gridFields(m.qHat, 'upper');
    const lo = plan.gridFields(m.qHat, 'lower');
    snaps.push(layerSnapshotFrame(m.time, m.steps, up, lo));
    const z = zonal.compute(up, lo);
    zon.push(layerZonalMeanFrame(m.time, m.steps, z));
    heat.push(z.heatFluxPlain.reduce((s, x) => s + x, 0) / p.ny);
    for (let j = 0; j < p.ny; j++) {
      ubar.upper[j] += z.upper.ubar[j] / 6;
      ubar.lower[j] += z.lower.ubar[j] / 6;
    }
  }
  return {
    p,
    c,
    snapshots: encodeStriaFile(TWO_LAYER_SNAPSHOT_FILE, run, snaps),
    zonal: encodeStriaFile(TWO_LAYER_ZONAL_MEAN_FILE, run, zon),
    heat: heat.reduce((s, x) => s + x, 0) / heat.length,
    ubar,
  };
}

const close = (a: ArrayLike<number | null>, b: ArrayLike<number>, tol: number) => {
  let scale = 0;
  for (let j = 0; j < b.length; j++) scale = Math.max(scale, Math.abs(b[j]));
  for (let j = 0; j < b.length; j++) expect(Math.abs((a[j] as number) - b[j])).toBeLessThan(tol * scale);
};

describe("Stria's two-layer files through analyze", () => {
  const w = writeRun();

  it('carry a layer dimension with a CF-style vertical coordinate and the layer fractions', () => {
    const f = readNetcdf(w.snapshots);
    expect(f.dimensions.find((d) => d.name === 'layer')?.size).toBe(2);
    const layer = f.variables.find((v) => v.name === 'layer')!;
    expect(layer.attributes.axis).toBe('Z');
    expect(layer.attributes.positive).toBe('down');
    expect(Array.from(f.readVariable('layer'))).toEqual([1, 2]);
    expect(Array.from(f.readVariable('layer_fraction'))).toEqual([w.c.h1, w.c.h2]);
    expect(f.variables.find((v) => v.name === 'q')!.dimensions).toEqual(['time', 'layer', 'y', 'x']);
    const z = readNetcdf(w.zonal);
    expect(z.variables.find((v) => v.name === 'ubar')!.dimensions).toEqual(['time', 'layer', 'y']);
    expect(z.variables.find((v) => v.name === 'heat_flux')!.dimensions).toEqual(['time', 'y']);
  });

  // The round trip: what analyze reads of a layer is that layer's flow, the depth-weighted mean is
  // the barotropic flow h₁f₁ + h₂f₂ (the views are linear [derived: docs/two-layer.md]), and the heat
  // flux is ⟨v₁′τ′⟩ of the model's fields.
  it('give back each layer, the depth-weighted mean and the heat flux from the snapshots', () => {
    for (const layer of [1, 2] as const) {
      const r = analyzeFile(memorySource(w.snapshots), { layer, spectra: false });
      expect(r.layers).toMatchObject({ dimension: 'layer', count: 2, analysed: `layer ${layer}` });
      close(r.analysis.profiles.ubar, layer === 1 ? w.ubar.upper : w.ubar.lower, 1e-12);
    }
    const mean = analyzeFile(memorySource(w.snapshots), { spectra: false });
    expect(mean.layers).toMatchObject({
      analysed: 'depth-weighted mean',
      weightsSource: 'the variable layer_fraction',
    });
    close(
      mean.analysis.profiles.ubar,
      w.ubar.upper.map((u, j) => w.c.h1 * u + w.c.h2 * w.ubar.lower[j]),
      1e-12,
    );
    expect(mean.heatFlux).toMatchObject({ from: 'fields', records: 6 });
    expect(Math.abs(mean.heatFlux!.mean / w.heat - 1)).toBeLessThan(1e-10);
    expect(w.heat).toBeGreaterThan(0);
    expect(fileAnalysisText(mean)).toMatch(/eddy heat flux ⟨v′τ′⟩ .*: [\d.e-]+/);
    expect(fileAnalysisText(mean)).toMatch(/layers: depth-weighted mean of the 2 along "layer"/);
    // Read every 2nd point: the same layer, subsampled, row by row.
    const sub = analyzeFile(memorySource(w.snapshots), { layer: 2, spectra: false, subsample: 2 });
    expect(sub.analysis.grid.nx).toBe(16);
    expect(sub.heatFlux!.records).toBe(6);
  });

  it('give back each layer and the stored heat flux from the zonal means', () => {
    const r = analyzeFile(memorySource(w.zonal), { layer: 2 });
    expect(r.file.layout).toBe('zonal-mean');
    close(r.analysis.profiles.ubar, w.ubar.lower, 1e-12);
    expect(r.heatFlux).toMatchObject({ from: 'profile', variable: 'heat_flux', records: 6 });
    expect(Math.abs(r.heatFlux!.mean / w.heat - 1)).toBeLessThan(1e-12);
  });
});
