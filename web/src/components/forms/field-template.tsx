/**
 * One field: label, control, errors beside it, then the schema's description in small print.
 * Groups of choices (radio, checkboxes) label themselves with a legend, so no <label> here.
 */
import type { FieldTemplateProps } from '@rjsf/utils';
import { getUiOptions } from '@rjsf/utils';
import { cn } from '../../lib/cn';

const GROUP_WIDGETS = new Set(['radio', 'checkboxes']);

export function FieldTemplate(props: FieldTemplateProps) {
  const { id, label, children, errors, help, description, hidden, required, displayLabel, uiSchema, schema, classNames, readonly } = props;
  if (hidden) return <div className="hidden">{children}</div>;
  const uiOptions = getUiOptions(uiSchema);
  const isContainer = schema.type === 'object';
  if (isContainer) {
    return (
      <div className={cn('col-span-full', classNames)}>
        {children}
        {errors}
      </div>
    );
  }
  const labelledByGroup = typeof uiOptions.widget === 'string' && GROUP_WIDGETS.has(uiOptions.widget);
  return (
    <div className={cn('min-w-0', uiOptions.wide === true && 'col-span-full', classNames)}>
      {displayLabel && !labelledByGroup && (
        <label htmlFor={id} className="mb-1 block text-sm font-medium">
          {label}
          {required && !readonly && (
            <span className="text-ink-soft dark:text-night-ink-soft">
              <span aria-hidden="true"> *</span>
              <span className="sr-only"> (required)</span>
            </span>
          )}
        </label>
      )}
      {children}
      {errors}
      {displayLabel && description}
      {help}
    </div>
  );
}
