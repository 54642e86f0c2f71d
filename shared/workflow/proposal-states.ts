/**
 * The life of a proposal: ranked by the engine, decided by a designer, then approved or
 * returned by a reviewer; a returned proposal goes back to the designer for a new decision.
 * Pure: the server checks every transition here, the browser shows what is allowed now.
 */
export const PROPOSAL_STATES = ['ranked', 'decided', 'approved', 'returned'] as const;
export type ProposalState = (typeof PROPOSAL_STATES)[number];

export type ProposalEvent = 'decide' | 'approve' | 'return';

const TRANSITIONS: Record<ProposalState, Partial<Record<ProposalEvent, ProposalState>>> = {
  ranked: { decide: 'decided' },
  decided: { approve: 'approved', return: 'returned' },
  returned: { decide: 'decided' },
  approved: {},
};

/** Each state's name as the app, the e-mails and the exported files write it (one vocabulary). */
export const STATE_WORDS: Record<ProposalState, string> = {
  ranked: 'Awaiting decision',
  decided: 'Awaiting review',
  returned: 'Returned to designer',
  approved: 'Approved',
};

/** Plain words for what each state waits for. */
export const STATE_DESCRIPTIONS: Record<ProposalState, string> = {
  ranked: 'ranked by the engine, waiting for a designer’s decision',
  decided: 'decided, waiting for a reviewer',
  approved: 'approved: the record is closed',
  returned: 'returned by a reviewer, waiting for a new decision',
};

/** The state after an event, or null when the event is not allowed in that state. */
export function nextState(state: ProposalState, event: ProposalEvent): ProposalState | null {
  return TRANSITIONS[state][event] ?? null;
}

/** The events allowed in a state. */
export function allowedEvents(state: ProposalState): ProposalEvent[] {
  return Object.keys(TRANSITIONS[state]) as ProposalEvent[];
}
