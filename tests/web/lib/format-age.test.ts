/** How long something has waited, in one rounded unit, each unit's boundary on both sides. */
import { describe, expect, test } from 'vitest';
import { formatAge } from '../../../web/src/lib/format-when';

const NOW = Date.parse('2026-03-02T12:00:00.000Z');
const ago = (ms: number) => new Date(NOW - ms).toISOString();
const MIN = 60_000;
const HOUR = 60 * MIN;
const DAY = 24 * HOUR;

describe('formatAge', () => {
  test.each([
    [0, 'under a minute'],
    [MIN - 1, 'under a minute'],
    [MIN, '1 min'],
    [59 * MIN + 59_000, '59 min'],
    [HOUR, '1 h'],
    [47 * HOUR, '47 h'],
    [48 * HOUR, '2 days'],
    [13 * DAY + 23 * HOUR, '13 days'],
    [14 * DAY, '2 weeks'],
    [62 * DAY, '8 weeks'],
    [63 * DAY, '2 months'],
    [400 * DAY, '13 months'],
  ])('when it has waited %i ms, then it reads "%s"', (ms, words) => {
    expect(formatAge(ago(ms), NOW)).toBe(words);
  });

  test('when the moment cannot be read, then a dash', () => {
    expect(formatAge('not a date', NOW)).toBe('—');
  });
});
