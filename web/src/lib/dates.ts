/**
 * The one date format of the app: "2 Mar 2026" for a day, "2 Mar 2026, 12:20 CET" for a moment
 * (seconds where a record needs them), always in the reader's time zone with the zone named.
 * Day, month name, year and a 24-hour clock read the same everywhere, so the format is fixed
 * (en-GB's order) rather than the browser's locale. Pure apart from the reader's zone.
 */

/** The reader's time zone as the browser reports it (IANA name, e.g. "Europe/Berlin"). */
export function readerTimeZone(): string {
  return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
}

const DAY: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };

function valid(iso: string | Date): Date | null {
  const date = iso instanceof Date ? iso : new Date(iso);
  return Number.isNaN(date.getTime()) ? null : date;
}

/** "2 Mar 2026" in the reader's zone (or the one given). */
export function formatDate(iso: string | Date, timeZone?: string): string {
  const date = valid(iso);
  if (!date) return String(iso);
  return new Intl.DateTimeFormat('en-GB', { ...DAY, timeZone }).format(date);
}

/** "2 Mar 2026, 12:20 CET", or with `seconds` "2 Mar 2026, 12:20:07 CET": the zone is always named. */
export function formatDateTime(iso: string | Date, options: { seconds?: boolean; timeZone?: string } = {}): string {
  const date = valid(iso);
  if (!date) return String(iso);
  return new Intl.DateTimeFormat('en-GB', {
    ...DAY,
    hour: '2-digit',
    minute: '2-digit',
    ...(options.seconds ? { second: '2-digit' } : {}),
    hourCycle: 'h23',
    timeZoneName: 'short',
    timeZone: options.timeZone,
  }).format(date);
}

/** The zone in words for a caption: "Europe/Berlin (CET)", or "UTC". */
export function timeZoneWords(at: Date = new Date(), timeZone: string = readerTimeZone()): string {
  const short = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'short' }).formatToParts(at).find((p) => p.type === 'timeZoneName')?.value ?? '';
  return short && short !== timeZone ? `${timeZone} (${short})` : timeZone;
}
