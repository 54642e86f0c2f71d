import { formatDateTime } from '../../../lib/dates';

/** A moment, written for people ("12 May 2026, 14:03 CEST", lib/dates), with the machine-readable time. */
export function When({ at }: { at: string }) {
  return <time dateTime={at}>{formatDateTime(at)}</time>;
}
