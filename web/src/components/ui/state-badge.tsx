/**
 * Proposal states in the app's own look: a square-cornered tag with a rule of the state's tone
 * down its left edge, a small drawn mark of its own for each state, and the state's word. The
 * look is data: one entry per state in STATE_LABELS (word, mark, tone), so a new state is a new
 * entry. The mark is a shape of STATE_MARKS, or any single character for a plain badge; it is
 * hidden from assistive technology, which reads the word.
 */
import type { ReactNode } from 'react';
import { STATE_WORDS, type ProposalState } from '#shared/workflow/proposal-states';
import { cn } from '../../lib/cn';

/** Marks drawn for states (12 × 12 units, in currentColor). */
export const STATE_MARKS = {
  /** Waiting for a decision: one line meeting a fork, two ways to go. */
  fork: (
    <>
      <path d="M1.5 6h4.5" />
      <path d="M6 6l4.5-3.5M6 6l4.5 3.5" />
      <circle cx="10.5" cy="2.5" r="1.1" fill="currentColor" stroke="none" />
      <circle cx="10.5" cy="9.5" r="1.1" fill="currentColor" stroke="none" />
    </>
  ),
  /** Waiting for review: a beam on a post with two pans, the decision being weighed. */
  beam: (
    <>
      <path d="M6 2v8.5M3.5 10.5h5M1.5 3.5h9" />
      <path d="M1.5 3.5l-1 3h2zM10.5 3.5l-1 3h2z" fill="currentColor" />
    </>
  ),
  /** Returned: a hooked arrow turning back. */
  hook: (
    <>
      <path d="M10.5 2.5v3.5a2.5 2.5 0 0 1-2.5 2.5H2" />
      <path d="M4.5 6L2 8.5 4.5 11" />
    </>
  ),
  /** Approved: a tick on a solid diamond. */
  stamp: (
    <>
      <path d="M6 .5L11.5 6 6 11.5.5 6z" fill="currentColor" stroke="none" />
      <path d="M3.6 6.1l1.7 1.7 3.2-3.4" stroke="var(--badge-knockout)" strokeWidth="1.5" />
    </>
  ),
  /** Closed because the spec moved on: a line stepping up to a newer level. */
  onward: (
    <>
      <path d="M1.5 9.5h3.5v-6h5.5" />
      <path d="M8.5 1.5l2 2-2 2" />
    </>
  ),
  /** Withdrawn: a ring with a bar across, taken out of the flow. */
  lifted: (
    <>
      <circle cx="6" cy="6" r="4.5" />
      <path d="M3.5 6h5" />
    </>
  ),
} satisfies Record<string, ReactNode>;

export type StateMark = keyof typeof STATE_MARKS;

/** Tones: the text colour and the left rule, light and dark. */
export const STATE_TONES = {
  accent: 'text-fern border-l-fern dark:text-fern-bright dark:border-l-fern-bright',
  note: 'text-note border-l-note dark:text-note-bright dark:border-l-note-bright',
  short: 'text-short border-l-short dark:text-short-bright dark:border-l-short-bright',
  holds: 'text-holds border-l-holds dark:text-holds-bright dark:border-l-holds-bright',
  quiet: 'text-ink-soft border-l-ink-soft dark:text-night-ink-soft dark:border-l-night-ink-soft',
} as const;

export type StateTone = keyof typeof STATE_TONES;

export interface StateLook {
  /** The state's word, as every screen, e-mail and report writes it. */
  label: string;
  /** A drawn mark of STATE_MARKS, or a single character for a plain badge. */
  glyph: StateMark | (string & {});
  tone: StateTone;
  /** The tone's classes (text colour and rule), for links and filters drawn like the badge. */
  className: string;
}

const look = (label: string, glyph: StateLook['glyph'], tone: StateTone): StateLook => ({ label, glyph, tone, className: STATE_TONES[tone] });

/** Names the app uses for proposal states, with a mark and a tone each. */
export const STATE_LABELS: Record<ProposalState, StateLook> = {
  ranked: look(STATE_WORDS.ranked, 'fork', 'accent'),
  decided: look(STATE_WORDS.decided, 'beam', 'note'),
  returned: look(STATE_WORDS.returned, 'hook', 'short'),
  approved: look(STATE_WORDS.approved, 'stamp', 'holds'),
  superseded: look(STATE_WORDS.superseded, 'onward', 'quiet'),
  withdrawn: look(STATE_WORDS.withdrawn, 'lifted', 'quiet'),
};

/** A state's mark alone (hidden from assistive technology: the word goes beside it). */
export function StateGlyph({ glyph, className }: { glyph: StateLook['glyph']; className?: string }) {
  if (glyph in STATE_MARKS) {
    return (
      <svg
        viewBox="0 0 12 12"
        aria-hidden="true"
        data-mark={glyph}
        className={cn('h-3 w-3 shrink-0 overflow-visible', className)}
        fill="none"
        stroke="currentColor"
        strokeWidth="1.3"
        strokeLinecap="round"
        strokeLinejoin="round"
      >
        {STATE_MARKS[glyph as StateMark]}
      </svg>
    );
  }
  return (
    <span aria-hidden="true" className={className}>
      {glyph}
    </span>
  );
}

export function StateBadge({ state }: { state: ProposalState }) {
  const look = STATE_LABELS[state];
  return (
    <span
      data-state={state}
      className={cn(
        'inline-flex items-center gap-1.5 rounded-sm border border-l-[3px] border-rule bg-sheet py-0.5 pr-2 pl-1.5 text-xs font-medium whitespace-nowrap dark:border-night-rule dark:bg-night-sheet',
        look.className,
      )}
    >
      <StateGlyph glyph={look.glyph} />
      {look.label}
    </span>
  );
}
