import { formatDate } from './dates';

/** "3 minutes ago", "yesterday", or a date once it is more than a week old. */
const UNITS: [Intl.RelativeTimeFormatUnit, number][] = [
  ['day', 86_400_000],
  ['hour', 3_600_000],
  ['minute', 60_000],
];
const WEEK_MS = 7 * 86_400_000;
const relative = new Intl.RelativeTimeFormat('en', { numeric: 'auto' });

export function formatWhen(iso: string, nowMs: number = Date.now()): string {
  const ageMs = nowMs - Date.parse(iso);
  if (Number.isNaN(ageMs)) return '—';
  if (ageMs >= WEEK_MS || ageMs < -60_000) return formatDate(iso);
  for (const [unit, sizeMs] of UNITS) {
    if (ageMs >= sizeMs) return relative.format(-Math.floor(ageMs / sizeMs), unit);
  }
  return 'just now';
}
