import { useQuery } from '@tanstack/react-query';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Sheet } from '../../../components/ui/sheet';
import { StateBadge } from '../../../components/ui/state-badge';
import type { AuditEvent } from '#shared/api/admin';
import type { Proposal } from '#shared/api/proposals';
import { proposalAuditQuery, proposalQuery } from '../api/proposal-queries';
import { describeEvent } from './audit/describe-event';
import { usePersonName } from './audit/use-person-name';
import { When } from './audit/when';

/** The proposal's audit trail, oldest first, with actors and what changed. */
export function AuditTimeline({ proposalId }: { proposalId: number }) {
  const audit = useQuery(proposalAuditQuery(proposalId));
  const { data: proposal } = useQuery(proposalQuery(proposalId));
  return (
    <Sheet title="Record" aria-label="Record of this proposal">
      {audit.isPending ? (
        <Loading what="Loading the record" />
      ) : audit.isError ? (
        <ErrorPanel error={audit.error} retry={() => void audit.refetch()} />
      ) : audit.data.items.length === 0 ? (
        <EmptyState title="Nothing recorded yet" />
      ) : (
        <Timeline events={audit.data.items} proposal={proposal} />
      )}
    </Sheet>
  );
}

function Timeline({ events, proposal }: { events: AuditEvent[]; proposal: Proposal | undefined }) {
  const nameOf = usePersonName(proposal?.projectId ?? events[0]?.projectId ?? 0);
  return (
    <ol className="relative ml-2 border-l border-rule dark:border-night-rule" aria-label="Events, oldest first">
      {events.map((event) => {
        const words = describeEvent(event, proposal);
        return (
          <li key={event.id} className="relative pb-5 pl-5 last:pb-0">
            <span aria-hidden="true" className="absolute top-1.5 -left-[5px] h-2.5 w-2.5 rounded-full border-2 border-fern bg-sheet dark:border-fern-soft dark:bg-night-sheet" />
            <p className="text-xs text-ink-soft dark:text-night-ink-soft">
              <When iso={event.at} />
            </p>
            <p className="text-sm">
              <span className="font-medium">{nameOf(event.actorId)}</span> {words.what}
            </p>
            {words.quote && (
              <p className="mt-1 text-sm">
                <span className="text-ink-soft dark:text-night-ink-soft">{words.quote.label}: </span>
                <q className="whitespace-pre-line">{words.quote.text}</q>
              </p>
            )}
            {words.note && <p className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">{words.note}</p>}
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
          </li>
        );
      })}
    </ol>
  );
}
