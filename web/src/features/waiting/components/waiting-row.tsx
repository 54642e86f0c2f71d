import { Link } from 'react-router-dom';
import type { WaitingItem } from '#shared/api/waiting';
import type { WaitingKind } from '#shared/workflow/waiting';
import { rowLink } from '../../../components/ui/dense-table';
import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/dates';
import { formatAge } from '../../../lib/format-when';

const soft = 'text-ink-soft dark:text-night-ink-soft';

/** Who put the item there, in words after their name. */
const BY_WORDS: Record<WaitingKind, string> = {
  decide: 'Asked for by',
  rework: 'Sent back by',
  review: 'Decided by',
  rank: 'Written by',
};

/** One waiting item: how long it has waited, what it is (a link to it) and in which project, and who put it there. */
export function WaitingRow({ item }: { item: WaitingItem }) {
  const target = item.proposalId === null ? paths.spec.href(item.spec.id) : paths.proposal.href(item.proposalId);
  const name = item.proposalId === null ? item.spec.title : `#${item.proposalId} ${item.spec.title}`;
  return (
    <li className="relative grid gap-x-4 gap-y-0.5 border-b border-rule/70 px-1 py-2 last:border-b-0 hover:bg-paper sm:grid-cols-[9.5rem_minmax(0,1fr)_minmax(0,15rem)] sm:items-baseline dark:border-night-rule/70 dark:hover:bg-night">
      <p className={`order-3 text-xs tabular-nums sm:order-none ${soft}`}>
        waiting{' '}
        <time dateTime={item.since} title={`Since ${formatDateTime(item.since)}`} className="text-ink sm:text-sm dark:text-night-ink">
          {formatAge(item.since)}
        </time>
      </p>
      <div className="min-w-0">
        <Link to={target} className={`${rowLink} break-words`}>
          {name}
          <span className={`ml-1.5 text-xs font-normal tabular-nums ${soft}`}>v{item.spec.version}</span>
        </Link>
        <p className={`truncate text-xs ${soft}`}>{item.project.name}</p>
      </div>
      <p className={`text-xs ${soft}`}>
        {item.by ? `${BY_WORDS[item.kind]} ${item.by.displayName}` : null}
        {item.yours && <span className="ml-1.5 inline-block rounded-sm border border-rule px-1 whitespace-nowrap text-ink sm:mt-0.5 sm:ml-0 sm:block sm:w-fit dark:border-night-rule dark:text-night-ink">your decision</span>}
      </p>
    </li>
  );
}
