/**
 * What waits for a person, by the role they hold in each of their projects: rankings to decide
 * and decisions sent back for rework (designers), decisions to review (reviewers), and specs whose
 * latest version has not been ranked yet (systems engineers). Pure data, read by the server's
 * list and by the app's home page and navigation.
 */
import type { ProposalState } from './proposal-states';
import { mayIn, type Action, type ProjectRole } from './roles';

export const WAITING_KINDS = ['decide', 'rework', 'review', 'rank'] as const;
export type WaitingKind = (typeof WAITING_KINDS)[number];

/**
 * Each kind: the action the role held in a project must allow for it to wait there, and the
 * proposal state it lists (null: specs, not proposals). Nobody reviews their own decision, so a
 * decision waits for every reviewer of its project but the person who made it.
 */
export const WAITING_RULES: Record<WaitingKind, { action: Action; state: ProposalState | null }> = {
  decide: { action: 'proposals:decide', state: 'ranked' },
  rework: { action: 'proposals:decide', state: 'returned' },
  review: { action: 'proposals:review', state: 'decided' },
  rank: { action: 'specs:write', state: null },
};

/** The kinds that wait for whoever holds this role in a project (by the project role alone: an administrator's account role decides nothing here). */
export function waitingKindsFor(role: ProjectRole | null | undefined): WaitingKind[] {
  return WAITING_KINDS.filter((kind) => mayIn('member', role, WAITING_RULES[kind].action));
}

/** How the app names each kind: a heading, a count in a sentence, and what the link opens. */
export const WAITING_WORDS: Record<WaitingKind, { title: string; count: (n: number) => string; empty: string }> = {
  decide: {
    title: 'Rankings to decide',
    count: (n) => `${n} ${n === 1 ? 'ranking' : 'rankings'} to decide`,
    empty: 'No ranking waits for a decision in your projects.',
  },
  rework: {
    title: 'Sent back for a new decision',
    count: (n) => `${n} sent back for a new decision`,
    empty: 'No decision has been sent back for rework.',
  },
  review: {
    title: 'Decisions to review',
    count: (n) => `${n} ${n === 1 ? 'decision' : 'decisions'} to review`,
    empty: 'No decision waits for your review.',
  },
  rank: {
    title: 'Specs to rank',
    count: (n) => `${n} ${n === 1 ? 'spec' : 'specs'} to rank`,
    empty: 'Every spec’s latest version has a ranking.',
  },
};
