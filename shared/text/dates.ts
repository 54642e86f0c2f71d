/**
 * The one date format of Longtail, for the browser and the server alike: "2 Mar 2026" for a day,
 * "2 Mar 2026, 12:20 CET" for a moment (seconds where a record needs them), the zone always named.
 * Day, month name, year and a 24-hour clock read the same everywhere, so the format is fixed
 * (en-GB's order). Without a zone, the runtime's own (the reader's, in a browser).
 */

const DAY: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };

function valid(iso: string | Date): Date | null {
  const date = iso instanceof Date ? iso : new Date(iso);
  return Number.isNaN(date.getTime()) ? null : date;
}

/** "2 Mar 2026" in the runtime's zone (the reader's, in a browser) or the one given. */
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
