/**
 * An audit event in plain words, the one wording of the record: the proposal's timeline, the
 * printed report, a project's activity page and its CSV export all say an event this way. The
 * event keeps ids and states; the words it quotes (a decision's reason, a review's comment) come
 * from the records the caller passes beside it.
 */
import type { EventRecords } from '../api/activity';
import type { AuditEvent } from '../api/admin';
import { topologyName } from '../engine/topologies';
import { formatDb } from '../units/figures';
import { formatQuantity } from '../units/format-quantity';
import type { ProposalState } from '../workflow/proposal-states';
import { anchorOfDetails, anchorWords } from '../workflow/comments';

export type { EventRecords };

export interface EventWords {
  /** What happened, after the actor's name: "decided: own values (Degenerated mirror)". */
  what: string;
  /** The words kept with it, labelled: a reason, a comment or a change note. */
  quote?: { label: string; text: string };
  /** A fact worth a line of its own (the server's verdict on an override). */
  note?: string;
  from?: ProposalState;
  to?: ProposalState;
}

/** What the words need besides the event: the records it quotes, and whether the proposal's ranking recommends nothing. */
export type EventContext = EventRecords;

const DECIDED_WORDS: Record<string, (topology: string) => string> = {
  accept: (t) => `decided: accepted the recommendation (${t})`,
  choose: (t) => `decided: chose another ranked option (${t})`,
  override: (t) => `decided: own values (${t})`,
};

const asState = (value: unknown) => (typeof value === 'string' ? (value as ProposalState) : undefined);
const asText = (value: unknown) => (typeof value === 'string' && value.trim() ? value : undefined);
const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** The import's file and row a spec or version came from, when it came from one. */
function importSource(details: Record<string, unknown>): string {
  const source = details.import as { fileName?: unknown; row?: unknown } | undefined;
  if (!source || typeof source !== 'object') return '';
  const file = asText(source.fileName);
  return file ? ` from ${file}${typeof source.row === 'number' ? `, row ${source.row}` : ''}` : '';
}

export function describeEvent(event: AuditEvent, context: EventContext = {}): EventWords {
  const details = event.details;
  const transition = { from: asState(details.from), to: asState(details.to) };
  switch (event.action) {
    case 'spec.created':
      return { what: `wrote the spec (version 1)${importSource(details)}` };
    case 'spec.version-created': {
      const version = typeof details.version === 'number' ? `version ${details.version}` : 'a new version';
      const changes = typeof details.changes === 'number' ? `: ${plural(details.changes, 'field', 'fields')} changed` : '';
      const note = asText(details.note);
      return { what: `wrote ${version} of the spec${importSource(details)}${changes}`, quote: note ? { label: 'Note', text: note } : undefined };
    }
    case 'specs.imported': {
      const file = asText(details.fileName) ?? 'a file';
      const counts = [
        typeof details.created === 'number' && details.created > 0 ? `${details.created} new` : null,
        typeof details['new-version'] === 'number' && details['new-version'] > 0 ? plural(details['new-version'], 'new version', 'new versions') : null,
        typeof details.unchanged === 'number' && details.unchanged > 0 ? `${details.unchanged} unchanged` : null,
      ].filter(Boolean);
      return { what: `imported specs from ${file}${counts.length ? ` (${counts.join(', ')})` : ''}` };
    }
    case 'proposal.ranked': {
      const recommended = typeof details.recommended === 'string' ? topologyName(details.recommended) : null;
      const version = details.specVersion !== undefined ? ` spec version ${String(details.specVersion)}` : ' the spec';
      return {
        what: `asked for a proposal of${version}: ranked by the engine; ${recommended ? `recommended: ${recommended}` : 'no option passes every blocking check, so nothing is recommended'}`,
        to: asState(details.status) ?? 'ranked',
      };
    }
    case 'proposal.decided': {
      const decision = context.decision ?? undefined;
      const kind = typeof details.kind === 'string' ? details.kind : (decision?.kind ?? '');
      const topology = topologyName(typeof details.topology === 'string' ? details.topology : decision?.topology);
      const words = kind === 'choose' && context.nothingRecommended ? `decided: chose a ranked option, none being recommended (${topology})` : (DECIDED_WORDS[kind]?.(topology) ?? `decided (${topology})`);
      const note = kind === 'override' && typeof details.passes === 'boolean' ? (details.passes ? 'The server’s checks: passes every blocking check.' : 'The server’s checks: short on at least one blocking check.') : undefined;
      return { what: words, quote: decision?.reason ? { label: 'Reason', text: decision.reason } : undefined, note, ...transition };
    }
    case 'proposal.returned':
    case 'proposal.approved': {
      const review = context.review ?? undefined;
      const approved = event.action === 'proposal.approved';
      const topology = typeof details.topology === 'string' ? ` (${topologyName(details.topology)}${details.ownValues === true ? ', own values' : ''})` : '';
      const jobId = typeof details.verificationJobId === 'number' ? details.verificationJobId : null;
      const note = !approved
        ? undefined
        : jobId === null
          ? 'Relied on no SPICE verification of this design.'
          : details.staleVerificationAccepted === true
            ? `Relied on SPICE job #${jobId}, which simulated another design; accepted in the comment.`
            : `Relied on SPICE job #${jobId}, which simulated exactly this design.`;
      const open = Array.isArray(details.openComments) ? details.openComments.filter((id): id is number => typeof id === 'number') : [];
      const openNote = open.length > 0 ? `Comments still open when sent back: ${open.map((id) => `#${id}`).join(', ')}.` : undefined;
      return {
        what: approved ? `signed off the decided design${topology}` : `sent the decided design${topology} back for rework`,
        quote: review?.comment ? { label: 'Comment', text: review.comment } : undefined,
        // Reviews recorded before sign-offs kept their verification say nothing about it.
        note: approved && 'verificationJobId' in details ? note : openNote,
        ...transition,
      };
    }
    case 'proposal.superseded': {
      const by = typeof details.byProposal === 'number' ? ` by ranking #${details.byProposal}` : '';
      const versions = typeof details.newerSpecVersion === 'number' ? ` of spec version ${String(details.newerSpecVersion)}` : '';
      return { what: `closed this ranking: the spec moved on and was ranked again${by}${versions}`, ...transition };
    }
    case 'proposal.withdrawn':
      return { what: 'withdrew this ranking', quote: typeof details.reason === 'string' ? { label: 'Reason', text: details.reason } : undefined, ...transition };
    case 'proposal.commented':
    case 'proposal.comment-replied':
    case 'proposal.comment-resolved':
    case 'proposal.comment-reopened': {
      const anchor = anchorOfDetails(details);
      const where = anchor ? anchorWords(anchor) : 'an option';
      const thread = typeof details.threadId === 'number' ? ` #${details.threadId}` : '';
      const body = asText(details.body);
      const words: Record<string, string> = {
        'proposal.commented': `commented (thread${thread}) on ${where}`,
        'proposal.comment-replied': `replied to comment${thread} on ${where}`,
        'proposal.comment-resolved': `resolved comment${thread} on ${where}`,
        'proposal.comment-reopened': `reopened comment${thread} on ${where}`,
      };
      return { what: words[event.action]!, quote: body ? { label: event.action === 'proposal.comment-replied' ? 'Reply' : 'Comment', text: body } : undefined };
    }
    case 'proposal.verification-requested':
      return { what: 'asked for a SPICE check of every option' };
    case 'proposal.verification-withdrawn': {
      const which =
        details.kind === 'monte-carlo'
          ? `the SPICE Monte Carlo of the ${topologyName(typeof details.topology === 'string' ? details.topology : undefined)}`
          : 'the SPICE check of every option';
      return { what: `withdrew ${which} while it was ${details.was === 'simulating' ? 'simulating' : 'waiting'}` };
    }
    case 'proposal.monte-carlo-requested': {
      const runs = typeof details.runs === 'number' ? `${details.runs} runs` : 'runs';
      const own = details.source === 'decision' ? ' decided design, ' : ' ';
      return { what: `asked for a SPICE Monte Carlo of the${own}${topologyName(typeof details.topology === 'string' ? details.topology : undefined)} (${runs})` };
    }
    case 'measurement.uploaded': {
      const quantity = details.kind === 'gain' ? 'gain' : 'rejection';
      const points = typeof details.points === 'number' ? `${details.points} points` : 'points';
      const file = typeof details.fileName === 'string' ? ` from ${details.fileName}` : '';
      const difference = typeof details.differenceFromPredictedDb === 'number' ? details.differenceFromPredictedDb : null;
      const at = typeof details.atFrequencyHz === 'number' ? ` at ${formatQuantity(details.atFrequencyHz, 'Hz')}` : '';
      const note =
        difference === null
          ? undefined
          : `Measured ${Math.abs(difference) < 0.05 ? 'level with' : `${formatDb(Math.abs(difference))} ${difference < 0 ? 'below' : 'above'}`} the prediction${at} (an estimate).`;
      return { what: `uploaded a bench measurement of ${quantity} (${points}${file}) for the ${topologyName(typeof details.topology === 'string' ? details.topology : undefined)}`, note };
    }
    default:
      return { what: event.action.replace(/[.-]/g, ' '), ...transition };
  }
}
