/**
 * A project's activity (its audit events) as CSV, RFC 4180, through the ranking table's field
 * writer: every text cell on one line and safe from a spreadsheet's formulas (a name, a title, a
 * reason or a file name starting with =, +, - or @ gets a leading apostrophe). One row per event,
 * with the event in the app's words beside its stored action and details.
 */
import type { ActivityEvent } from '../api/activity';
import { describeEvent } from '../text/audit-words';
import { ACTIVITY_KIND_WORDS, activityKindOf } from '../workflow/activity';
import { csvField } from './ranking-csv';

export const ACTIVITY_CSV_HEADER = ['event_id', 'at_utc', 'person_id', 'person', 'kind', 'action', 'spec_id', 'spec_title', 'proposal_id', 'what', 'quoted', 'details_json'] as const;

/** The header line. */
export function activityCsvHeader(): string {
  return `${ACTIVITY_CSV_HEADER.join(',')}\r\n`;
}

/** One line per event, in the order given (each ending in CR LF). */
export function activityCsvRows(events: readonly ActivityEvent[]): string {
  return events
    .map((event) => {
      const words = describeEvent(event, event.records);
      const kind = activityKindOf(event.action);
      const values = [
        event.id,
        event.at,
        event.actorId,
        event.actor?.displayName ?? (event.actorId === null ? 'the system' : `user #${event.actorId}`),
        kind ? ACTIVITY_KIND_WORDS[kind] : '',
        event.action,
        event.spec?.id,
        event.spec?.title,
        event.proposalId,
        words.what,
        words.quote ? `${words.quote.label}: ${words.quote.text}` : '',
        JSON.stringify(event.details),
      ];
      return `${values.map(csvField).join(',')}\r\n`;
    })
    .join('');
}
