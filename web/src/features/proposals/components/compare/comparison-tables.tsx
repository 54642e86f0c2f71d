import { Verdict } from '../../../../components/ui/verdict';
import { cn } from '../../../../lib/cn';
import { FigureCell } from '../ranking/figure-cell';
import type { CheckRow, FigureRow } from '../../lib/comparison';
import { DifferenceMarks } from './difference-marks';

const HEAD = 'py-1 pr-3 font-normal';
const headRow = 'border-b border-rule text-xs text-ink-soft dark:border-night-rule dark:text-night-ink-soft';
const bodyRow = (marked: boolean) => cn('border-b border-rule/60 align-top last:border-0 dark:border-night-rule/60', marked && 'bg-note-soft/40 dark:bg-note/10');

/** Every figure of the two options in two columns, the differences in a third. */
export function FiguresComparison({ rows, nameA, nameB }: { rows: FigureRow[]; nameA: string; nameB: string }) {
  return (
    // Focusable, so a keyboard can scroll it sideways on a narrow screen.
    <div className="relative overflow-x-auto" tabIndex={0} role="group" aria-label="Figures, side A and side B">
      <table className="w-full text-sm">
        <caption className="sr-only">Figures of side A and side B, with what differs</caption>
        <thead>
          <tr className={headRow}>
            <th scope="col" className={cn(HEAD, 'text-left')}>
              Figure
            </th>
            <th scope="col" className={cn(HEAD, 'text-right')}>
              {nameA}
            </th>
            <th scope="col" className={cn(HEAD, 'text-right')}>
              {nameB}
            </th>
            <th scope="col" className={cn(HEAD, 'text-left')}>
              Difference
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.key} data-figure={row.key} data-marked={row.marks.length > 0 || undefined} className={bodyRow(row.marks.length > 0)}>
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                <span className="block font-medium">{row.title}</span>
                {row.sub && <span className="block text-xs text-ink-soft dark:text-night-ink-soft">{row.sub}</span>}
              </th>
              <td className="py-1.5 pr-3 text-right">
                <FigureCell text={row.textA} standing={row.standingA ?? undefined} />
              </td>
              <td className="py-1.5 pr-3 text-right">
                <FigureCell text={row.textB} standing={row.standingB ?? undefined} />
              </td>
              <td className="min-w-32 py-1.5 text-xs sm:whitespace-nowrap">
                <DifferenceMarks marks={row.marks} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function CheckSide({ row, side }: { row: CheckRow; side: 'a' | 'b' }) {
  const check = row[side];
  const verdict = side === 'a' ? row.verdictA : row.verdictB;
  const margin = side === 'a' ? row.marginTextA : row.marginTextB;
  if (!check || !verdict) return <span className="text-ink-soft dark:text-night-ink-soft">not checked</span>;
  return (
    <div className="min-w-48">
      <div className="flex flex-wrap items-center gap-x-2">
        <Verdict kind={verdict} />
        <span className="tabular-nums whitespace-nowrap">{margin ?? '—'}</span>
      </div>
      <p className="mt-0.5 text-xs text-ink-soft dark:text-night-ink-soft">{check.reason}</p>
    </div>
  );
}

/** Every check of either option: each side's verdict, margin and reason, the differences in a fourth column. */
export function ChecksComparison({ rows, nameA, nameB }: { rows: CheckRow[]; nameA: string; nameB: string }) {
  return (
    <div className="relative overflow-x-auto" tabIndex={0} role="group" aria-label="Checks, side A and side B">
      <table className="w-full text-sm">
        <caption className="sr-only">Checks of side A and side B: verdict, margin and reason, with what differs</caption>
        <thead>
          <tr className={headRow}>
            <th scope="col" className={cn(HEAD, 'text-left')}>
              Check
            </th>
            <th scope="col" className={cn(HEAD, 'text-left')}>
              {nameA}
            </th>
            <th scope="col" className={cn(HEAD, 'text-left')}>
              {nameB}
            </th>
            <th scope="col" className={cn(HEAD, 'text-left')}>
              Difference
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.rule} data-rule={row.rule} data-marked={row.marks.length > 0 || undefined} className={bodyRow(row.marks.length > 0)}>
              <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                <span className="block font-medium">{row.title}</span>
                <span className="block text-xs text-ink-soft dark:text-night-ink-soft">
                  {row.severity} · <code className="font-mono whitespace-nowrap">{row.rule}</code>
                </span>
              </th>
              <td className="py-1.5 pr-3">
                <CheckSide row={row} side="a" />
              </td>
              <td className="py-1.5 pr-3">
                <CheckSide row={row} side="b" />
              </td>
              <td className="min-w-32 py-1.5 text-xs sm:whitespace-nowrap">
                <DifferenceMarks marks={row.marks} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
