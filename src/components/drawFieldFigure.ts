import { drawHeatmapFigure, type FigureLayout } from './drawHeatmapFigure';

export { FIGURE_MARGINS, figureLayout, type Box, type FigureLayout } from './drawHeatmapFigure';

export interface FigureText {
  /** e.g. "ζ  relative vorticity ∇²ψ" */
  title: string;
  /** e.g. "t = 12.30 T" */
  stamp: string;
  /** Colour-bar label, e.g. "ζ [T⁻¹]". */
  barLabel: string;
  Lx: number;
  Ly: number;
  /** Symmetric colour range ±range. */
  range: number;
}

/**
 * Draw a field figure: the painted field (`tile`, one pixel per grid point, north up) over the plot
 * box, axes in model units from 0 to Lx and Ly, and the symmetric colour bar ±range. The field is a
 * smooth (spectrally truncated) function: bilinear smoothing shows it better than blocks of uneven
 * size at a non-integer scale, which would show a grid pattern not in the data.
 */
export function drawFieldFigure(
  ctx: CanvasRenderingContext2D,
  layout: FigureLayout,
  dpr: number,
  tile: CanvasImageSource,
  barTile: CanvasImageSource,
  text: FigureText,
): void {
  drawHeatmapFigure(ctx, layout, dpr, tile, barTile, {
    title: text.title,
    stamp: text.stamp,
    x: { min: 0, max: text.Lx, label: 'x [L], east →' },
    y: { min: 0, max: text.Ly, label: 'y [L], north →' },
    bar: { lo: -text.range, hi: text.range, label: text.barLabel },
  });
}
