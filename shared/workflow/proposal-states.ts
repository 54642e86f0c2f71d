/**
 * The life of a proposal: ranked by the engine, decided by a designer, then approved or
 * returned by a reviewer; a returned proposal goes back to the designer for a new decision.
 * Two ways out besides approval: a ranking still open when its spec gets a newer ranked
 * version is closed as superseded (by the server, never by a person), and its author or a
 * designer can withdraw an open one with a reason.
 * Pure: the server checks every transition here, the browser shows what is allowed now.
 */
export const PROPOSAL_STATES = ['ranked', 'decided', 'approved', 'returned', 'superseded', 'withdrawn'] as const;
export type ProposalState = (typeof PROPOSAL_STATES)[number];

export type ProposalEvent = 'decide' | 'approve' | 'return' | 'withdraw' | 'supersede';

/**
 * Superseding closes what still waits for a designer (ranked, returned): nobody should decide
 * against an old spec. A decision waiting for review stays open: a designer's considered work is
 * not thrown away by a spec edit; the reviewer sees that the spec moved on and can return it.
 */
const TRANSITIONS: Record<ProposalState, Partial<Record<ProposalEvent, ProposalState>>> = {
  ranked: { decide: 'decided', withdraw: 'withdrawn', supersede: 'superseded' },
  decided: { approve: 'approved', return: 'returned', withdraw: 'withdrawn' },
  returned: { decide: 'decided', withdraw: 'withdrawn', supersede: 'superseded' },
  approved: {},
  superseded: {},
  withdrawn: {},
};

/** Each state's name as the app, the e-mails and the exported files write it (one vocabulary). */
export const STATE_WORDS: Record<ProposalState, string> = {
  ranked: 'Awaiting decision',
  decided: 'Awaiting review',
  returned: 'Returned to designer',
  approved: 'Approved',
  superseded: 'Closed: spec moved on',
  withdrawn: 'Withdrawn',
};

/** Events the server takes on its own; never offered to a person. */
const SYSTEM_EVENTS: readonly ProposalEvent[] = ['supersede'];

/** The states a ranking may be superseded from (open, waiting for a designer). */
export const SUPERSEDABLE_STATES: readonly ProposalState[] = (Object.keys(TRANSITIONS) as ProposalState[]).filter((s) => TRANSITIONS[s].supersede);

/** States in which the record is closed for good. */
export const CLOSED_STATES: readonly ProposalState[] = (Object.keys(TRANSITIONS) as ProposalState[]).filter((s) => Object.keys(TRANSITIONS[s]).length === 0);

/** Plain words for what each state waits for. */
export const STATE_DESCRIPTIONS: Record<ProposalState, string> = {
  ranked: 'ranked by the engine, waiting for a designer’s decision',
  decided: 'decided, waiting for a reviewer',
  approved: 'approved: the record is closed',
  returned: 'returned by a reviewer, waiting for a new decision',
  superseded: 'closed: a newer version of the spec was ranked',
  withdrawn: 'withdrawn with a reason: the record is closed',
};

/** The state after an event, or null when the event is not allowed in that state. */
export function nextState(state: ProposalState, event: ProposalEvent): ProposalState | null {
  return TRANSITIONS[state][event] ?? null;
}

/** The events a person may take in a state (the server's own events left out). */
export function allowedEvents(state: ProposalState): ProposalEvent[] {
  return (Object.keys(TRANSITIONS[state]) as ProposalEvent[]).filter((e) => !SYSTEM_EVENTS.includes(e));
}
