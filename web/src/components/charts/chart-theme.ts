/**
 * Plot colours from the app's palette (the CSS custom properties Tailwind emits for app.css's
 * @theme), never the status hues (holds/short) so a line's colour is not read as a verdict; each
 * topology has its own dash so lines stay apart without colour (tone and dash per topology: the
 * catalogue, shared/engine/topologies.ts). Dark theme: the night tokens, and the accent hues
 * lifted toward the night ink so they read on the dark sheet.
 */
import { TOPOLOGIES, TOPOLOGY_CATALOGUE, type PlotTone, type TopologyId } from '#shared/engine/topologies';
import { mixHex } from '../../lib/colour-mix';

/** Fallbacks equal to app.css, used when a token cannot be read. */
const FALLBACK: Record<string, string> = {
  ink: '#1e2422',
  'ink-soft': '#4a534f',
  rule: '#d9d3c5',
  sheet: '#fffdf8',
  fern: '#2f5d50',
  note: '#8a5a00',
  'night-sheet': '#1b211e',
  'night-rule': '#313a36',
  'night-ink': '#e9e6dd',
  'night-ink-soft': '#a9b1ac',
};

function token(name: string): string {
  const value = typeof document === 'undefined' ? '' : getComputedStyle(document.documentElement).getPropertyValue(`--color-${name}`).trim();
  return /^#[0-9a-f]{6}$/i.test(value) ? value : FALLBACK[name];
}

export interface ChartTheme {
  ink: string;
  inkSoft: string;
  rule: string;
  sheet: string;
  accent: string;
  note: string;
  font: string;
  labelFont: string;
  topology: Record<TopologyId, { stroke: string; dash: number[] }>;
}

/** Each topology's line: the catalogue's tone in this theme's colour, and its dash. */
function topologyLines(tones: Record<PlotTone, string>): ChartTheme['topology'] {
  return Object.fromEntries(
    TOPOLOGIES.map((id) => {
      const { tone, dash } = TOPOLOGY_CATALOGUE[id].plotLine;
      return [id, { stroke: tones[tone], dash: [...dash] }];
    }),
  ) as ChartTheme['topology'];
}

export function chartTheme(dark: boolean): ChartTheme {
  const ink = token(dark ? 'night-ink' : 'ink');
  const lift = (hex: string, t: number) => (dark ? mixHex(hex, ink, t) : hex);
  const inkSoft = token(dark ? 'night-ink-soft' : 'ink-soft');
  const fern = lift(token('fern'), 0.55);
  const note = lift(token('note'), 0.35);
  return {
    ink,
    inkSoft,
    rule: token(dark ? 'night-rule' : 'rule'),
    sheet: token(dark ? 'night-sheet' : 'sheet'),
    accent: fern,
    note,
    font: '11px Lexend, system-ui, sans-serif',
    labelFont: '12px Lexend, system-ui, sans-serif',
    topology: topologyLines({ ink, 'ink-soft': inkSoft, note, accent: fern }),
  };
}
