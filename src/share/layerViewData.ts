import type { LayerSpectraPayload } from '../../workers/layerSpectralDiagnostics';
import { timeStamp } from './download';
import { csvFile, numbers, type DataFile } from './figureData';

const span = (s: LayerSpectraPayload) =>
  `mean of ${s.count} samples over t = ${s.tStart.toFixed(2)}–${s.tEnd.toFixed(2)}`;

/** Spectra view, two layers: the barotropic and baroclinic spectra as densities (shell sum / dk). */
export function layerSpectraCsv(s: LayerSpectraPayload): DataFile {
  const d = (a: Float64Array) => Array.from(a, (e) => e / s.dk);
  return csvFile(
    `stria-layer-spectra-${timeStamp(s.tEnd)}.csv`,
    [
      numbers('k', s.k),
      numbers('KE_barotropic', d(s.kineticBarotropic)),
      numbers('KE_baroclinic', d(s.kineticBaroclinic)),
      numbers('APE', d(s.potential)),
    ],
    `${s.k.length} shells (dk = ${s.dk.toPrecision(3)}), ${span(s)}; densities E/dk`,
  );
}

/** Flux view, two layers: Π, Π_bt and Π_bc through the shell edges and the exchange X per shell. */
export function layerFluxCsv(s: LayerSpectraPayload): DataFile {
  return csvFile(
    `stria-layer-flux-${timeStamp(s.tEnd)}.csv`,
    [
      numbers('k', s.k),
      numbers('exchange_X', s.exchange),
      numbers('k_edge', s.kEdge),
      numbers('Pi', s.flux),
      numbers('Pi_barotropic', s.fluxBarotropic),
      numbers('Pi_baroclinic', s.fluxBaroclinic),
    ],
    `fluxes through ${s.kEdge.length} shell edges and the exchange per shell (> 0: baroclinic to barotropic), ${span(s)}`,
  );
}
