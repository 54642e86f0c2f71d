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

/** A vertical line at `value` on the x scale, labelled at the top (or at the bottom, clear of labels along the top). */
export function verticalMark(u: uPlot, value: number, label: string, style: MarkStyle, align: CanvasTextAlign = 'left', labelAt: 'top' | 'bottom' = 'top') {
  const x = u.valToPos(value, 'x', true);
  line(u, [x, u.bbox.top], [x, u.bbox.top + u.bbox.height], style);
  const dx = (align === 'left' ? 4 : -4) * uPlot.pxRatio;
  const y = labelAt === 'top' ? u.bbox.top + 12 * uPlot.pxRatio : u.bbox.top + u.bbox.height - 3 * uPlot.pxRatio;
  text(u, label, x + dx, y, align, style);
}

/** A shaded stretch of the x axis, full plot height, from `fromValue` to `toValue` (null: the plot's edge), drawn under the marks. */
export function xBand(u: uPlot, fromValue: number | null, toValue: number | null, colour: string) {
  const left = fromValue === null ? u.bbox.left : Math.max(u.bbox.left, u.valToPos(fromValue, 'x', true));
  const right = toValue === null ? u.bbox.left + u.bbox.width : Math.min(u.bbox.left + u.bbox.width, u.valToPos(toValue, 'x', true));
  if (!(right > left)) return;
  const ctx = u.ctx;
  ctx.save();
  ctx.fillStyle = colour;
  ctx.fillRect(left, u.bbox.top, right - left, u.bbox.height);
  ctx.restore();
}

/** A shaded stretch of the y axis on scale `scale`, full plot width (a tolerance band). */
export function yBand(u: uPlot, fromValue: number, toValue: number, scale: string, colour: string) {
  const top = u.valToPos(Math.max(fromValue, toValue), scale, true);
  const bottom = u.valToPos(Math.min(fromValue, toValue), scale, true);
  const ctx = u.ctx;
  ctx.save();
  ctx.fillStyle = colour;
  ctx.fillRect(u.bbox.left, top, u.bbox.width, bottom - top);
  ctx.restore();
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
