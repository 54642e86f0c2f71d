import { cn } from '../../lib/cn';

export type VerdictKind = 'holds' | 'short' | 'note' | 'not-applicable' | 'undecided';

const LOOK: Record<VerdictKind, { word: string; glyph: string; className: string }> = {
  holds: { word: 'Holds', glyph: '✓', className: 'bg-holds-soft text-holds dark:bg-holds/25 dark:text-holds-bright' },
  short: { word: 'Short', glyph: '✕', className: 'bg-short-soft text-short dark:bg-short/25 dark:text-short-bright' },
  note: { word: 'Note', glyph: '!', className: 'bg-note-soft text-note dark:bg-note/25 dark:text-note-bright' },
  'not-applicable': { word: 'n/a', glyph: '–', className: 'bg-paper text-ink-soft dark:bg-night dark:text-night-ink-soft' },
  undecided: { word: 'Undecided', glyph: '?', className: 'bg-paper text-ink-soft dark:bg-night dark:text-night-ink-soft' },
};

/** The status language: a word and a glyph with the colour, never colour alone. */
export function Verdict({ kind, label, className }: { kind: VerdictKind; label?: string; className?: string }) {
  const look = LOOK[kind];
  return (
    <span className={cn('inline-flex items-center gap-1 rounded px-1.5 py-0.5 text-xs font-medium whitespace-nowrap', look.className, className)}>
      <span aria-hidden="true">{look.glyph}</span>
      {label ?? look.word}
    </span>
  );
}

/** The verdict of one check: blocking failures are "short", advisory failures a "note". */
export function checkVerdict(check: { passed: boolean; severity: string; applicable?: boolean; evaluated?: boolean }): VerdictKind {
  if (check.evaluated === false) return 'undecided';
  if (check.applicable === false) return 'not-applicable';
  if (check.passed) return 'holds';
  return check.severity === 'blocking' ? 'short' : 'note';
}

/** What an option's verdict is read from: whether it passes, how many blocking checks it is short on, whether it could be solved. */
export interface OptionStanding {
  passes: boolean;
  blockingShortCount: number;
  unsolved?: boolean;
}

/**
 * The one wording of an option's verdict, on the page, in panels and in the report: "Passes" /
 * "Short · 2 blocking" in tables, "Passes every blocking check" / "Short on 2 blocking checks"
 * in sentences, "Not solved" when the stage could not be solved.
 */
export function optionVerdictWords(option: OptionStanding, form: 'table' | 'sentence' = 'table'): { kind: VerdictKind; label: string } {
  if (option.unsolved) return { kind: 'undecided', label: 'Not solved' };
  if (option.passes) return { kind: 'holds', label: form === 'table' ? 'Passes' : 'Passes every blocking check' };
  const n = option.blockingShortCount;
  return { kind: 'short', label: form === 'table' ? `Short · ${n} blocking` : `Short on ${n} blocking check${n === 1 ? '' : 's'}` };
}

/** An option's verdict in the status language (optionVerdictWords). */
export function OptionVerdict({ option, form = 'table', className }: { option: OptionStanding; form?: 'table' | 'sentence'; className?: string }) {
  const { kind, label } = optionVerdictWords(option, form);
  return <Verdict kind={kind} label={label} className={className} />;
}
