import { describe, expect, test } from 'vitest';
import { passwordStrength } from '../../../web/src/lib/password-strength';

describe('password strength hint', () => {
  test.each([
    ['', 0, 'Too short: 12 more characters needed'],
    ['elevenchars', 0, 'Too short: 1 more character needed'],
    ['aaaaaaaaaaaaaa', 1, 'Long enough, but one repeated character'],
    ['twelvelowerc', 1, 'Acceptable: longer, or mixed with digits and symbols, is stronger'],
    ['Twelve-char1', 2, 'Good'],
    ['copper tail current', 2, 'Good'],
    ['a much longer passphrase', 3, 'Strong'],
  ])('"%s" rates %i: %s', (password, level, words) => {
    expect(passwordStrength(password)).toEqual({ level, words });
  });
});
