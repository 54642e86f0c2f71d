/**
 * The spec form's `device.pnp`: the PNP transistor of the tails that need one (the PTAT
 * source's mirror), as its own titled section under the NPN: current gain, Early voltage, IS, and
 * a model card when the spec carries one (read-only, as the NPN's). Shown while a chosen tail
 * needs it, or while it holds values (nothing typed is ever hidden); rjsf's own object field draws
 * the fields, so widgets, messages and the server's errors work as everywhere else.
 */
import type { FieldProps } from '@rjsf/utils';
import { topologyName } from '#shared/engine/topologies';
import { pnpTransistorNames, type PnpChoiceContext } from '../lib/pnp-choice';

const NOTE = 'mt-1 text-xs leading-snug text-ink-soft dark:text-night-ink-soft';

const holdsValues = (value: unknown) => value !== null && typeof value === 'object' && Object.values(value).some((v) => v !== undefined);

export function PnpDeviceField(props: FieldProps) {
  const { registry, formData, fieldPathId } = props;
  const context = registry.formContext as PnpChoiceContext | undefined;
  const tails = context?.pnpTails ?? [];
  if (tails.length === 0 && !holdsValues(formData)) return null;
  const ObjectField = registry.fields.ObjectField;
  const headingId = `${fieldPathId.$id}__heading`;
  const names = tails.map((id) => topologyName(id)).join(' and ');
  return (
    <section aria-labelledby={headingId} className="mt-1 rounded-md border border-rule p-3 dark:border-night-rule" data-pnp-device>
      <h3 id={headingId} className="text-sm font-semibold">
        PNP transistor
      </h3>
      <p className={`${NOTE} mb-2`}>
        {tails.length > 0
          ? `The ${names} mirrors its current through PNP transistors (${pnpTransistorNames(tails).join(', ')}): give the PNP’s current gain, and its Early voltage and IS as the data sheet or model states them.`
          : context?.pnpStage
            ? 'The stage is a PNP one, its own transistor given above: these values stay with the spec but nothing uses them.'
            : 'No chosen tail needs a PNP: these values stay with the spec but nothing uses them.'}
      </p>
      <ObjectField {...props} />
    </section>
  );
}
