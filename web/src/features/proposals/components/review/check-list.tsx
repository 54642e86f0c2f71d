import type { Check } from '#shared/engine/types';
import { checkVerdict, Verdict, type VerdictKind } from '../../../../components/ui/verdict';
import { formatMargin } from '#shared/units/figures';
import { checkTitle } from '../../../../lib/checks';

/** Failures first, so what stops an option is read before what holds; the rule order otherwise. */
const ORDER: Record<VerdictKind, number> = { short: 0, undecided: 1, note: 2, holds: 3, 'not-applicable': 4 };

/** The signed margin in the ranking's own format ("+17.8 dB", "−13.2 dB"); an em dash when the rule reports none. */
export function marginText(check: Check): string {
  if (check.margin === null || check.margin === undefined || !Number.isFinite(check.margin)) return '—';
  return formatMargin(check.margin, check.marginUnit);
}

/** How many checks came out each way, in words: "11 hold, 1 short, 2 notes". */
export function checkTally(checks: Check[]): string {
  const count = (kind: VerdictKind) => checks.filter((c) => checkVerdict(c) === kind).length;
  const parts = [
    [count('holds'), 'hold'],
    [count('short'), 'short (blocking)'],
    [count('note'), count('note') === 1 ? 'note' : 'notes'],
    [count('undecided'), 'undecided'],
    [count('not-applicable'), 'not applicable'],
  ] as const;
  return parts.filter(([n]) => n > 0).map(([n, word]) => `${n} ${word}`).join(', ');
}

/**
 * On a phone a check's row stacks: verdict, name and margin on one line, the reason below across
 * the full width (so the reason is not squeezed into a narrow column). Roles are explicit, so the
 * table stays a table for assistive technology whatever the display.
 */
export const CHECK_ROW_STACK = {
  head: 'max-sm:sr-only',
  row: 'max-sm:grid max-sm:grid-cols-[auto_minmax(0,1fr)_auto] max-sm:gap-x-2',
  name: 'sm:whitespace-nowrap',
  reason: 'max-sm:col-span-3 max-sm:col-start-1 max-sm:row-start-2 max-sm:pt-0 max-sm:pr-0',
} as const;

/** Every check of an option with its verdict, the rule's reason and the margin it compared (names and margins as the ranking shows them). */
export function CheckList({ checks, caption }: { checks: Check[]; caption: string }) {
  const sorted = [...checks].sort((a, b) => ORDER[checkVerdict(a)] - ORDER[checkVerdict(b)]);
  return (
    <table role="table" className="w-full text-sm">
      <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">
        {caption} — {checkTally(checks)}. Margin is how far on the good side; negative when short.
      </caption>
      <thead role="rowgroup" className={`text-left text-xs text-ink-soft dark:text-night-ink-soft ${CHECK_ROW_STACK.head}`}>
        <tr role="row">
          <th role="columnheader" scope="col" className="py-1 pr-3 font-normal">Verdict</th>
          <th role="columnheader" scope="col" className="py-1 pr-3 font-normal">Check</th>
          <th role="columnheader" scope="col" className="py-1 pr-3 font-normal">Why</th>
          <th role="columnheader" scope="col" className="py-1 text-right font-normal">Margin</th>
        </tr>
      </thead>
      <tbody role="rowgroup">
        {sorted.map((check) => (
          <tr key={check.rule} role="row" className={`border-t border-rule/60 align-top dark:border-night-rule/60 ${CHECK_ROW_STACK.row}`}>
            <td role="cell" className="py-1.5 pr-3">
              <Verdict kind={checkVerdict(check)} />
            </td>
            <th role="rowheader" scope="row" className={`py-1.5 pr-3 text-left font-medium ${CHECK_ROW_STACK.name}`}>
              {checkTitle(check)}
              <span className="block text-xs font-normal text-ink-soft dark:text-night-ink-soft">
                {check.severity} · <code className="font-mono">{check.rule}</code>
              </span>
            </th>
            <td role="cell" className={`py-1.5 pr-3 ${CHECK_ROW_STACK.reason}`}>
              {check.reason}
            </td>
            <td role="cell" className="py-1.5 text-right tabular-nums whitespace-nowrap">
              {marginText(check)}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
