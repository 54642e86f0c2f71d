/**
 * A hint, not a rule: the server holds the rule (api/auth/password-policy.ts: the length,
 * MIN_PASSWORD_LENGTH, and the refusals PASSWORD_RULE names) and answers which part a password
 * breaks. Longer and more varied passwords rate higher here.
 */
export const MIN_PASSWORD_LENGTH = 12;

/** The server's password rule in one sentence, shown under every new-password field. */
export const PASSWORD_RULE = `At least ${MIN_PASSWORD_LENGTH} characters; not spaces only, not one character repeated, not the e-mail address or the name in it, and not a common password.`;

export type Strength = { level: 0 | 1 | 2 | 3; words: string };

const CLASSES = [/[a-z]/, /[A-Z]/, /[0-9]/, /[^A-Za-z0-9]/];

export function passwordStrength(password: string): Strength {
  const length = [...password].length;
  if (length < MIN_PASSWORD_LENGTH) {
    const missing = MIN_PASSWORD_LENGTH - length;
    return { level: 0, words: `Too short: ${missing} more character${missing === 1 ? '' : 's'} needed` };
  }
  const variety = CLASSES.filter((c) => c.test(password)).length;
  if (/^(.)\1+$/.test(password)) return { level: 1, words: 'Long enough, but one repeated character' };
  if (length >= 20 || (length >= 16 && variety >= 3)) return { level: 3, words: 'Strong' };
  if (length >= 14 || variety >= 3) return { level: 2, words: 'Good' };
  return { level: 1, words: 'Acceptable: longer, or mixed with digits and symbols, is stronger' };
}
