/**
 * A numeric field with a unit (the schema's `x-unit`) that takes engineering notation as typed:
 * "4k7", "4.7k", "10u", "2 pF", "-12 V", "1M" (mega), "1m" (milli), "1meg", "4.7 pf". The typed
 * text stays as typed; the value understood is shown under it ("= 4.7 kΩ"), or why it cannot be
 * read, and a note when it lies outside the field's usual range (`x-typical`): "60M" in a power
 * budget reads 60 MW, with the hint that M is mega.
 */
import type { WidgetProps } from '@rjsf/utils';
import { ariaDescribedByIds } from '@rjsf/utils';
import { useEffect, useState, type ChangeEvent } from 'react';
import { cn } from '../../lib/cn';
import { formContextOf } from './form-context';
import { inputClass } from './input-class';
import { quantityText, readingText, readQuantity, unitLabel } from './quantity-text';
import { formatQuantity } from '#shared/units/format-quantity';
import { plausibilityNote, typicalRangeOf } from '#shared/units/plausibility';

/** The unit a schema node declares, "1" (a plain number) when it declares none. */
export function schemaUnit(schema: object): string {
  const unit = (schema as Record<string, unknown>)['x-unit'];
  return typeof unit === 'string' ? unit : '1';
}

const sameNumber = (a: unknown, b: unknown) => a === b || (a === undefined && b === null) || (a === null && b === undefined);

export function QuantityWidget(props: WidgetProps) {
  const { id, value, onChange, onBlur, onFocus, schema, readonly, disabled, required, autofocus, placeholder, rawErrors, registry, htmlName } = props;
  const unit = schemaUnit(schema);
  // The text and the number it stands for; a new value from outside (a reset) replaces the text
  const [field, setField] = useState(() => ({ text: quantityText(value, unit), value: value as number | undefined }));
  if (!sameNumber(value, field.value)) setField({ text: quantityText(value, unit), value });
  const reading = readQuantity(field.text, unit);
  const unreadable = reading.kind === 'unreadable' ? reading.message : null;
  const implausible = reading.kind === 'value' ? plausibilityNote(reading.value, unit, typicalRangeOf(schema)) : null;
  const { reportUnreadable } = formContextOf(registry);

  useEffect(() => {
    reportUnreadable?.(id, unreadable);
  }, [reportUnreadable, id, unreadable]);
  useEffect(() => () => reportUnreadable?.(id, null), [reportUnreadable, id]);

  const symbol = unitLabel(unit);
  if (readonly) {
    const shown = typeof value === 'number' ? formatQuantity(value, unit, 6) : '';
    return <input id={id} name={htmlName || id} readOnly value={shown} placeholder="not set" className={inputClass({ readonly: true })} aria-describedby={ariaDescribedByIds(id)} />;
  }

  const onText = (event: ChangeEvent<HTMLInputElement>) => {
    const text = event.target.value;
    const next = readQuantity(text, unit);
    const number = next.kind === 'value' ? next.value : undefined;
    setField({ text, value: number });
    onChange(number);
  };
  const readingId = `${id}__reading`;
  const unitId = `${id}__unit`;
  const invalid = unreadable !== null || (rawErrors?.length ?? 0) > 0;
  return (
    <div>
      <div className={cn('flex items-stretch', disabled && 'opacity-60')}>
        <input
          id={id}
          name={htmlName || id}
          type="text"
          inputMode="text"
          autoComplete="off"
          spellCheck={false}
          value={field.text}
          placeholder={placeholder}
          disabled={disabled}
          autoFocus={autofocus}
          required={required}
          aria-invalid={invalid || undefined}
          aria-describedby={[ariaDescribedByIds(id), symbol && unitId, readingId].filter(Boolean).join(' ')}
          onChange={onText}
          onBlur={() => onBlur(id, field.value)}
          onFocus={() => onFocus(id, field.value)}
          className={cn(inputClass({ invalid }), symbol && 'rounded-r-none')}
        />
        {symbol && (
          <span
            id={unitId}
            className="flex min-w-9 shrink-0 items-center justify-center whitespace-nowrap rounded-r-md border border-l-0 border-rule bg-paper px-2 text-xs text-ink-soft dark:border-night-rule dark:bg-night-sheet dark:text-night-ink-soft"
          >
            {symbol}
          </span>
        )}
      </div>
      <p id={readingId} className={cn('mt-0.5 min-h-4 text-xs tabular-nums', unreadable ? 'text-short dark:text-short-bright' : 'text-ink-soft dark:text-night-ink-soft')}>
        {reading.kind === 'value' && readingText(reading.value, unit)}
        {implausible && (
          <span className="block text-note dark:text-note-bright">
            <span aria-hidden="true">! </span>
            {implausible}
          </span>
        )}
        {unreadable && (
          <>
            <span aria-hidden="true">✕ </span>
            {unreadable}
          </>
        )}
      </p>
    </div>
  );
}
