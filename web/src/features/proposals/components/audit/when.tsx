import { formatDateTime } from '../../../../lib/dates';

/** A moment in readable local time, with the stored ISO time for the curious and for machines. */
export function When({ iso, className }: { iso: string; className?: string }) {
  const readable = formatDateTime(iso);
  return (
    <time dateTime={iso} title={iso} className={className}>
      {readable}
    </time>
  );
}
