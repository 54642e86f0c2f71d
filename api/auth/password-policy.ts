/**
 * The password rule, checked by the server wherever a password is set (a new account, a change,
 * a reset link): at least MIN_PASSWORD_LENGTH characters, and refused when it is
 * - blank after trimming (spaces only);
 * - one character repeated ("aaaaaaaaaaaa");
 * - the account's e-mail address or contains it, or contains the address's local part (the part
 *   before @) when that part has at least MIN_LOCAL_PART characters (shorter ones, "al@…", would
 *   refuse unrelated passwords); compared without regard to case;
 * - on the common-password list of zxcvbn-ts (`@zxcvbn-ts/language-common`, about 49,000
 *   passwords from public leaks), compared in lower case.
 * Each refusal is a 400 naming the field and the reason.
 */
import { dictionary } from '@zxcvbn-ts/language-common';
import { invalid } from '../errors';
import { MIN_PASSWORD_LENGTH } from './password';

/** Shortest local part that a password may not contain. */
export const MIN_LOCAL_PART = 4;

let common: Set<string> | null = null;
/** The common-password list, lower case (read on first use). */
function commonPasswords(): Set<string> {
  common ??= new Set(dictionary['passwords-common'].map((p) => p.toLowerCase()));
  return common;
}

/** Why the password may not be used for the account with this e-mail, or null when it may. */
export function passwordProblem(password: string, email: string): string | null {
  if (password.trim() === '') return 'must not be blank';
  if ([...password].length < MIN_PASSWORD_LENGTH) return `must have at least ${MIN_PASSWORD_LENGTH} characters`;
  if (new Set([...password]).size === 1) return 'must not be one character repeated';
  const lower = password.toLowerCase();
  const address = email.trim().toLowerCase();
  const localPart = address.split('@')[0] ?? '';
  if (address !== '' && lower.includes(address)) return 'must not be or contain your e-mail address';
  if (localPart.length >= MIN_LOCAL_PART && lower.includes(localPart)) return 'must not contain the name in your e-mail address';
  if (commonPasswords().has(lower)) return 'is on a list of common passwords: choose another';
  return null;
}

/** Throws a 400 at `field` when the password breaks the rule. */
export function checkPassword(password: string, email: string, field = '/password'): void {
  const problem = passwordProblem(password, email);
  if (problem) throw invalid([{ path: field, message: problem }], `The password ${problem}.`);
}
