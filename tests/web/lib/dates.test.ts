/**
 * The app's one date format, in the reader's time zone with the zone named. Expected offsets are
 * the IANA time zone database's: Berlin is UTC+1 (CET) in winter and UTC+2 (CEST) from the last
 * Sunday of March; New York UTC−5 in winter; Kolkata UTC+5:30 all year.
 */
import { describe, expect, test } from 'vitest';
import { formatDate, formatDateTime, timeZoneWords } from '../../../web/src/lib/dates';

const APPROVED = '2026-03-02T11:20:07.000Z';

describe('formatDateTime', () => {
  test('day, month name, year and a 24-hour clock in the zone given, the zone named', () => {
    expect(formatDateTime(APPROVED, { timeZone: 'Europe/Berlin' })).toBe('2 Mar 2026, 12:20 CET');
    expect(formatDateTime(APPROVED, { timeZone: 'UTC' })).toBe('2 Mar 2026, 11:20 UTC');
    expect(formatDateTime(APPROVED, { timeZone: 'America/New_York' })).toBe('2 Mar 2026, 06:20 GMT-5');
    expect(formatDateTime('2026-07-02T11:20:07.000Z', { timeZone: 'Europe/Berlin' })).toBe('2 Jul 2026, 13:20 CEST');
  });

  test('seconds when a record needs them', () => {
    expect(formatDateTime(APPROVED, { seconds: true, timeZone: 'Asia/Kolkata' })).toBe('2 Mar 2026, 16:50:07 GMT+5:30');
  });

  test('the day changes with the zone', () => {
    expect(formatDate('2026-03-02T23:30:00.000Z', 'UTC')).toBe('2 Mar 2026');
    expect(formatDate('2026-03-02T23:30:00.000Z', 'Europe/Berlin')).toBe('3 Mar 2026');
  });

  test('text that is not a time is shown as it is', () => {
    expect(formatDateTime('not a time')).toBe('not a time');
  });
});

describe('timeZoneWords', () => {
  test('the zone by its name and its abbreviation at that moment', () => {
    expect(timeZoneWords(new Date(APPROVED), 'Europe/Berlin')).toBe('Europe/Berlin (CET)');
    expect(timeZoneWords(new Date(APPROVED), 'UTC')).toBe('UTC');
  });
});
