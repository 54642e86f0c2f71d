/** A list of items (arrays that are not a choice among enum values): items stacked, then "Add". */
import type { ArrayFieldTemplateProps } from '@rjsf/utils';
import { titleId } from '@rjsf/utils';
import { Button } from '../ui/button';

export function ArrayFieldTemplate({ items, canAdd, onAddClick, title, fieldPathId, disabled, readonly }: ArrayFieldTemplateProps) {
  const id = titleId(fieldPathId);
  return (
    <div role="group" aria-labelledby={id} className="col-span-full">
      <p id={id} className="mb-1 text-sm font-medium">
        {title}
      </p>
      <div className="space-y-2">{items}</div>
      {canAdd && !readonly && (
        <Button variant="quiet" className="mt-2 px-2 py-1" onClick={onAddClick} disabled={disabled}>
          Add to {title.toLowerCase()}
        </Button>
      )}
    </div>
  );
}
