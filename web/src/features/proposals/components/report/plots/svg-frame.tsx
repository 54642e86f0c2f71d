import type { ReactNode } from 'react';
import type { Scale } from '../../../lib/svg-scale';

/** The plot area inside the view box (user units; the SVG scales to its container). */
export const FRAME = { width: 520, height: 250, left: 52, right: 30, top: 12, bottom: 42 } as const;
export const PLOT_X: [number, number] = [FRAME.left, FRAME.width - FRAME.right];
export const PLOT_Y: [number, number] = [FRAME.height - FRAME.bottom, FRAME.top];

/**
 * A static SVG chart frame: the plot area, grid, tick labels and axis titles, with the series
 * drawn as children. No canvas and no script, so it prints as drawn; `label` is what a screen
 * reader hears (the figure's caption says the same in words).
 */
export function SvgFrame({
  label,
  sx,
  sy,
  xTicks,
  yTicks,
  xFormat,
  yFormat,
  xTitle,
  yTitle,
  children,
}: {
  label: string;
  sx: Scale;
  sy: Scale;
  xTicks: number[];
  yTicks: number[];
  xFormat: (v: number) => string;
  yFormat: (v: number) => string;
  xTitle: string;
  yTitle: string;
  children: ReactNode;
}) {
  const [x0, x1] = PLOT_X;
  const [y0, y1] = PLOT_Y;
  return (
    <svg viewBox={`0 0 ${FRAME.width} ${FRAME.height}`} role="img" aria-label={label} className="report-plot h-auto w-full text-ink dark:text-night-ink" fontSize="12" fontFamily="inherit">
      <rect x={x0} y={y1} width={x1 - x0} height={y0 - y1} fill="none" stroke="currentColor" strokeOpacity="0.5" />
      {yTicks.map((t) => (
        <g key={`y${t}`}>
          <line x1={x0} x2={x1} y1={sy(t)} y2={sy(t)} stroke="currentColor" strokeOpacity="0.12" />
          <text x={x0 - 5} y={sy(t)} dy="0.32em" textAnchor="end" fill="currentColor">
            {yFormat(t)}
          </text>
        </g>
      ))}
      {xTicks.map((t) => (
        <g key={`x${t}`}>
          <line x1={sx(t)} x2={sx(t)} y1={y0} y2={y1} stroke="currentColor" strokeOpacity="0.12" />
          <text x={sx(t)} y={y0 + 17} textAnchor="middle" fill="currentColor">
            {xFormat(t)}
          </text>
        </g>
      ))}
      <text x={(x0 + x1) / 2} y={FRAME.height - 6} textAnchor="middle" fill="currentColor">
        {xTitle}
      </text>
      <text transform={`translate(13 ${(y0 + y1) / 2}) rotate(-90)`} textAnchor="middle" fill="currentColor">
        {yTitle}
      </text>
      <svg x={x0} y={y1} width={x1 - x0} height={y0 - y1} viewBox={`${x0} ${y1} ${x1 - x0} ${y0 - y1}`} overflow="hidden">
        {children}
      </svg>
    </svg>
  );
}

/** A short sample of a line style for a legend. */
export function LineSample({ stroke, dash, width = 1.5 }: { stroke: string; dash?: string; width?: number }) {
  return (
    <svg viewBox="0 0 28 8" width="28" height="8" aria-hidden="true" className="inline-block shrink-0 align-middle">
      <line x1="1" x2="27" y1="4" y2="4" stroke={stroke} strokeWidth={width} strokeDasharray={dash} />
    </svg>
  );
}
