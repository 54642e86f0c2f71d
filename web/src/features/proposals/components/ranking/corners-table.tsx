import type { ReactNode } from 'react';
import type { RecommendOption } from '#shared/engine/recommend';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDb, formatMargin, formatSignificant } from '#shared/units/figures';

function Head({ children, left }: { children: ReactNode; left?: boolean }) {
  return (
    <th scope="col" className={left ? 'py-1 pr-3 text-left font-normal' : 'px-2 py-1 text-right font-normal'}>
      {children}
    </th>
  );
}

function Num({ children }: { children: ReactNode }) {
  return <td className="px-2 py-1 text-right whitespace-nowrap tabular-nums">{children}</td>;
}

/** The option at each corner of the spec (input common mode × temperature), the governing one marked. */
export function CornersTable({ option }: { option: RecommendOption }) {
  const differential = option.figures?.isDifferentialOutput ?? false;
  const worst = option.figures?.worstCmrrCorner;
  const f = option.figures ? formatQuantity(option.figures.cmrrFrequencyHz, 'Hz') : 'f';
  return (
    // focusable so a keyboard can scroll it sideways on a narrow screen (axe: scrollable-region-focusable)
    <div className="relative overflow-x-auto" tabIndex={0} role="group" aria-label="Figures at each corner of the spec (scrolls sideways on a narrow screen)">
      <table className="w-full text-sm">
        <caption className="sr-only">Figures at each corner of the spec</caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <Head left>Corner</Head>
            <Head>Tail current</Head>
            <Head>Gain</Head>
            <Head>Rejection at {f}</Head>
            {differential && <Head>Mismatch worst</Head>}
            <Head>Power</Head>
            <Head>Tail compliance</Head>
            <Head>Pair headroom</Head>
          </tr>
        </thead>
        <tbody>
          {option.corners.map((c) => (
            <tr key={c.label} className="border-b border-rule/60 last:border-0 dark:border-night-rule/60">
              <th scope="row" className="py-1 pr-3 text-left font-normal whitespace-nowrap">
                {c.label}
                {c.label === worst && <span className="ml-2 rounded bg-paper px-1 text-xs text-ink-soft dark:bg-night dark:text-night-ink-soft">governs rejection</span>}
                {c.operatingPointProblems.length > 0 && <span className="block text-xs text-short dark:text-short-bright">✕ {c.operatingPointProblems.join('; ')}</span>}
              </th>
              <Num>{formatQuantity(c.tailCurrentA, 'A')}</Num>
              <Num>{formatSignificant(Math.abs(c.gain))} V/V</Num>
              <Num>{formatDb(c.cmrrAtFrequencyDb)}</Num>
              {differential && <Num>{c.cmrrDifferentialWorstCaseDb === null ? '—' : formatDb(c.cmrrDifferentialWorstCaseDb)}</Num>}
              <Num>{formatQuantity(c.powerW, 'W')}</Num>
              <Num>{formatMargin(c.tailComplianceMarginV, 'V')}</Num>
              <Num>{formatMargin(c.pairSaturationMarginV, 'V')}</Num>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
