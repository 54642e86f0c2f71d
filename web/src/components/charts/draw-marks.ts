/** Reference marks drawn on a uPlot canvas after the series: target lines, a frequency line, point markers. */
import uPlot from 'uplot';

export interface MarkStyle {
  colour: string;
  dash?: number[];
  width?: number;
  font: string;
  /** Background behind label text, so a label stays readable over the curves. */
  halo?: string;
}

/** A horizontal line across the plot at `value` on scale `scale`, labelled at its right end, above or below it. */
export function horizontalMark(u: uPlot, value: number, scale: string, label: string, style: MarkStyle, below = false) {
  const y = u.valToPos(value, scale, true);
  line(u, [u.bbox.left, y], [u.bbox.left + u.bbox.width, y], style);
  const offset = below ? fontPx(style) + 5 * uPlot.pxRatio : -4 * uPlot.pxRatio;
  text(u, label, u.bbox.left + u.bbox.width - 4 * uPlot.pxRatio, y + offset, 'right', style);
}

/** A label at data coordinates, its bottom edge just above the point. */
export function pointLabel(u: uPlot, xValue: number, yValue: number, scale: string, label: string, style: MarkStyle) {
  text(u, label, u.valToPos(xValue, 'x', true), u.valToPos(yValue, scale, true) - 3 * uPlot.pxRatio, 'center', style);
}

function fontPx(style: MarkStyle): number {
  return Number(/(\d+(\.\d+)?)px/.exec(style.font)?.[1] ?? 11) * uPlot.pxRatio;
}

/** A vertical line at `value` on the x scale, labelled at the top. */
export function verticalMark(u: uPlot, value: number, label: string, style: MarkStyle, align: CanvasTextAlign = 'left') {
  const x = u.valToPos(value, 'x', true);
  line(u, [x, u.bbox.top], [x, u.bbox.top + u.bbox.height], style);
  const dx = (align === 'left' ? 4 : -4) * uPlot.pxRatio;
  text(u, label, x + dx, u.bbox.top + 12 * uPlot.pxRatio, align, style);
}

/** A small filled diamond at data coordinates (x, y on scale `scale`). */
export function diamond(u: uPlot, xValue: number, yValue: number, scale: string, colour: string) {
  const x = u.valToPos(xValue, 'x', true);
  const y = u.valToPos(yValue, scale, true);
  const r = 4.5 * uPlot.pxRatio;
  const ctx = u.ctx;
  ctx.save();
  ctx.beginPath();
  ctx.moveTo(x, y - r);
  ctx.lineTo(x + r, y);
  ctx.lineTo(x, y + r);
  ctx.lineTo(x - r, y);
  ctx.closePath();
  ctx.fillStyle = colour;
  ctx.fill();
  ctx.restore();
}

function line(u: uPlot, [x1, y1]: [number, number], [x2, y2]: [number, number], style: MarkStyle) {
  const ctx = u.ctx;
  ctx.save();
  ctx.strokeStyle = style.colour;
  ctx.lineWidth = (style.width ?? 1) * uPlot.pxRatio;
  ctx.setLineDash((style.dash ?? []).map((d) => d * uPlot.pxRatio));
  ctx.beginPath();
  ctx.moveTo(x1, y1);
  ctx.lineTo(x2, y2);
  ctx.stroke();
  ctx.restore();
}

function text(u: uPlot, words: string, x: number, y: number, align: CanvasTextAlign, style: MarkStyle) {
  const ctx = u.ctx;
  ctx.save();
  const size = fontPx(style);
  ctx.font = style.font.replace(/\d+(\.\d+)?px/, `${size}px`);
  ctx.fillStyle = style.colour;
  ctx.textAlign = align;
  ctx.textBaseline = 'bottom';
  if (style.halo) {
    const width = ctx.measureText(words).width;
    const pad = 2 * uPlot.pxRatio;
    const left = align === 'right' ? x - width : align === 'center' ? x - width / 2 : x;
    ctx.fillStyle = style.halo;
    ctx.fillRect(left - pad, y - size - pad, width + 2 * pad, size + 2 * pad);
    ctx.fillStyle = style.colour;
  }
  ctx.fillText(words, x, y);
  ctx.restore();
}
