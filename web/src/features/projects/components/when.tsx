import { formatWhen } from '../utils/format-when';

/** A moment, said briefly, with the full date and time on hover and for machines. */
export function When({ iso }: { iso: string }) {
  return (
    <time dateTime={iso} title={new Date(iso).toLocaleString()} className="whitespace-nowrap">
      {formatWhen(iso)}
    </time>
  );
}
