import { useId } from 'react';
import type { ResistorSeries } from '#shared/engine/types';
import { formatQuantity, isOnSeries, snapToSeries } from '#shared/units/index';
import { plausibilityNote } from '#shared/units/plausibility';
import { cn } from '../../../../lib/cn';
import type { FieldInfo } from './design-fields';
import type { FieldReading } from './override-draft';

/**
 * A resistor value as engineers type it ("4k7", "10 kΩ", "1meg"), with the value understood
 * shown beneath it, whether it is a member of the spec's series, and the reason when it cannot
 * be read or the server refused it.
 */
export function QuantityField({
  info,
  text,
  reading,
  serverError,
  series,
  rankedOhm,
  onChange,
}: {
  info: FieldInfo;
  text: string;
  reading: FieldReading;
  serverError?: string;
  series: ResistorSeries;
  /** The ranked option's value for the same field, for comparison. */
  rankedOhm?: number;
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
          <Understood valueOhm={reading.valueOhm} unit={info.unit} series={series} rankedOhm={rankedOhm} note={plausibilityNote(reading.valueOhm, info.unit, info.typical)} />
        ) : null}
      </p>
    </div>
  );
}

function Understood({ valueOhm, unit, series, rankedOhm, note }: { valueOhm: number; unit: string; series: ResistorSeries; rankedOhm?: number; note: string | null }) {
  const offSeries = valueOhm > 0 && !isOnSeries(valueOhm, series);
  return (
    <>
      <span className="tabular-nums">= {formatQuantity(valueOhm, unit, 4)}</span>
      {offSeries && (
        <span className="text-note dark:text-note-bright">
          {' '}
          · not an {series} value (nearest {formatQuantity(snapToSeries(valueOhm, series), unit, 3)})
        </span>
      )}
      {rankedOhm !== undefined && rankedOhm !== valueOhm && <span> · ranked {formatQuantity(rankedOhm, unit, 4)}</span>}
      {note && (
        <span className="block text-note dark:text-note-bright">
          <span aria-hidden="true">! </span>
          {note}
        </span>
      )}
    </>
  );
}
