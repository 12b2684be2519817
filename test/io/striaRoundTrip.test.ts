import { describe, expect, it } from 'vitest';
import { JetFinder } from '../../lib/analysis/jets';
import { SnapshotPlan } from '../../lib/analysis/snapshot';
import { SpectraPlan } from '../../lib/analysis/spectra';
import { SpectralFluxPlan } from '../../lib/analysis/spectralFlux';
import { StaircaseFitter } from '../../lib/analysis/staircase';
import { ZonalMeanPlan } from '../../lib/analysis/zonalMean';
import { analyzeFile } from '../../lib/userfile/analyzeFile';
import { memorySource } from '../../lib/io/byteSource';
import type { StriaRunInfo } from '../../lib/io/cfGlobalAttributes';
import { SNAPSHOT_FILE } from '../../lib/io/cfStria';
import { encodeStriaFile, snapshotFrame } from '../../lib/io/cfStriaWriter';
import type { UnitSystem } from '../../lib/io/cfUnits';
import { Model } from '../../lib/model/model';
import { DEFAULT_PARAMS } from '../../lib/model/params';
import { QUIET, randomKeptState } from '../support/modelFixtures';

/**
 * A Stria snapshot file (lib/io/cfStriaWriter.ts) read back as a user's file: the same diagnostics
 * as Stria's own plans give from the model states directly (ZonalMeanPlan, JetFinder,
 * StaircaseFitter, SpectraPlan, SpectralFluxPlan), to round-off, in model and in physical units.
 */
const params = { ...DEFAULT_PARAMS, ...QUIET, nx: 64, ny: 64, beta: 6, kd: 1.5, mu: 0.02, eps: 0.01 };

function states() {
  const model = new Model(params);
  return [0, 1, 2].map((k) => {
    const q = randomKeptState(model, 40 + k);
    // A zonal flow of three jets on top: q̂ of ū = U cos(3y) is ζ̂ − k_d²ψ̂ at m = ±3 (kx = 0).
    const g = model.grid;
    const m = 3;
    const K2 = m * m + params.kd ** 2;
    // ψ = (2/m)·sin(m y) has ψ̂(±m) = ∓i/m, so q̂ = −K²ψ̂ = ±i K²/m (and u = −ψ_y = −2 cos(m y)).
    const amp = K2 / m;
    q[2 * (m * g.nkx) + 1] += amp;
    q[2 * ((g.ny - m) * g.nkx) + 1] -= amp;
    return q;
  });
}

function direct(qs: Float64Array[]) {
  const plan = new SnapshotPlan(params);
  const zm = new ZonalMeanPlan(plan.grid, { beta: params.beta });
  const n = qs.length;
  const mean = (k: 'ubar' | 'qtot') =>
    qs
      .map((q) => zm.compute(plan.gridFields(q))[k].slice())
      .reduce((s, p) => s.map((x, j) => x + p[j] / n), new Float64Array(params.ny));
  const spectra = SpectraPlan.forSnapshots(plan);
  const E = qs
    .map((q) => spectra.compute(q).E.slice())
    .reduce((s, p) => s.map((x, j) => x + p[j] / n), new Float64Array(spectra.nShells));
  const flux = new SpectralFluxPlan(plan);
  const PiE = qs
    .map((q) => flux.compute(q).PiE.slice())
    .reduce((s, p) => s.map((x, j) => x + p[j] / n), new Float64Array(spectra.nShells));
  let s2 = 0;
  for (const q of qs) {
    const f = plan.gridFields(q);
    for (let k = 0; k < f.u.length; k++) s2 += f.u[k] ** 2 + f.v[k] ** 2;
  }
  const ubar = mean('ubar');
  const qtot = mean('qtot');
  return {
    ubar,
    qtot,
    jets: new JetFinder(params.ny, params.Ly).find(ubar),
    stairs: new StaircaseFitter(params.ny, params.Ly, params.beta).fit(qtot),
    E,
    PiE,
    urms: Math.sqrt(s2 / (n * params.nx * params.ny)),
  };
}

describe('a Stria-written file round-trips to the diagnostics of its model states', () => {
  const qs = states();
  const d = direct(qs);
  const plan = new SnapshotPlan(params);
  const frames = qs.map((q, k) => snapshotFrame(0.5 * k, 10 * k, plan.gridFields(q)));

  for (const units of [
    { kind: 'model' },
    { kind: 'physical', metresPerLength: 2e5, secondsPerTime: 5e4 },
  ] as UnitSystem[]) {
    it(`in ${units.kind} units`, () => {
      const run: StriaRunInfo = { params, striaVersion: '0.1.0', createdAt: '2025-02-01T00:00:00Z', units };
      const r = analyzeFile(memorySource(encodeStriaFile(SNAPSHOT_FILE, run, frames)));
      const [l, t] = units.kind === 'physical' ? [units.metresPerLength, units.secondsPerTime] : [1, 1];
      const a = r.analysis;
      // The file's own parameters, converted: β in 1/(L·T), k_d in 1/L.
      expect(r.parameters.beta!.value).toBeCloseTo(params.beta / (l * t), 12 + Math.log10(l * t));
      expect(r.parameters.kd!.source).toBe("the file's stria_kd attribute (a Stria run)");
      expect(r.file.fields).toMatchObject({
        u: { variable: 'u' },
        v: { variable: 'v' },
        q: { variable: 'q' },
        zeta: { variable: 'zeta' },
        psi: { variable: 'psi' },
      });
      expect(a.grid).toMatchObject({ periodicX: true, periodicY: true });
      const speed = l / t;
      (a.profiles.ubar as number[]).forEach((u, j) => expect(Math.abs(u / speed - d.ubar[j])).toBeLessThan(1e-13));
      a.qtot!.values.forEach((q, j) => expect(Math.abs(q * t - d.qtot[j])).toBeLessThan(1e-12));
      expect(d.jets.count).toBe(3); // the three jets of cos(3y) dominate the random eddies
      expect(a.jets!.count).toBe(d.jets.count);
      a.jets!.jets.forEach((j, k) => expect(Math.abs(j.y / l - d.jets.jets[k].y)).toBeLessThan(1e-12));
      expect(a.staircase!.edges.length).toBe(d.stairs.edges.length);
      expect(Math.abs(a.staircase!.index! - d.stairs.index)).toBeLessThan(1e-12);
      expect(Math.abs(a.uRms!.value / speed / d.urms - 1)).toBeLessThan(1e-13);
      const spec = a.spectra!;
      expect(spec.kind).toBe('pv');
      const eUnit = speed * speed;
      spec.E.forEach((e, s) => expect(Math.abs(e / eUnit - d.E[s])).toBeLessThan(1e-12 * Math.max(...d.E)));
      const pUnit = eUnit / t;
      spec.PiE!.forEach((p, s) =>
        expect(Math.abs(p / pUnit - d.PiE[s])).toBeLessThan(1e-10 * Math.max(...d.PiE.map(Math.abs))),
      );
    });
  }
});
