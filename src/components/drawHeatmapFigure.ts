import { niceTicks, tickLabel } from './niceTicks';

/** A rectangle in CSS pixels. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where the parts of a heatmap figure go, in CSS pixels. */
export interface FigureLayout {
  width: number;
  height: number;
  plot: Box;
  bar: Box;
}

// Margins for tick labels and titles (CSS px); the colour bar sits right of the plot.
const LEFT = 54;
const RIGHT = 86;
const TOP = 28;
const BOTTOM = 42;
const BAR_GAP = 14;
/** The height a figure adds to its plot (title above, axis below), CSS px. */
export const FIGURE_MARGINS = TOP + BOTTOM;
const BAR_WIDTH = 14;

function layoutFor(w: number, h: number): FigureLayout {
  w = Math.round(w);
  h = Math.round(h);
  const plot = { x: LEFT, y: TOP, w, h };
  return {
    width: LEFT + w + RIGHT,
    height: TOP + h + BOTTOM,
    plot,
    bar: { x: LEFT + w + BAR_GAP, y: TOP, w: BAR_WIDTH, h },
  };
}

/**
 * Lay a figure out in `width` CSS pixels with a plot of aspect w/h = `aspect` (so a grid cell with
 * dx = dy is square), no taller than `maxPlotHeight`.
 */
export function figureLayout(width: number, aspect: number, maxPlotHeight: number): FigureLayout {
  let w = Math.max(40, width - LEFT - RIGHT);
  let h = w / aspect;
  if (h > maxPlotHeight) {
    h = Math.max(40, maxPlotHeight);
    w = h * aspect;
  }
  return layoutFor(w, h);
}

/** A figure filling `width` with a plot of fixed height (a time axis has no aspect to keep). */
export function stripLayout(width: number, plotHeight: number): FigureLayout {
  return layoutFor(Math.max(40, width - LEFT - RIGHT), plotHeight);
}

export interface AxisSpec {
  min: number;
  max: number;
  label: string;
}

export interface HeatmapText {
  title: string;
  stamp: string;
  x: AxisSpec;
  y: AxisSpec;
  /** The colour bar: values at its bottom and top, its label, and how to write a tick. */
  bar: { lo: number; hi: number; label: string; tick?: (v: number, step: number) => string };
}

const FONT = '12px system-ui, sans-serif';
const INK = '#1b1b1b';
const MUTED = '#555';

/**
 * Draw a heatmap figure: the painted image (`tile`, north/top row first) stretched over the plot box,
 * an optional overlay in plot coordinates (CSS pixels), axes with ticks, and the colour bar
 * (`barTile`, 1 × N, top = hi) with its values. `dpr` is the ratio of backing-store to CSS pixels,
 * set by the caller explicitly. `smooth` interpolates the image (right for smooth fields, wrong for
 * time columns that are separate means).
 */
export function drawHeatmapFigure(
  ctx: CanvasRenderingContext2D,
  layout: FigureLayout,
  dpr: number,
  tile: CanvasImageSource,
  barTile: CanvasImageSource,
  text: HeatmapText,
  options: { smooth?: boolean; overlay?: (ctx: CanvasRenderingContext2D, plot: Box) => void } = {},
): void {
  const { plot, bar } = layout;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.fillStyle = '#fff';
  ctx.fillRect(0, 0, layout.width, layout.height);
  ctx.imageSmoothingEnabled = options.smooth ?? true;
  // 'high' filters properly when the image is shrunk (a 1024² grid in a 600-pixel plot), and costs
  // several times 'low' (bilinear) in a software canvas; enlarging, bilinear is all there is to do.
  const shrinking = 'width' in tile && typeof tile.width === 'number' && tile.width > plot.w * dpr;
  ctx.imageSmoothingQuality = shrinking ? 'high' : 'low';
  ctx.drawImage(tile, plot.x, plot.y, plot.w, plot.h);
  ctx.imageSmoothingEnabled = false;
  ctx.drawImage(barTile, bar.x, bar.y, bar.w, bar.h);
  if (options.overlay) {
    ctx.save();
    ctx.beginPath();
    ctx.rect(plot.x, plot.y, plot.w, plot.h);
    ctx.clip();
    options.overlay(ctx, plot);
    ctx.restore();
  }

  ctx.strokeStyle = INK;
  ctx.lineWidth = 1;
  ctx.setLineDash([]);
  ctx.strokeRect(plot.x - 0.5, plot.y - 0.5, plot.w + 1, plot.h + 1);
  ctx.strokeRect(bar.x - 0.5, bar.y - 0.5, bar.w + 1, bar.h + 1);
  ctx.font = FONT;
  ctx.fillStyle = INK;

  const { x, y } = text;
  const xt = niceTicks(x.min, x.max, Math.max(2, Math.floor(plot.w / 70)));
  const xs = xt.length > 1 ? xt[1] - xt[0] : x.max - x.min;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (const v of xt) {
    const px = Math.round(plot.x + ((v - x.min) / (x.max - x.min)) * plot.w) + 0.5;
    tick(ctx, px, plot.y + plot.h, px, plot.y + plot.h + 4);
    ctx.fillText(tickLabel(v, xs), px, plot.y + plot.h + 6);
  }
  ctx.fillText(x.label, plot.x + plot.w / 2, plot.y + plot.h + 24);

  const yt = niceTicks(y.min, y.max, Math.max(2, Math.floor(plot.h / 50)));
  const ys = yt.length > 1 ? yt[1] - yt[0] : y.max - y.min;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const v of yt) {
    const py = Math.round(plot.y + plot.h - ((v - y.min) / (y.max - y.min)) * plot.h) + 0.5;
    tick(ctx, plot.x - 4, py, plot.x, py);
    ctx.fillText(tickLabel(v, ys), plot.x - 6, py);
  }
  ctx.save();
  ctx.translate(14, plot.y + plot.h / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textAlign = 'center';
  ctx.fillText(y.label, 0, 0);
  ctx.restore();

  // Colour bar values.
  const { lo, hi } = text.bar;
  const ct = hi > lo ? niceTicks(lo, hi, 4) : [lo];
  const cs = ct.length > 1 ? ct[1] - ct[0] : 1;
  const label = text.bar.tick ?? tickLabel;
  ctx.textAlign = 'left';
  for (const c of ct) {
    const py = Math.round(bar.y + bar.h - (hi > lo ? ((c - lo) / (hi - lo)) * bar.h : bar.h / 2)) + 0.5;
    tick(ctx, bar.x + bar.w, py, bar.x + bar.w + 4, py);
    ctx.fillText(label(c, cs), bar.x + bar.w + 6, py);
  }
  ctx.textBaseline = 'bottom';
  ctx.fillText(text.bar.label, bar.x - 2, bar.y - 6);

  ctx.font = `600 ${FONT}`;
  ctx.fillText(text.title, plot.x, plot.y - 8);
  ctx.font = FONT;
  ctx.fillStyle = MUTED;
  ctx.textAlign = 'right';
  ctx.fillText(text.stamp, plot.x + plot.w, plot.y - 8);
}

function tick(ctx: CanvasRenderingContext2D, x0: number, y0: number, x1: number, y1: number): void {
  ctx.beginPath();
  ctx.moveTo(x0, y0);
  ctx.lineTo(x1, y1);
  ctx.stroke();
}
