/**
 * What holds back a sign-off, said before the click (the server holds the same rules: a design
 * short on a blocking check needs a comment; a SPICE check of another design needs the reviewer to
 * accept it, with a comment saying why). Pure.
 */
import type { DesignVerificationState } from '#shared/verification/types';

export interface SignOffFacts {
  /** Blocking checks the decided design falls short on. */
  shortfalls: number;
  comment: string;
  /** How the SPICE check stands for the decided design (null while it is being read). */
  verification: DesignVerificationState['state'] | null;
  /** The reviewer ticked "sign off on it anyway". */
  acceptStale: boolean;
}

/** Why the sign-off button is held back, or null when it may be pressed. */
export function signOffHold(facts: SignOffFacts): string | null {
  const commented = facts.comment.trim() !== '';
  if (facts.shortfalls > 0 && !commented) {
    return `The decided design is short on ${facts.shortfalls} blocking check${facts.shortfalls === 1 ? '' : 's'}: say in the comment why you sign it off anyway.`;
  }
  if (facts.verification === 'stale' || facts.verification === 'unbound') {
    const what = facts.verification === 'stale' ? 'simulated another design' : 'cannot show which design it simulated';
    if (!facts.acceptStale) return `The only SPICE check of the decided design ${what}: run a fresh check, or tick “Sign off on it anyway” and say why in the comment.`;
    if (!commented) return 'Say in the comment why that SPICE check is enough for this design.';
  }
  return null;
}
