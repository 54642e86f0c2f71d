import { formatWhen } from '../../lib/format-when';
import { formatDateTime } from '../../lib/dates';

/** A moment, said briefly, with the full date and time on hover and for machines. */
export function When({ iso }: { iso: string }) {
  return (
    <time dateTime={iso} title={formatDateTime(iso)} className="whitespace-nowrap">
      {formatWhen(iso)}
    </time>
  );
}
