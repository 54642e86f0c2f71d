/**
 * The spec form's `device.model` field: the Gummel-Poon parameters a library card filled, shown
 * read-only (they change with the card, never one by one; typing another IS, BF or VAF drops
 * them with the card). Nothing when the device has no model.
 */
import type { FieldProps } from '@rjsf/utils';
import { BJT_PARAMETERS, BJT_PARAMETER_NAMES } from '#shared/engine/bjt-parameters';
import { formatQuantity } from '#shared/units/format-quantity';

const NOTE = 'mt-1 text-xs leading-snug text-ink-soft dark:text-night-ink-soft';

/** A parameter's value as the card's reader would write it: with its unit where it has one. */
function valueText(name: (typeof BJT_PARAMETER_NAMES)[number], value: number): string {
  const unit = BJT_PARAMETERS[name].unit;
  if (unit === '' || unit === 'A/A') return String(Number(value.toPrecision(4)));
  return formatQuantity(value, unit === 'Ω' ? 'Ohm' : unit);
}

export function CardModelField({ fieldPathId, formData }: FieldProps) {
  const model = formData && typeof formData === 'object' ? (formData as Record<string, unknown>) : null;
  const given = BJT_PARAMETER_NAMES.filter((name) => typeof model?.[name] === 'number');
  if (given.length === 0) return null;
  return (
    <div id={fieldPathId.$id} className="sm:col-span-2" data-card-model>
      <details className="text-sm">
        <summary className="cursor-pointer font-medium">Full transistor model from the card: {given.length} parameters</summary>
        <dl className="mt-1 grid grid-cols-2 gap-x-4 gap-y-0.5 text-xs sm:grid-cols-4">
          {given.map((name) => (
            <div key={name} className="flex justify-between gap-2 border-b border-rule/40 py-0.5 dark:border-night-rule/40">
              <dt title={BJT_PARAMETERS[name].meaning}>{name}</dt>
              <dd className="tabular-nums">{valueText(name, model![name] as number)}</dd>
            </div>
          ))}
        </dl>
      </details>
      <p className={NOTE}>The engine and the SPICE check use every one of these; they change with the card (typing another IS, BF or VAF drops them with the card).</p>
    </div>
  );
}
