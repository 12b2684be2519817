/**
 * A view's figure as one PNG: what is drawn inside a root element, composed at the places it has on
 * screen, at the device pixel ratio. The parts of a Stria figure are canvases (the uPlot charts with
 * their axes, the heatmaps, the field), SVG drawings (the scale ladder), and a few lines of text
 * (uPlot titles and legends, and elements marked `data-figure-text`: headings and captions that
 * belong with the figure). Buttons, inputs and the rest of the page are left out.
 */

/** Elements whose text goes into the picture, besides the uPlot titles. */
export const FIGURE_TEXT = '[data-figure-text]';

interface Placed {
  x: number;
  y: number;
  w: number;
  h: number;
}

function placeOf(el: Element, origin: DOMRect): Placed | null {
  const r = el.getBoundingClientRect();
  if (r.width <= 0 || r.height <= 0) return null;
  return { x: r.left - origin.left, y: r.top - origin.top, w: r.width, h: r.height };
}

/** The composed figure of `root` as a canvas (CSS size × `dpr` pixels), ready for toBlob. */
export async function composeFigure(root: HTMLElement, dpr = window.devicePixelRatio || 1): Promise<HTMLCanvasElement> {
  const origin = root.getBoundingClientRect();
  const out = document.createElement('canvas');
  out.width = Math.max(1, Math.round(origin.width * dpr));
  out.height = Math.max(1, Math.round(origin.height * dpr));
  const ctx = out.getContext('2d');
  if (!ctx) throw new Error('no 2D context to compose the figure on');
  ctx.scale(dpr, dpr);
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, origin.width, origin.height);
  for (const svg of root.querySelectorAll('svg')) {
    const at = placeOf(svg, origin);
    if (at && !svg.closest('.u-legend')) await drawSvg(ctx, svg, at);
  }
  for (const c of root.querySelectorAll('canvas')) {
    const at = placeOf(c, origin);
    if (at && c.width > 0 && c.height > 0) ctx.drawImage(c, at.x, at.y, at.w, at.h);
  }
  for (const el of root.querySelectorAll<HTMLElement>(`.u-title, ${FIGURE_TEXT}`)) drawText(ctx, el, origin);
  for (const legend of root.querySelectorAll<HTMLElement>('.u-legend')) drawLegend(ctx, legend, origin);
  return out;
}

/** The figure of `root` as PNG bytes. */
export async function figurePngBlob(root: HTMLElement): Promise<Blob> {
  const canvas = await composeFigure(root);
  return new Promise((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the figure could not be encoded as PNG'))), 'image/png'),
  );
}

/** Text of an element in its own font and colour, wrapped to its width, from its top left. */
function drawText(ctx: CanvasRenderingContext2D, el: HTMLElement, origin: DOMRect): void {
  const at = placeOf(el, origin);
  const text = el.innerText.trim();
  if (!at || !text) return;
  const style = getComputedStyle(el);
  ctx.font = `${style.fontStyle} ${style.fontWeight} ${style.fontSize} ${style.fontFamily}`;
  ctx.fillStyle = style.color;
  ctx.textBaseline = 'top';
  ctx.textAlign = 'left';
  const lineHeight = parseFloat(style.lineHeight) || 1.25 * parseFloat(style.fontSize);
  const padLeft = parseFloat(style.paddingLeft) || 0;
  let y = at.y + (parseFloat(style.paddingTop) || 0);
  for (const paragraph of text.split('\n')) {
    let line = '';
    for (const word of paragraph.split(/\s+/)) {
      const next = line ? `${line} ${word}` : word;
      if (line && ctx.measureText(next).width > at.w - padLeft) {
        ctx.fillText(line, at.x + padLeft, y);
        y += lineHeight;
        line = word;
      } else line = next;
    }
    if (line) ctx.fillText(line, at.x + padLeft, y);
    y += lineHeight;
  }
}

/** A uPlot legend: each series' marker (its stroke colour) and label, faded when the series is hidden. */
function drawLegend(ctx: CanvasRenderingContext2D, legend: HTMLElement, origin: DOMRect): void {
  // The first row is the x series (its value under the cursor), not a line of the chart.
  for (const row of [...legend.querySelectorAll<HTMLElement>('.u-series')].slice(1)) {
    const marker = row.querySelector<HTMLElement>('.u-marker');
    const label = row.querySelector<HTMLElement>('.u-label');
    const m = marker ? placeOf(marker, origin) : null;
    const l = label ? placeOf(label, origin) : null;
    if (!l || !label) continue;
    ctx.globalAlpha = row.classList.contains('u-off') ? 0.35 : 1;
    if (m && marker) {
      const s = getComputedStyle(marker);
      ctx.fillStyle = s.backgroundColor;
      ctx.fillRect(m.x, m.y, m.w, m.h);
      ctx.strokeStyle = s.borderTopColor;
      ctx.lineWidth = parseFloat(s.borderTopWidth) || 1;
      ctx.strokeRect(m.x + 0.5, m.y + 0.5, m.w - 1, m.h - 1);
    }
    const s = getComputedStyle(label);
    ctx.font = `${s.fontWeight} ${s.fontSize} ${s.fontFamily}`;
    ctx.fillStyle = s.color;
    ctx.textBaseline = 'middle';
    ctx.fillText(label.innerText.replace(/:\s*$/, ''), l.x, l.y + l.h / 2);
    ctx.globalAlpha = 1;
  }
}

/** The style properties an SVG drawing needs to look as it does on screen, once its page styles are gone. */
const SVG_STYLE = [
  'fill',
  'fill-opacity',
  'stroke',
  'stroke-width',
  'stroke-dasharray',
  'stroke-opacity',
  'opacity',
  'font-family',
  'font-size',
  'font-weight',
  'font-style',
  'text-anchor',
  'dominant-baseline',
];

/** An inline SVG drawn at its place: a copy with its computed styles inlined, loaded as an image. */
async function drawSvg(ctx: CanvasRenderingContext2D, svg: SVGSVGElement, at: Placed): Promise<void> {
  const copy = svg.cloneNode(true) as SVGSVGElement;
  const from = [svg, ...svg.querySelectorAll('*')];
  const to = [copy, ...copy.querySelectorAll('*')];
  from.forEach((el, i) => {
    const s = getComputedStyle(el);
    const target = to[i] as SVGElement;
    // As presentation attributes: a style attribute would be an inline style, which the page's policy refuses.
    for (const p of SVG_STYLE) {
      const v = s.getPropertyValue(p);
      if (v) target.setAttribute(p, v);
    }
  });
  copy.setAttribute('width', String(at.w));
  copy.setAttribute('height', String(at.h));
  copy.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  // A data: URL, which the page's Content Security Policy allows for images (scripts/contentPolicy.ts).
  const img = new Image();
  img.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(new XMLSerializer().serializeToString(copy))}`;
  await img.decode();
  ctx.drawImage(img, at.x, at.y, at.w, at.h);
}
