import type uPlot from 'uplot';

/**
 * A value marked on one of a chart's scales: a line across the plot at `value` (vertical when that
 * scale runs across, horizontal when it runs up, as the x scale of a meridional profile does), or a
 * shaded band over `span`, with an optional label at the line's end.
 */
export interface ChartMark {
  /** The scale the value is on (default 'x'). */
  scale?: string;
  value?: number;
  span?: [number, number];
  label?: string;
  colour: string;
  dash?: number[];
  width?: number;
}

/**
 * Marks drawn over a uPlot chart after its series. The chart's options are built once, so the marks
 * live here and are replaced as data arrive; `setData` redraws, and the marks with it.
 */
export class ChartMarks {
  marks: ChartMark[] = [];

  plugin(): uPlot.Plugin {
    return { hooks: { draw: [(u: uPlot) => this.draw(u)] } };
  }

  private draw(u: uPlot): void {
    if (this.marks.length === 0) return;
    const ctx = u.ctx;
    const { left, top, width, height } = u.bbox;
    const ratio = devicePixelRatio || 1;
    ctx.save();
    ctx.beginPath();
    ctx.rect(left, top, width, height);
    ctx.clip();
    ctx.font = `${11 * ratio}px system-ui, sans-serif`;
    // Labels that would overlap the previous one along the scale drop to the next row.
    const rowOf = new Map<ChartMark, number>();
    const labelled = this.marks
      .filter((m) => m.label && m.value !== undefined)
      .map((m) => ({ m, p: u.valToPos(m.value!, m.scale ?? 'x', true) }));
    labelled.sort((a, b) => a.p - b.p);
    let last = -Infinity;
    let row = 0;
    for (const { m, p } of labelled) {
      row = p - last < ctx.measureText(m.label!).width + 8 * ratio ? row + 1 : 0;
      rowOf.set(m, row);
      if (row === 0) last = p;
    }
    for (const m of this.marks) {
      const key = m.scale ?? 'x';
      // A value on a scale that runs across is a vertical line; on one that runs up, a horizontal line.
      const across = u.scales[key].ori === 0;
      if (m.span) {
        const a = u.valToPos(m.span[0], key, true);
        const b = u.valToPos(m.span[1], key, true);
        ctx.fillStyle = m.colour;
        if (across) ctx.fillRect(Math.min(a, b), top, Math.abs(b - a), height);
        else ctx.fillRect(left, Math.min(a, b), width, Math.abs(b - a));
      }
      if (m.value === undefined || !Number.isFinite(m.value)) continue;
      const p = Math.round(u.valToPos(m.value, key, true)) + 0.5;
      ctx.strokeStyle = m.colour;
      ctx.lineWidth = (m.width ?? 1) * ratio;
      ctx.setLineDash((m.dash ?? []).map((d) => d * ratio));
      ctx.beginPath();
      if (across) {
        ctx.moveTo(p, top);
        ctx.lineTo(p, top + height);
      } else {
        ctx.moveTo(left, p);
        ctx.lineTo(left + width, p);
      }
      ctx.stroke();
      if (m.label) {
        ctx.fillStyle = m.colour;
        ctx.textAlign = across ? 'left' : 'right';
        ctx.textBaseline = across ? 'top' : 'bottom';
        if (across) ctx.fillText(m.label, p + 3 * ratio, top + (3 + 13 * (rowOf.get(m) ?? 0)) * ratio);
        else ctx.fillText(m.label, left + width - 3 * ratio, p - 2 * ratio);
      }
    }
    ctx.restore();
  }
}
