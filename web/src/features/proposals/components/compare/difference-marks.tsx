import { markWords, type DifferenceMark } from '../../lib/comparison';

/** A row's differences: each a symbol and its words (never colour alone); "same" when nothing differs. */
export function DifferenceMarks({ marks }: { marks: readonly DifferenceMark[] }) {
  if (marks.length === 0) return <span className="text-ink-soft dark:text-night-ink-soft">same</span>;
  return (
    <ul className="space-y-0.5">
      {marks.map((mark) => {
        const { symbol, words } = markWords(mark);
        const loud = mark.kind === 'verdict' || mark.kind === 'sign';
        return (
          <li key={mark.kind} data-mark={mark.kind} className={loud ? 'font-medium text-note dark:text-note-bright' : undefined}>
            <span aria-hidden="true" className="mr-1 inline-block w-3 text-center">
              {symbol}
            </span>
            {words}
          </li>
        );
      })}
    </ul>
  );
}

/** The key under the tables: what each symbol means and the threshold a figure must move by. */
export function DifferenceKey({ movedPercent }: { movedPercent: string }) {
  return (
    <p className="mt-2 text-xs text-ink-soft dark:text-night-ink-soft">
      <span aria-hidden="true">≠</span> a check’s verdict changed · <span aria-hidden="true">Δ</span> a figure moved by more than {movedPercent} of the larger of the two ·{' '}
      <span aria-hidden="true">⇅</span> a margin changed sign (crossed its limit) · <span aria-hidden="true">∅</span> on one side only · margins are + on the safe side
    </p>
  );
}
