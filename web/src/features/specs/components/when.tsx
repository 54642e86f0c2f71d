/** A moment, written for people ("12 May 2026, 14:03"), with the machine-readable time. */
export function When({ at }: { at: string }) {
  const date = new Date(at);
  return <time dateTime={at}>{date.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' })}</time>;
}
