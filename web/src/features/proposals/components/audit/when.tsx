/** A moment in readable local time, with the stored ISO time for the curious and for machines. */
export function When({ iso, className }: { iso: string; className?: string }) {
  const date = new Date(iso);
  const readable = Number.isNaN(date.getTime()) ? iso : date.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
  return (
    <time dateTime={iso} title={iso} className={className}>
      {readable}
    </time>
  );
}
