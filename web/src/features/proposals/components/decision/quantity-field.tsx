import { useId } from 'react';
import type { ResistorSeries } from '#shared/engine/types';
import { formatQuantity, isOnSeries, snapToSeries } from '#shared/units/index';
import { plausibilityNote } from '#shared/units/plausibility';
import { cn } from '../../../../lib/cn';
import { fieldText, type FieldInfo } from './design-fields';
import type { FieldReading } from './override-draft';

/**
 * A resistor value as engineers type it ("4k7", "10 kΩ", "1meg"), or an emitter-area ratio as a
 * plain number ("8", "8×"), with the value understood shown beneath it, for a resistor whether it
 * is a member of the spec's series, and the reason when it cannot be read or the server refused it.
 */
export function QuantityField({
  info,
  text,
  reading,
  serverError,
  series,
  ranked,
  onChange,
}: {
  info: FieldInfo;
  text: string;
  reading: FieldReading;
  serverError?: string;
  series: ResistorSeries;
  /** The ranked option's value for the same field, for comparison. */
  ranked?: number;
  onChange: (text: string) => void;
}) {
  const id = useId();
  const problem = serverError ?? (reading.ok ? null : reading.message);
  return (
    <div className="text-sm">
      <label htmlFor={id} className="mb-1 block font-medium">
        {info.title}
      </label>
      <input
        id={id}
        type="text"
        inputMode="text"
        autoComplete="off"
        spellCheck={false}
        value={text}
        onChange={(e) => onChange(e.target.value)}
        aria-invalid={problem ? true : undefined}
        aria-describedby={`${id}-reading`}
        className={cn(
          'w-full rounded-md border bg-sheet px-3 py-2 font-mono tabular-nums dark:bg-night',
          problem ? 'border-short dark:border-short-bright' : 'border-rule dark:border-night-rule',
        )}
      />
      <p id={`${id}-reading`} className={cn('mt-1 min-h-5 text-xs', problem ? 'text-short dark:text-short-bright' : 'text-ink-soft dark:text-night-ink-soft')}>
        {problem ? (
          <>
            <span aria-hidden="true">✕ </span>
            {problem}
          </>
        ) : reading.ok ? (
          <Understood value={reading.value} info={info} series={series} ranked={ranked} note={plausibilityNote(reading.value, info.unit, info.typical)} />
        ) : null}
      </p>
    </div>
  );
}

function Understood({ value, info, series, ranked, note }: { value: number; info: FieldInfo; series: ResistorSeries; ranked?: number; note: string | null }) {
  // A ratio of emitter areas is no resistor: the series says nothing about it
  const offSeries = info.kind === 'resistor' && value > 0 && !isOnSeries(value, series);
  return (
    <>
      <span className="tabular-nums">= {fieldText(info, value, 4)}</span>
      {offSeries && (
        <span className="text-note dark:text-note-bright">
          {' '}
          · not an {series} value (nearest {formatQuantity(snapToSeries(value, series), info.unit, 3)})
        </span>
      )}
      {ranked !== undefined && ranked !== value && <span> · ranked {fieldText(info, ranked, 4)}</span>}
      {note && (
        <span className="block text-note dark:text-note-bright">
          <span aria-hidden="true">! </span>
          {note}
        </span>
      )}
    </>
  );
}
