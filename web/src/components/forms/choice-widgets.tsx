/**
 * Choices: a select, a radio group, one checkbox, and a checkbox group (an array of enum values).
 * Groups are fieldsets with the field's label as legend, so each option is named in context.
 */
import type { WidgetProps } from '@rjsf/utils';
import {
  ariaDescribedByIds,
  descriptionId,
  enumOptionsDeselectValue,
  enumOptionsIndexForValue,
  enumOptionsIsSelected,
  enumOptionsSelectValue,
  enumOptionsValueForIndex,
  optionId,
} from '@rjsf/utils';
import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';
import { inputClass } from './input-class';

const OPTION_ROW = 'flex items-center gap-2 rounded px-1 py-0.5 text-sm';
const CONTROL = 'h-4 w-4 accent-fern dark:accent-fern-soft';

function ChoiceGroup({ id, label, required, children, inline = false }: { id: string; label: string; required?: boolean; children: ReactNode; inline?: boolean }) {
  return (
    <fieldset id={id} aria-describedby={ariaDescribedByIds(id)}>
      <legend className="mb-1 text-sm font-medium">
        {label}
        {required && <span className="sr-only"> (required)</span>}
      </legend>
      <div className={cn(inline ? 'flex flex-wrap gap-x-4 gap-y-1' : 'grid grid-cols-1 gap-y-0.5 sm:grid-cols-2 sm:gap-x-4')}>{children}</div>
    </fieldset>
  );
}

export function SelectWidget({ id, htmlName, options, value, disabled, readonly, required, multiple, rawErrors, onChange, onBlur, onFocus, placeholder }: WidgetProps) {
  const { enumOptions = [], emptyValue } = options;
  const selected = enumOptionsIndexForValue(value, enumOptions, multiple) ?? '';
  const toValue = (index: string) => enumOptionsValueForIndex(index, enumOptions, emptyValue);
  return (
    <select
      id={id}
      name={htmlName || id}
      value={typeof selected === 'string' ? selected : selected[0]}
      disabled={disabled || readonly}
      required={required}
      aria-invalid={(rawErrors?.length ?? 0) > 0 || undefined}
      aria-describedby={ariaDescribedByIds(id)}
      onChange={(e) => onChange(toValue(e.target.value))}
      onBlur={(e) => onBlur(id, toValue(e.target.value))}
      onFocus={(e) => onFocus(id, toValue(e.target.value))}
      className={inputClass({ invalid: (rawErrors?.length ?? 0) > 0 })}
    >
      {!required && <option value="">{placeholder || '—'}</option>}
      {enumOptions.map((option, index) => (
        <option key={index} value={String(index)}>
          {option.label}
        </option>
      ))}
    </select>
  );
}

/** Read-only choices read as words, not as greyed-out controls whose state is hard to see. */
function ChosenWords({ id, label, words, note }: { id: string; label: string; words: string; note?: string }) {
  return (
    <div id={id}>
      <p className="mb-1 text-sm font-medium">{label}</p>
      <p className="py-1.5 text-sm">{words}</p>
      {note && <p className="mt-1 text-xs leading-snug text-ink-soft dark:text-night-ink-soft">{note}</p>}
    </div>
  );
}

export function RadioWidget({ id, htmlName, label, options, value, disabled, readonly, required, onChange, onBlur, onFocus }: WidgetProps) {
  const { enumOptions = [] } = options;
  if (readonly) return <ChosenWords id={id} label={label} words={enumOptions.find((o) => enumOptionsIsSelected(o.value, value))?.label ?? 'not set'} />;
  return (
    <ChoiceGroup id={id} label={label} required={required} inline>
      {enumOptions.map((option, index) => (
        <label key={index} className={OPTION_ROW}>
          <input
            type="radio"
            id={optionId(id, index)}
            name={htmlName || id}
            className={CONTROL}
            checked={enumOptionsIsSelected(option.value, value)}
            disabled={disabled || readonly}
            onChange={() => onChange(option.value)}
            onBlur={() => onBlur(id, value)}
            onFocus={() => onFocus(id, value)}
          />
          {option.label}
        </label>
      ))}
    </ChoiceGroup>
  );
}

export function CheckboxesWidget({ id, htmlName, label, options, value, disabled, readonly, required, onChange, onBlur, onFocus }: WidgetProps) {
  const { enumOptions = [], enumDisabled = [] } = options;
  const values: unknown[] = Array.isArray(value) ? value : [];
  if (readonly) {
    const chosen = enumOptions.filter((o) => enumOptionsIsSelected(o.value, values)).map((o) => o.label);
    const left = enumOptions.filter((o) => !enumOptionsIsSelected(o.value, values)).map((o) => o.label);
    return <ChosenWords id={id} label={label} words={`${chosen.join(', ') || 'none'}${left.length > 0 ? ` (left out: ${left.join(', ')})` : ''}`} />;
  }
  return (
    <ChoiceGroup id={id} label={label} required={required}>
      {enumOptions.map((option, index) => (
        <label key={index} className={OPTION_ROW}>
          <input
            type="checkbox"
            id={optionId(id, index)}
            name={htmlName || id}
            className={CONTROL}
            checked={enumOptionsIsSelected(option.value, values)}
            disabled={disabled || readonly || (enumDisabled as unknown[]).includes(option.value)}
            onChange={(e) => onChange(e.target.checked ? enumOptionsSelectValue(index, values, enumOptions) : enumOptionsDeselectValue(index, values, enumOptions))}
            onBlur={() => onBlur(id, values)}
            onFocus={() => onFocus(id, values)}
          />
          {option.label}
        </label>
      ))}
    </ChoiceGroup>
  );
}

/** One boolean: the box, its label, and the schema's description under it. */
export function CheckboxWidget({ id, htmlName, label, value, disabled, readonly, schema, onChange, onBlur, onFocus }: WidgetProps) {
  if (readonly) return <ChosenWords id={id} label={label} words={value === true ? 'Yes' : 'No'} note={schema.description} />;
  return (
    <div>
      <label className={cn(OPTION_ROW, 'px-0 font-medium')}>
        <input
          type="checkbox"
          id={id}
          name={htmlName || id}
          className={CONTROL}
          checked={value === true}
          disabled={disabled || readonly}
          aria-describedby={ariaDescribedByIds(id)}
          onChange={(e) => onChange(e.target.checked)}
          onBlur={(e) => onBlur(id, e.target.checked)}
          onFocus={(e) => onFocus(id, e.target.checked)}
        />
        {label}
      </label>
      {schema.description && (
        <p id={descriptionId(id)} className="mt-0.5 ml-6 text-xs leading-snug text-ink-soft dark:text-night-ink-soft">
          {schema.description}
        </p>
      )}
    </div>
  );
}

/**
 * A value the form does not edit (a `const`, or a choice made outside the form): shown, not
 * edited. `ui:options.display` names it in words, or `ui:options.displayByValue` each value.
 */
export function FixedWidget({ id, htmlName, value, options }: WidgetProps) {
  const byValue = options.displayByValue as Record<string, string> | undefined;
  const named = byValue && typeof value === 'string' ? byValue[value] : undefined;
  const shown = named ?? (typeof options.display === 'string' ? options.display : String(value ?? ''));
  return <input id={id} name={htmlName || id} readOnly value={shown} aria-describedby={ariaDescribedByIds(id)} className={inputClass({ readonly: true })} />;
}
