/**
 * A hint, not a rule: the server's only rule is the length (MIN_PASSWORD_LENGTH in
 * api/auth/password.ts, 12 characters). Longer and more varied passwords rate higher.
 */
export const MIN_PASSWORD_LENGTH = 12;

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
