/**
 * The one date format of the app: "2 Mar 2026" for a day, "2 Mar 2026, 12:20 CET" for a moment
 * (seconds where a record needs them), always in the reader's time zone with the zone named.
 * Day, month name, year and a 24-hour clock read the same everywhere, so the format is fixed
 * (en-GB's order) rather than the browser's locale. Pure apart from the reader's zone. The
 * formatters live in shared/text/dates.ts, which the server's e-mails use too.
 */

/** The reader's time zone as the browser reports it (IANA name, e.g. "Europe/Berlin"). */
export function readerTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}

export { formatDate, formatDateTime } from '#shared/text/dates';

/** The zone in words for a caption: "Europe/Berlin (CET)", or "UTC". */
export function timeZoneWords(at: Date = new Date(), timeZone: string = readerTimeZone()): string {
  const short = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'short' }).formatToParts(at).find((p) => p.type === 'timeZoneName')?.value ?? '';
  return short && short !== timeZone ? `${timeZone} (${short})` : timeZone;
}
