import type {
  DiagnosticsPayload,
  FluxPayload,
  HovmollerPayload,
  MonitorStatus,
  SpectraPayload,
  ZonalPayload,
} from '../workers/diagnosticsApi';
import type { LayerPayload } from '../workers/layerPayload';
import type { LayerSpectraPayload } from '../workers/layerSpectralDiagnostics';

/**
 * The diagnostics the UI was sent, latest of each kind: raw state (the arrays are never proxied),
 * replaced whole when a snapshot brings a new one, each with a version the views redraw on. A new
 * diagnostics epoch (a new run, new parameters, a new sample interval) clears them.
 */
export class DiagnosticsState {
  status = $state.raw<MonitorStatus | null>(null);
  zonal = $state.raw<ZonalPayload | null>(null);
  hovmoller = $state.raw<HovmollerPayload | null>(null);
  spectra = $state.raw<SpectraPayload | null>(null);
  flux = $state.raw<FluxPayload | null>(null);
  /** Two layers: the layers' zonal means, heat flux and energy cycle. */
  layers = $state.raw<LayerPayload | null>(null);
  /** Two layers: barotropic and baroclinic spectra, fluxes and the exchange between them. */
  layerSpectra = $state.raw<LayerSpectraPayload | null>(null);
  /** Bumped whenever any payload was replaced or cleared. */
  version = $state(0);

  ingest(d: DiagnosticsPayload): void {
    const restarted = this.status !== null && d.status.epoch !== this.status.epoch;
    if (restarted) {
      this.zonal = this.hovmoller = this.spectra = this.flux = this.layers = this.layerSpectra = null;
      this.version++;
    }
    this.status = d.status;
    if (d.zonal) this.zonal = d.zonal;
    if (d.hovmoller) this.hovmoller = d.hovmoller;
    if (d.spectra) this.spectra = d.spectra;
    if (d.flux) this.flux = d.flux;
    if (d.layers) this.layers = d.layers;
    if (d.layerSpectra) this.layerSpectra = d.layerSpectra;
    if (d.zonal || d.hovmoller || d.spectra || d.flux || d.layers || d.layerSpectra) this.version++;
  }
}
