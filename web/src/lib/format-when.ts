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

/** How long something has waited, in one rounded unit: "under a minute", "12 min", "5 h", "3 days", "2 weeks", "4 months". */
const AGE_UNITS: [limitMs: number, sizeMs: number, one: string, many: string][] = [
  [60 * 60_000, 60_000, 'min', 'min'],
  [48 * 3_600_000, 3_600_000, 'h', 'h'],
  [14 * 86_400_000, 86_400_000, 'day', 'days'],
  [9 * WEEK_MS, WEEK_MS, 'week', 'weeks'],
  [Infinity, 30 * 86_400_000, 'month', 'months'],
];

export function formatAge(iso: string, nowMs: number = Date.now()): string {
  const ageMs = nowMs - Date.parse(iso);
  if (Number.isNaN(ageMs)) return '—';
  if (ageMs < 60_000) return 'under a minute';
  const [, sizeMs, one, many] = AGE_UNITS.find(([limitMs]) => ageMs < limitMs)!;
  const n = Math.floor(ageMs / sizeMs);
  return `${n} ${n === 1 ? one : many}`;
}
