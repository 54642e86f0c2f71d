/** Errors, description, help and titles of fields, with the ids rjsf's aria-describedby points at. */
import type { DescriptionFieldProps, FieldErrorProps, FieldHelpProps, TitleFieldProps } from '@rjsf/utils';
import { errorId, getUiOptions, helpId } from '@rjsf/utils';
import { UNREADABLE_PREFIX } from './quantity-text';

/** The field's errors, each with a glyph and words. A quantity field shows its own reading errors. */
export function FieldErrorTemplate({ errors = [], fieldPathId, uiSchema }: FieldErrorProps) {
  const ownReading = getUiOptions(uiSchema).widget === 'quantity';
  const shown = errors.filter((e) => !(ownReading && typeof e === 'string' && e.startsWith(UNREADABLE_PREFIX)));
  if (shown.length === 0) return null;
  return (
    <ul id={errorId(fieldPathId)} className="mt-1 space-y-0.5 text-xs text-short dark:text-short-bright">
      {shown.map((error, i) => (
        <li key={i}>
          <span aria-hidden="true">✕ </span>
          {error}
        </li>
      ))}
    </ul>
  );
}

export function DescriptionFieldTemplate({ id, description }: DescriptionFieldProps) {
  if (!description) return null;
  return (
    <p id={id} className="mt-1 text-xs leading-snug text-ink-soft dark:text-night-ink-soft">
      {description}
    </p>
  );
}

export function FieldHelpTemplate({ help, fieldPathId }: FieldHelpProps) {
  if (!help) return null;
  return (
    <p id={helpId(fieldPathId)} className="mt-1 text-xs text-ink-soft dark:text-night-ink-soft">
      {help}
    </p>
  );
}

export function TitleFieldTemplate({ id, title, required }: TitleFieldProps) {
  return (
    <h3 id={id} className="text-sm font-medium">
      {title}
      {required && <span className="sr-only"> (required)</span>}
    </h3>
  );
}
