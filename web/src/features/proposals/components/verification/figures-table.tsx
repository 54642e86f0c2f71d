import type { ReactNode } from 'react';
import type { VerifiedCondition, VerifiedFigure } from '#shared/verification/types';
import { formatQuantity } from '#shared/units/format-quantity';
import { Verdict } from '../../../../components/ui/verdict';
import { cn } from '../../../../lib/cn';
import { deltaText, figureGroups, figureNotes, figureText, figureVerdict, toleranceText } from '../../lib/verification-format';

function Head({ children, left }: { children: ReactNode; left?: boolean }) {
  return (
    <th scope="col" className={left ? 'py-1 pr-3 text-left font-normal' : 'px-2 py-1 text-right font-normal'}>
      {children}
    </th>
  );
}

function Num({ children, className }: { children: ReactNode; className?: string }) {
  return <td className={cn('px-2 py-1.5 text-right whitespace-nowrap tabular-nums', className)}>{children}</td>;
}

/** "ICM 0 V, 27 °C". */
export function conditionText(condition: Pick<VerifiedCondition, 'inputCommonModeV' | 'temperatureC'>): string {
  return `input common mode ${formatQuantity(condition.inputCommonModeV, 'V')}, ${formatQuantity(condition.temperatureC, '°C')}`;
}

/**
 * Every figure at one condition: the engine's, ngspice's, the difference, the tolerance it is held
 * to, and the verdict; in groups (operating point, gain and rejection, input, supply, speed) when
 * the result records them, with notes on rows listed without a verdict.
 */
export function FiguresTable({ condition, caption }: { condition: VerifiedCondition; caption: string }) {
  const groups = figureGroups(condition.figures);
  const notes = figureNotes(condition.figures);
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">
          {caption} ({conditionText(condition)}). Difference: engine minus ngspice, relative to ngspice for percentages.
        </caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <Head left>Figure</Head>
            <Head>Engine</Head>
            <Head>ngspice</Head>
            <Head>Difference</Head>
            <Head>Tolerance</Head>
            <th scope="col" className="py-1 pl-2 text-left font-normal">
              Verdict
            </th>
          </tr>
        </thead>
        {groups.map((group) => (
          <tbody key={group.heading ?? 'figures'}>
            {group.heading && (
              <tr className="border-b border-rule dark:border-night-rule">
                <th scope="colgroup" colSpan={6} className="pt-3 pb-1 text-left text-xs font-medium text-ink-soft dark:text-night-ink-soft">
                  {group.heading}
                </th>
              </tr>
            )}
            {group.figures.map((figure) => (
              <FigureRow key={figure.key} figure={figure} />
            ))}
          </tbody>
        ))}
      </table>
      {notes.length > 0 && (
        <ul className="mt-2 space-y-1 text-xs text-ink-soft dark:text-night-ink-soft">
          {notes.map((note) => (
            <li key={note}>{note}</li>
          ))}
        </ul>
      )}
    </div>
  );
}

function FigureRow({ figure }: { figure: VerifiedFigure }) {
  const verdict = figureVerdict(figure.agrees, figure.notCompared);
  return (
    <tr className="border-b border-rule/60 last:border-0 dark:border-night-rule/60">
      <th scope="row" className="py-1.5 pr-3 text-left font-normal">
        {figure.label}
      </th>
      <Num>{figure.notCompared === 'not-predicted' ? <span className="text-ink-soft dark:text-night-ink-soft">not predicted</span> : figureText(figure.predicted, figure.unit)}</Num>
      <Num>{figure.notCompared === 'matched-pair' ? <span className="text-ink-soft dark:text-night-ink-soft">not simulated</span> : figureText(figure.simulated, figure.unit)}</Num>
      <Num className={figure.agrees === false ? 'font-medium text-short dark:text-short-bright' : undefined}>{deltaText(figure)}</Num>
      <Num className="text-ink-soft dark:text-night-ink-soft">{toleranceText(figure)}</Num>
      <td className="py-1.5 pl-2">
        <Verdict kind={verdict.kind} label={verdict.label} />
      </td>
    </tr>
  );
}

/**
 * The corners as one compact table: a row per corner, a column per figure; each cell holds
 * ngspice's figure and, below it, the engine's difference with ✓ (within tolerance) or ✕ (outside).
 */
export function VerifiedCornersTable({ corners }: { corners: VerifiedCondition[] }) {
  const columns: Pick<VerifiedFigure, 'key' | 'label'>[] = [];
  for (const corner of corners) for (const f of corner.figures) if (!columns.some((c) => c.key === f.key)) columns.push({ key: f.key, label: f.label });
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">
          At each corner of the spec: ngspice’s figure, and under it the engine’s difference (✓ within tolerance, ✕ outside).
        </caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <Head left>Corner</Head>
            {columns.map((c) => (
              <Head key={c.key}>{c.label}</Head>
            ))}
          </tr>
        </thead>
        <tbody>
          {corners.map((corner) => (
            <tr key={corner.label} className="border-b border-rule/60 align-top last:border-0 dark:border-night-rule/60">
              <th scope="row" className="py-1.5 pr-3 text-left font-normal whitespace-nowrap">
                {corner.label}
              </th>
              {columns.map((c) => {
                const figure = corner.figures.find((f) => f.key === c.key);
                return <Num key={c.key}>{figure ? <CornerCell figure={figure} /> : '—'}</Num>;
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function CornerCell({ figure }: { figure: VerifiedFigure }) {
  const verdict = figureVerdict(figure.agrees, figure.notCompared);
  const glyph = figure.agrees === null ? '–' : figure.agrees ? '✓' : '✕';
  const colour = figure.agrees === null ? 'text-ink-soft dark:text-night-ink-soft' : figure.agrees ? 'text-holds dark:text-holds-bright' : 'text-short dark:text-short-bright';
  return (
    <>
      <span className="block">{figureText(figure.simulated, figure.unit)}</span>
      <span className={cn('block text-xs', colour)}>
        {deltaText(figure)} <span aria-hidden="true">{glyph}</span>
        <span className="sr-only"> {verdict.label}</span>
      </span>
    </>
  );
}
