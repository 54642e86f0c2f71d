/**
 * The kinds of e-mail notice Longtail sends, in one place: each kind's name (stored in the mail
 * outbox and in a person's list of kinds turned off), its title and a plain description of when it
 * comes and to whom. Read by the server (who is told: api/services/notifications.service.ts; the
 * texts: api/mail/compose.ts), by the API's validation of PATCH /api/auth/me and by the profile
 * page's switches. A new kind is one line here (then its message in compose.ts and its recipients
 * in the notification service).
 *
 * A person's preference is two things: `notify`, the master switch (off: no workflow e-mail at
 * all, whatever else is set), and `noticesOff`, the kinds turned off one by one while the master
 * switch is on. Kinds not listed are on, so a kind added later reaches everyone who has e-mail on.
 */

export const NOTICES = [
  { kind: 'proposal.ready', title: 'Ranking waits for a decision', description: 'A proposal is ranked in a project where you design and waits for a designer’s decision.' },
  { kind: 'proposal.decided', title: 'Decision waits for review', description: 'A designer records a decision in a project where you review.' },
  { kind: 'proposal.approved', title: 'Signed off', description: 'A reviewer signs off a decision you made, or a proposal of a spec you wrote.' },
  { kind: 'proposal.returned', title: 'Sent back for rework', description: 'A reviewer sends back a decision you made, or one on a proposal of a spec you wrote.' },
  { kind: 'proposal.superseded', title: 'Closed: the spec moved on', description: 'Rankings still waiting for a decision are closed because a newer version of their spec was ranked (to a project’s designers, whoever asked for them and whoever decided them).' },
  { kind: 'proposal.commented', title: 'Comment on your decision', description: 'Someone comments on, or replies to a comment on, a proposal whose latest decision is yours.' },
  { kind: 'spec.new-version', title: 'New version of a spec you ranked', description: 'Someone saves a new version of a spec after you asked for a ranking of one of its versions.' },
  { kind: 'verification.ended', title: 'Your SPICE check is done', description: 'A SPICE check or Monte Carlo you asked for finishes or cannot run, with its outcome.' },
] as const satisfies readonly { kind: string; title: string; description: string }[];

export type NoticeKind = (typeof NOTICES)[number]['kind'];
export const NOTICE_KINDS: readonly NoticeKind[] = NOTICES.map((notice) => notice.kind);

const KNOWN = new Set<string>(NOTICE_KINDS);
export const isNoticeKind = (kind: string): kind is NoticeKind => KNOWN.has(kind);

/** A stored list of kinds turned off as the app uses it: known kinds only (a kind since retired is dropped), each once, in NOTICES order. */
export function knownNoticesOff(stored: readonly string[] | null | undefined): NoticeKind[] {
  const off = new Set(stored ?? []);
  return NOTICE_KINDS.filter((kind) => off.has(kind));
}

/** Whether a person with this preference gets notices of this kind (the master switch first). */
export function wantsNotice(person: { notify: boolean; noticesOff?: readonly string[] | null }, kind: NoticeKind): boolean {
  return person.notify && !(person.noticesOff ?? []).includes(kind);
}
