import type { Check } from '#shared/engine/types';
import { checkVerdict, Verdict, type VerdictKind } from '../../../../components/ui/verdict';
import { formatMargin } from '#shared/units/figures';
import { checkTitle } from '../../../../lib/checks';
import { CHECK_ROW_STACK } from '../review/check-list';
import { CommentMark } from '../comments/comments-context';

/** Failures first, then undecided, advisory notes, holds, and the checks that do not apply. */
const ORDER: Record<VerdictKind, number> = { short: 0, undecided: 1, note: 2, holds: 3, 'not-applicable': 4 };

/** Every check of the option with its verdict, reason and signed margin. */
export function ChecksTable({ checks, topology }: { checks: Check[]; /** The option's topology: each row then offers comments on its check (on the proposal page). */ topology?: string }) {
  const ordered = checks.map((check) => ({ check, kind: checkVerdict(check) })).sort((a, b) => ORDER[a.kind] - ORDER[b.kind]);
  return (
    <div className="relative overflow-x-auto">
      <table role="table" className="w-full text-sm">
        <caption className="sr-only">Checks of this option, failures first</caption>
        <thead role="rowgroup" className={`text-xs text-ink-soft dark:text-night-ink-soft ${CHECK_ROW_STACK.head}`}>
          <tr role="row" className="border-b border-rule dark:border-night-rule">
            <th role="columnheader" scope="col" className="py-1 pr-3 text-left font-normal">
              Verdict
            </th>
            <th role="columnheader" scope="col" className="py-1 pr-3 text-left font-normal">
              Check
            </th>
            <th role="columnheader" scope="col" className="py-1 pr-3 text-left font-normal">
              Why
            </th>
            <th role="columnheader" scope="col" className="py-1 text-right font-normal">
              Margin
            </th>
          </tr>
        </thead>
        <tbody role="rowgroup">
          {ordered.map(({ check, kind }) => (
            <tr key={check.rule} role="row" className={`border-b border-rule/60 align-top last:border-0 dark:border-night-rule/60 ${CHECK_ROW_STACK.row}`}>
              <td role="cell" className="py-1.5 pr-3">
                <Verdict kind={kind} />
              </td>
              <th role="rowheader" scope="row" className="py-1.5 pr-3 text-left font-normal">
                <span className={`block font-medium ${CHECK_ROW_STACK.name}`}>{checkTitle(check)}</span>
                <span className="block text-xs text-ink-soft dark:text-night-ink-soft">
                  {check.severity} · <code className="font-mono whitespace-nowrap">{check.rule}</code>
                </span>
                {topology && <CommentMark anchor={{ kind: 'check', topology, checkId: check.rule }} className="mt-1" />}
              </th>
              <td role="cell" className={`py-1.5 pr-3 ${CHECK_ROW_STACK.reason}`}>
                {check.reason}
              </td>
              <td role="cell" className="py-1.5 text-right whitespace-nowrap tabular-nums">
                {check.margin === null || check.margin === undefined ? <span className="text-ink-soft dark:text-night-ink-soft">—</span> : formatMargin(check.margin, check.marginUnit)}
                {check.thinMargin && (
                  <span className="mt-0.5 block text-xs font-medium text-note dark:text-note-bright" title="Passes by less than 1 dB at the governing corner: a resistor drift or a slightly different transistor could tip it.">
                    <span aria-hidden="true">▵ </span>thin margin
                  </span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
