/** Mixing two "#rrggbb" colours, for plot strokes and fills derived from the palette's tokens. */
function channels(hex: string): [number, number, number] | null {
  const match = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex.trim());
  return match ? [parseInt(match[1], 16), parseInt(match[2], 16), parseInt(match[3], 16)] : null;
}

/** `a` moved a fraction `t` (0..1) toward `b`; `a` unchanged when either is not "#rrggbb". */
export function mixHex(a: string, b: string, t: number): string {
  const from = channels(a);
  const to = channels(b);
  if (!from || !to) return a;
  const mixed = from.map((c, i) => Math.round(c + (to[i] - c) * t));
  return `#${mixed.map((c) => c.toString(16).padStart(2, '0')).join('')}`;
}
