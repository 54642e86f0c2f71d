/**
 * Scales, ticks and paths for the report's static SVG plots (no canvas, so they print). Pure.
 */

export interface Scale {
  (value: number): number;
  domain: [number, number];
}

/** A linear map from [d0, d1] onto [r0, r1]. */
export function linearScale([d0, d1]: [number, number], [r0, r1]: [number, number]): Scale {
  const span = d1 - d0 || 1;
  const scale = ((v: number) => r0 + ((v - d0) / span) * (r1 - r0)) as Scale;
  scale.domain = [d0, d1];
  return scale;
}

/** A base-10 logarithmic map from [d0, d1] (both > 0) onto [r0, r1]. */
export function logScale([d0, d1]: [number, number], [r0, r1]: [number, number]): Scale {
  const l0 = Math.log10(d0);
  const span = Math.log10(d1) - l0 || 1;
  const scale = ((v: number) => r0 + ((Math.log10(v) - l0) / span) * (r1 - r0)) as Scale;
  scale.domain = [d0, d1];
  return scale;
}

/** About `count` round ticks (1, 2 or 5 × 10ⁿ apart) covering [min, max]. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!(max > min)) return [min];
  const raw = (max - min) / Math.max(1, count);
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const ticks: number[] = [];
  for (let t = Math.ceil(min / step - 1e-9) * step; t <= max + step * 1e-9; t += step) ticks.push(Number(t.toPrecision(12)));
  return ticks;
}

/** The range [min, max] widened to the nearest ticks of niceTicks. */
export function niceDomain(min: number, max: number, count = 5): [number, number] {
  if (!(max > min)) return [min - 1, max + 1];
  const ticks = niceTicks(min, max, count);
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
  return [Math.floor(min / step + 1e-9) * step, Math.ceil(max / step - 1e-9) * step];
}

/** An SVG path through the points, broken where a value is missing; "" when nothing is drawable. */
export function linePath(xs: number[], ys: (number | null)[], sx: Scale, sy: Scale): string {
  let path = '';
  let drawing = false;
  for (let i = 0; i < xs.length; i++) {
    const y = ys[i];
    if (y === null || !Number.isFinite(y)) {
      drawing = false;
      continue;
    }
    path += `${drawing ? 'L' : 'M'}${sx(xs[i]).toFixed(1)},${sy(y).toFixed(1)}`;
    drawing = true;
  }
  return path;
}

/** A stepped outline of a histogram: bin edges and one count per bin. */
export function stepPath(edges: number[], counts: number[], sx: Scale, sy: Scale): string {
  if (counts.length === 0) return '';
  let path = `M${sx(edges[0]).toFixed(1)},${sy(0).toFixed(1)}`;
  counts.forEach((count, i) => {
    path += `L${sx(edges[i]).toFixed(1)},${sy(count).toFixed(1)}L${sx(edges[i + 1]).toFixed(1)},${sy(count).toFixed(1)}`;
  });
  return `${path}L${sx(edges[counts.length]).toFixed(1)},${sy(0).toFixed(1)}`;
}
