import { Link } from 'react-router-dom';
import type { ActivityEvent } from '#shared/api/activity';
import { describeEvent } from '#shared/text/audit-words';
import { StateBadge } from '../../../components/ui/state-badge';
import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/dates';

const soft = 'text-ink-soft dark:text-night-ink-soft';
const link = 'text-fern hover:underline dark:text-fern-bright';

/** One event: when, who and what in words, the spec and proposal it concerns (linked), the words it quotes and the state it moved. */
export function ActivityEntry({ event, viewerId }: { event: ActivityEvent; viewerId: number }) {
  const words = describeEvent(event, event.records);
  const who = event.actor ? `${event.actor.displayName}${event.actor.id === viewerId ? ' (you)' : ''}` : event.actorId === null ? 'The server' : `Person #${event.actorId}`;
  return (
    <li data-action={event.action} className="grid gap-x-4 gap-y-0.5 border-b border-rule/70 py-2.5 last:border-b-0 sm:grid-cols-[11rem_minmax(0,1fr)] dark:border-night-rule/70">
      <p className={`text-xs sm:pt-0.5 ${soft}`}>
        <time dateTime={event.at}>{formatDateTime(event.at)}</time>
      </p>
      <div className="min-w-0 text-sm">
        <p className="break-words">
          <span className="font-medium">{who}</span> {words.what}
        </p>
        {(event.spec || event.proposalId !== null) && (
          <p className={`mt-0.5 flex flex-wrap gap-x-3 text-xs ${soft}`}>
            {event.spec && (
              <Link to={paths.spec.href(event.spec.id)} className={`${link} min-w-0 break-words`}>
                {event.spec.title}
              </Link>
            )}
            {event.proposalId !== null && (
              <Link to={paths.proposal.href(event.proposalId)} className={link}>
                Proposal #{event.proposalId}
              </Link>
            )}
          </p>
        )}
        {words.quote && (
          <p className="mt-1 break-words">
            <span className={soft}>{words.quote.label}: </span>
            <q className="whitespace-pre-line">{words.quote.text}</q>
          </p>
        )}
        {words.note && <p className={`mt-1 text-xs ${soft}`}>{words.note}</p>}
        {words.to && (
          <p className="mt-1.5 flex flex-wrap items-center gap-1.5 text-xs">
            {words.from && (
              <>
                <StateBadge state={words.from} />
                <span aria-hidden="true">→</span>
                <span className="sr-only">to</span>
              </>
            )}
            <StateBadge state={words.to} />
          </p>
        )}
      </div>
    </li>
  );
}
