import { STATE_LABELS } from '../../../../components/ui/state-badge';
import type { AuditEvent } from '#shared/api/admin';
import type { Proposal } from '#shared/api/proposals';
import { describeEvent } from '../audit/describe-event';
import { formatDateTime, timeZoneWords } from '../../../../lib/dates';

/** The audit trail as a table, oldest first, every time to the second. */
export function ReportAudit({ proposal, events, error, nameOf }: { proposal: Proposal; events: AuditEvent[] | undefined; error: Error | null; nameOf: (id: number | null) => string }) {
  if (error) return <p className="text-sm">The audit trail could not be read: {error.message}</p>;
  if (!events) return <p className="text-sm">Reading the audit trail…</p>;
  if (events.length === 0) return <p className="text-sm">Nothing recorded yet.</p>;
  return (
    <div className="relative overflow-x-auto" tabIndex={0} role="group" aria-label="Audit trail table (scrolls sideways on a narrow screen)">
      <table className="w-full text-sm">
        <caption className="mb-1 text-left text-xs text-ink-soft dark:text-night-ink-soft">Events, oldest first; times in your time zone, {timeZoneWords()}, to the second.</caption>
        <thead className="text-xs text-ink-soft dark:text-night-ink-soft">
          <tr className="border-b border-rule dark:border-night-rule">
            <th scope="col" className="py-1 pr-3 text-left font-medium">When</th>
            <th scope="col" className="py-1 pr-3 text-left font-medium">Who</th>
            <th scope="col" className="py-1 pr-3 text-left font-medium">What</th>
            <th scope="col" className="py-1 text-left font-medium">State</th>
          </tr>
        </thead>
        <tbody>
          {events.map((event) => {
            const words = describeEvent(event, proposal);
            return (
              <tr key={event.id} className="border-b border-rule/60 align-top dark:border-night-rule/60">
                <td className="py-1.5 pr-3 tabular-nums sm:whitespace-nowrap">
                  <time dateTime={event.at}>{formatDateTime(event.at, { seconds: true })}</time>
                </td>
                <td className="py-1.5 pr-3">{nameOf(event.actorId)}</td>
                <td className="py-1.5 pr-3">
                  {words.what}
                  {words.quote && (
                    <span className="mt-0.5 block">
                      <span className="text-ink-soft dark:text-night-ink-soft">{words.quote.label}: </span>
                      <q className="whitespace-pre-line">{words.quote.text}</q>
                    </span>
                  )}
                  {words.note && <span className="mt-0.5 block text-xs text-ink-soft dark:text-night-ink-soft">{words.note}</span>}
                </td>
                <td className="py-1.5 text-xs">
                  {words.to ? (
                    <>
                      {words.from && <>{STATE_LABELS[words.from].label} → </>}
                      {STATE_LABELS[words.to].label}
                    </>
                  ) : (
                    '—'
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
