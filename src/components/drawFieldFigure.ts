import { niceTicks, tickLabel } from './niceTicks';

/** A rectangle in CSS pixels. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where the parts of the figure go, in CSS pixels. */
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
const BAR_WIDTH = 14;

/**
 * Lay the figure out in `width` CSS pixels: the plot keeps the domain's aspect Lx/Ly (so a grid cell
 * with dx = dy is square) and is no taller than `maxPlotHeight`.
 */
export function figureLayout(width: number, aspect: number, maxPlotHeight: number): FigureLayout {
  let w = Math.max(40, width - LEFT - RIGHT);
  let h = w / aspect;
  if (h > maxPlotHeight) {
    h = Math.max(40, maxPlotHeight);
    w = h * aspect;
  }
  w = Math.round(w);
  h = Math.round(h);
  const plot = { x: LEFT, y: TOP, w, h };
  return { width: LEFT + w + RIGHT, height: TOP + h + BOTTOM, plot, bar: { x: LEFT + w + BAR_GAP, y: TOP, w: BAR_WIDTH, h } };
}

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

const FONT = '12px system-ui, sans-serif';
const INK = '#1b1b1b';
const MUTED = '#555';

/**
 * Draw the whole figure: the painted field (`tile`, one pixel per grid point, north up) stretched over
 * the plot box, axes with ticks in model units, and the colour bar (`barTile`, 1 × N, top = +range)
 * with its values. `dpr` is the ratio of backing-store to CSS pixels, set by the caller explicitly.
 */
export function drawFieldFigure(ctx: CanvasRenderingContext2D, layout: FigureLayout, dpr: number, tile: CanvasImageSource, barTile: CanvasImageSource, text: FigureText): void {
  const { plot, bar } = layout;
  ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
  ctx.fillStyle = '#fff';
  ctx.fillRect(0, 0, layout.width, layout.height);
  // The field is a smooth (spectrally truncated) function: bilinear smoothing shows it better than
  // blocks of uneven size at a non-integer scale, which would show a grid pattern not in the data.
  ctx.imageSmoothingEnabled = true;
  ctx.imageSmoothingQuality = 'high';
  ctx.drawImage(tile, plot.x, plot.y, plot.w, plot.h);
  ctx.imageSmoothingEnabled = false;
  ctx.drawImage(barTile, bar.x, bar.y, bar.w, bar.h);

  ctx.strokeStyle = INK;
  ctx.lineWidth = 1;
  ctx.strokeRect(plot.x - 0.5, plot.y - 0.5, plot.w + 1, plot.h + 1);
  ctx.strokeRect(bar.x - 0.5, bar.y - 0.5, bar.w + 1, bar.h + 1);
  ctx.font = FONT;
  ctx.fillStyle = INK;

  // x axis: 0 … Lx left to right.
  const xt = niceTicks(0, text.Lx, Math.max(2, Math.floor(plot.w / 70)));
  const xs = xt.length > 1 ? xt[1] - xt[0] : text.Lx;
  ctx.textAlign = 'center';
  ctx.textBaseline = 'top';
  for (const x of xt) {
    const px = Math.round(plot.x + (x / text.Lx) * plot.w) + 0.5;
    tick(ctx, px, plot.y + plot.h, px, plot.y + plot.h + 4);
    ctx.fillText(tickLabel(x, xs), px, plot.y + plot.h + 6);
  }
  ctx.fillText('x [L], east →', plot.x + plot.w / 2, plot.y + plot.h + 24);

  // y axis: 0 … Ly bottom to top (north up).
  const yt = niceTicks(0, text.Ly, Math.max(2, Math.floor(plot.h / 50)));
  const ys = yt.length > 1 ? yt[1] - yt[0] : text.Ly;
  ctx.textAlign = 'right';
  ctx.textBaseline = 'middle';
  for (const y of yt) {
    const py = Math.round(plot.y + plot.h - (y / text.Ly) * plot.h) + 0.5;
    tick(ctx, plot.x - 4, py, plot.x, py);
    ctx.fillText(tickLabel(y, ys), plot.x - 6, py);
  }
  ctx.save();
  ctx.translate(14, plot.y + plot.h / 2);
  ctx.rotate(-Math.PI / 2);
  ctx.textAlign = 'center';
  ctx.fillText('y [L], north →', 0, 0);
  ctx.restore();

  // Colour bar values, symmetric about zero.
  const ct = text.range > 0 ? niceTicks(-text.range, text.range, 4) : [0];
  const cs = ct.length > 1 ? ct[1] - ct[0] : 1;
  ctx.textAlign = 'left';
  for (const c of ct) {
    const py = Math.round(bar.y + bar.h / 2 - (text.range > 0 ? (c / text.range) * (bar.h / 2) : 0)) + 0.5;
    tick(ctx, bar.x + bar.w, py, bar.x + bar.w + 4, py);
    ctx.fillText(tickLabel(c, cs), bar.x + bar.w + 6, py);
  }
  ctx.textAlign = 'left';
  ctx.textBaseline = 'bottom';
  ctx.fillText(text.barLabel, bar.x - 2, bar.y - 6);

  // Title and time stamp above the plot.
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
