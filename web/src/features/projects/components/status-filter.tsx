import { STATE_LABELS, StateGlyph } from '../../../components/ui/state-badge';
import { cn } from '../../../lib/cn';
import { PROPOSAL_FILTERS, type ProposalFilter } from '../utils/proposal-filter';

const FILTER_WORDS: Record<ProposalFilter, string> = {
  all: 'All',
  ranked: STATE_LABELS.ranked.label,
  decided: STATE_LABELS.decided.label,
  returned: STATE_LABELS.returned.label,
  approved: STATE_LABELS.approved.label,
  superseded: STATE_LABELS.superseded.label,
  withdrawn: STATE_LABELS.withdrawn.label,
};

/**
 * A segmented control over native radio buttons: one tab stop, arrow keys move between the
 * segments, and screen readers announce "Show proposals, radio group".
 */
export function StatusFilter({ value, onChange }: { value: ProposalFilter; onChange: (status: ProposalFilter) => void }) {
  return (
    <fieldset className="inline-flex flex-wrap rounded-md border border-rule bg-paper p-0.5 dark:border-night-rule dark:bg-night">
      <legend className="sr-only">Show proposals</legend>
      {PROPOSAL_FILTERS.map((status) => (
        <label
          key={status}
          className={cn(
            'relative cursor-pointer rounded px-2.5 py-1 text-sm whitespace-nowrap has-focus-visible:outline-2 has-focus-visible:outline-fern dark:has-focus-visible:outline-fern-soft',
            status === value
              ? 'bg-sheet font-medium text-fern shadow-sm dark:bg-night-sheet dark:text-fern-bright'
              : 'text-ink-soft hover:text-ink dark:text-night-ink-soft dark:hover:text-night-ink',
          )}
        >
          <input type="radio" name="proposal-status" value={status} checked={status === value} onChange={() => onChange(status)} className="sr-only" />
          {status !== 'all' && (
            <StateGlyph glyph={STATE_LABELS[status].glyph} className="mr-1 inline-block align-[-0.1em]" />
          )}
          {FILTER_WORDS[status]}
        </label>
      ))}
    </fieldset>
  );
}
