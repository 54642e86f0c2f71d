import type { ProposalState } from '../../../../shared/workflow/proposal-states';
import { cn } from '../../lib/cn';

/** Names the app uses for proposal states, with a glyph each. */
export const STATE_LABELS: Record<ProposalState, { label: string; glyph: string; className: string }> = {
  ranked: { label: 'Awaiting decision', glyph: '◔', className: 'border-fern/40 text-fern dark:text-fern-bright' },
  decided: { label: 'Awaiting review', glyph: '◑', className: 'border-note/40 text-note dark:text-note-bright' },
  returned: { label: 'Returned to designer', glyph: '↺', className: 'border-short/40 text-short dark:text-short-bright' },
  approved: { label: 'Approved', glyph: '●', className: 'border-holds/40 text-holds dark:text-holds-bright' },
  superseded: { label: 'Closed: spec moved on', glyph: '⤳', className: 'border-rule text-ink-soft dark:border-night-rule dark:text-night-ink-soft' },
  withdrawn: { label: 'Withdrawn', glyph: '–', className: 'border-rule text-ink-soft dark:border-night-rule dark:text-night-ink-soft' },
};

export function StateBadge({ state }: { state: ProposalState }) {
  const look = STATE_LABELS[state];
  return (
    <span className={cn('inline-flex items-center gap-1.5 rounded-full border px-2 py-0.5 text-xs font-medium whitespace-nowrap', look.className)}>
      <span aria-hidden="true">{look.glyph}</span>
      {look.label}
    </span>
  );
}
